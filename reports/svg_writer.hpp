#pragma once
// The few SVG elements the report's charts draw (lines, rectangles, circles, polylines, text),
// written as well-formed XML for inline use in report.html. There is no xmlns attribute: an HTML
// parser places <svg> in the SVG namespace by itself, and the page must not name any URL.

#include <span>
#include <string>
#include <string_view>

namespace larder {

struct Point {
  double x = 0.0;
  double y = 0.0;
};

/// How a line is drawn: colour, width, and an SVG dash pattern (empty for solid).
struct Stroke {
  std::string_view colour = "#222222";
  double width = 1.0;
  std::string_view dash = {};
};

enum class Anchor { start, middle, end };

struct TextStyle {
  Anchor anchor = Anchor::start;
  double size = 12.0;
  bool bold = false;
  std::string_view fill = "#222222";
};

/// Width in pixels that `text` takes at `size`: 0.6 em per character (a generous average for
/// sans-serif faces), used to reserve margins and keep labels apart.
double text_width(std::string_view text, double size = 12.0);

/// One SVG picture built element by element; every text is escaped.
class SvgDocument {
 public:
  /// A picture of width x height pixels whose accessible name (role="img", aria-label and a
  /// <title> child) is `title`.
  SvgDocument(double width, double height, std::string_view title);

  void line(Point a, Point b, const Stroke& stroke);
  void rect(Point corner, double width, double height, std::string_view fill,
            const Stroke& outline);
  void circle(Point centre, double radius, std::string_view fill, const Stroke& outline);
  void polyline(std::span<const Point> points, const Stroke& stroke);
  /// A closed shape through `points`, filled.
  void polygon(std::span<const Point> points, std::string_view fill, const Stroke& outline);
  void text(Point at, std::string_view text, const TextStyle& style = {});
  /// The finished <svg> element.
  std::string str() const { return body_ + "</svg>"; }

 private:
  std::string body_;
};

}  // namespace larder
