#include "reports/html_page.hpp"

#include <fmt/format.h>

#include "reports/xml_text.hpp"

namespace larder {

namespace {

// Our own plain design: dark text on white, one accent colour, tables with light rules,
// numbers in tabular figures, charts scaled to the column, and a print layout without
// backgrounds that keeps figures and tables whole.
constexpr std::string_view kStyle = R"css(
:root { color-scheme: light; }
* { box-sizing: border-box; }
body { margin: 0; background: #ffffff; color: #1d1d1d;
  font: 15px/1.5 "Segoe UI", Helvetica, Arial, sans-serif; }
main { max-width: 1080px; margin: 0 auto; padding: 24px 28px 48px; }
h1 { font-size: 1.7em; margin: 0.2em 0 0.1em; color: #163d63; }
h2 { font-size: 1.3em; margin: 1.8em 0 0.5em; padding-bottom: 0.2em; color: #163d63;
  border-bottom: 2px solid #c9d8ec; }
h3 { font-size: 1.05em; margin: 1.3em 0 0.4em; }
p { margin: 0.4em 0 0.8em; max-width: 72em; }
.lead { color: #3d3d3d; }
nav ul { list-style: none; padding: 0; margin: 0.6em 0; display: flex; flex-wrap: wrap; gap: 4px 18px; }
nav a, a { color: #1f4e8c; }
.caution { border-left: 5px solid #b34d00; background: #fff6ee; padding: 10px 16px; margin: 16px 0; }
.caution h2 { border: none; margin: 0 0 0.3em; color: #7a3400; font-size: 1.1em; }
.caution p { margin: 0.3em 0; }
dl.facts { display: grid; grid-template-columns: max-content 1fr; gap: 4px 18px; margin: 0.6em 0; }
dl.facts dt { font-weight: 600; }
dl.facts dd { margin: 0; }
pre { background: #f3f5f8; border: 1px solid #d9dee6; padding: 8px 12px; overflow-x: auto;
  white-space: pre-wrap; word-break: break-all; }
.scroll { overflow-x: auto; margin: 0.4em 0 1.2em; }
table { border-collapse: collapse; font-variant-numeric: tabular-nums; }
caption { text-align: left; font-weight: 600; padding: 0 0 6px; }
th, td { padding: 4px 8px; border-bottom: 1px solid #dde2e8; vertical-align: top; }
thead th { border-bottom: 2px solid #6b7785; text-align: left; background: #f3f5f8; }
th.num, td.num { text-align: right; }
ul.sentences { padding-left: 1.2em; }
ul.sentences li { margin: 0.35em 0; max-width: 72em; }
tbody th { text-align: left; font-weight: 600; }
tbody tr:nth-child(even) { background: #f8f9fb; }
td.better { color: #1b6127; font-weight: 600; }
td.worse { color: #9e2318; font-weight: 600; }
td.none { color: #4f4f4f; }
.charts { display: grid; grid-template-columns: repeat(auto-fit, minmax(460px, 1fr)); gap: 8px 28px; }
figure { margin: 0.6em 0 1.2em; }
figure svg { max-width: 100%; height: auto; display: block; }
figcaption { font-size: 0.9em; color: #3d3d3d; margin-top: 4px; }
details { margin: 0.5em 0 1em; border: 1px solid #d9dee6; border-radius: 4px; padding: 4px 12px; }
summary { cursor: pointer; font-weight: 600; padding: 4px 0; }
.note { font-size: 0.92em; color: #3d3d3d; }
footer { margin-top: 3em; font-size: 0.85em; color: #4f4f4f; }
@media print {
  body { font-size: 10.5pt; }
  main { max-width: none; padding: 0; }
  nav { display: none; }
  .charts { display: block; }
  figure, table, .caution, dl.facts { break-inside: avoid; page-break-inside: avoid; }
  h2, h3 { break-after: avoid; page-break-after: avoid; }
  .scroll { overflow: visible; }
  tbody tr:nth-child(even), thead th, pre, .caution { background: none; }
  details { border: none; padding: 0; }
  a { color: inherit; text-decoration: none; }
}
@page { margin: 14mm; }
)css";

std::string class_attribute(std::string_view css_class) {
  return css_class.empty() ? std::string() : fmt::format(R"( class="{}")", css_class);
}

/// A header may wrap after a dot, underscore or slash (a zero-width space there), so a YAML
/// path or a field name does not widen its column; hyphens are break points already.
std::string with_breaks(std::string_view text) {
  std::string out;
  for (const char c : text) {
    out += c;
    if (c == '.' || c == '_' || c == '/') out += "\u200b";
  }
  return out;
}

/// "12,345 ± 1,234" may wrap before the "±" but not after it, so a narrow column shows the
/// mean on one line and its half-width on the next (U+00A0 after the sign).
std::string keep_half_width(std::string_view text) {
  std::string out;
  std::size_t from = 0;
  for (std::size_t at = text.find("\u00b1 "); at != std::string_view::npos;
       at = text.find("\u00b1 ", from)) {
    out += text.substr(from, at - from);
    out += "\u00b1\u00a0";
    from = at + std::string_view("\u00b1 ").size();
  }
  out += text.substr(from);
  return out;
}

}  // namespace

HtmlTable::HtmlTable(std::string_view caption) : caption_(xml_escape(caption)) {}

void HtmlTable::row(const std::vector<HtmlCell>& cells) {
  if (rows_ == 0) {
    for (const HtmlCell& c : cells) {
      numeric_.push_back(c.css_class == "num" || c.css_class.starts_with("num "));
    }
  }
  body_ += "<tr>";
  for (const HtmlCell& c : cells) {
    const std::string text = xml_escape(keep_half_width(c.text));
    if (c.row_header) {
      body_ += fmt::format(R"(<th scope="row"{}>{}</th>)", class_attribute(c.css_class), text);
    } else {
      body_ += fmt::format("<td{}>{}</td>", class_attribute(c.css_class), text);
    }
  }
  body_ += "</tr>";
  ++rows_;
}

std::string HtmlTable::str() const {
  std::string head;
  for (std::size_t c = 0; c < header_.size(); ++c) {
    const bool numeric = c < numeric_.size() && numeric_[c];
    head += fmt::format(R"(<th scope="col"{}>{}</th>)", class_attribute(numeric ? "num" : ""),
                        xml_escape(with_breaks(header_[c])));
  }
  return fmt::format(
      R"(<div class="scroll"><table><caption>{}</caption><thead><tr>{}</tr></thead><tbody>{})"
      R"(</tbody></table></div>)",
      caption_, head, body_);
}

std::string html_document(std::string_view title, std::string_view body) {
  return fmt::format(
      "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\"/>\n"
      "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\"/>\n"
      "<title>{}</title>\n<style>{}</style>\n</head>\n<body>\n<main>\n{}</main>\n</body>\n"
      "</html>\n",
      xml_escape(title), kStyle, body);
}

std::string html_section(std::string_view id, std::string_view heading, std::string_view content) {
  return fmt::format("<section id=\"{}\">\n<h2>{}</h2>\n{}</section>\n", id, xml_escape(heading),
                     content);
}

std::string html_paragraph(std::string_view text, std::string_view css_class) {
  return fmt::format("<p{}>{}</p>\n", class_attribute(css_class), xml_escape(text));
}

std::string html_figure(std::string_view svg, std::string_view caption) {
  return fmt::format("<figure>{}<figcaption>{}</figcaption></figure>\n", svg, xml_escape(caption));
}

std::string html_details(std::string_view summary, std::string_view content, bool open) {
  return fmt::format("<details{}><summary>{}</summary>\n{}</details>\n",
                     open ? R"( open="open")" : "", xml_escape(summary), content);
}

std::string html_cautions(const std::vector<std::string>& cautions) {
  std::string out = "<aside class=\"caution\" id=\"cautions\">\n<h2>Cautions</h2>\n";
  for (const std::string& c : cautions) out += html_paragraph(c);
  return out + "</aside>\n";
}

}  // namespace larder
