#pragma once
// The building blocks of report.html: the document with its inline style sheet, tables,
// figures and collapsible blocks. Markup is XHTML-compatible HTML5 (every element closed, every
// attribute quoted, only numeric character references), so both an HTML parser and an XML
// parser read it; every text passed in is escaped here.

#include <string>
#include <string_view>
#include <vector>

namespace larder {

/// A table cell: its text and an optional class ("num" right-aligns numbers; "better",
/// "worse", "neutral", "none" style verdicts; "num better" does both). `row_header` cells are <th
/// scope="row">.
struct HtmlCell {
  std::string text;
  std::string_view css_class = {};
  bool row_header = false;
};

/// A table with a caption, one header row and body rows, inside a horizontally scrolling box so
/// wide tables never widen the page. Header cells may also wrap after a dot, underscore or slash,
/// and number cells wrap before a "±", so a table of eight policies fits a 1280-pixel window
/// without that box scrolling. A header cell is right-aligned when the cell under it in the first
/// row is a number ("num").
class HtmlTable {
 public:
  explicit HtmlTable(std::string_view caption);
  void header(const std::vector<std::string>& cells) { header_ = cells; }
  void row(const std::vector<HtmlCell>& cells);
  std::size_t rows() const { return rows_; }
  std::string str() const;

 private:
  std::string caption_;
  std::vector<std::string> header_;
  std::vector<bool> numeric_;  ///< per column of the first row
  std::string body_;
  std::size_t rows_ = 0;
};

/// A complete page: doctype, head with `title` and the style sheet, and `body` (markup).
std::string html_document(std::string_view title, std::string_view body);

/// <section id="..."> with an <h2> heading (escaped) and `content` (markup).
std::string html_section(std::string_view id, std::string_view heading, std::string_view content);

/// A paragraph of escaped text, with an optional class.
std::string html_paragraph(std::string_view text, std::string_view css_class = {});

/// A <figure> holding `svg` (markup) with an escaped caption.
std::string html_figure(std::string_view svg, std::string_view caption);

/// The cautions box (<aside id="cautions">), one paragraph of escaped text per caution.
std::string html_cautions(const std::vector<std::string>& cautions);

/// A <details> block whose <summary> is `summary` (escaped), open when `open`.
std::string html_details(std::string_view summary, std::string_view content, bool open);

}  // namespace larder
