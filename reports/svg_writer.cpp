#include "reports/svg_writer.hpp"

#include <fmt/format.h>

#include "reports/xml_text.hpp"

namespace larder {

namespace {

constexpr double kEmWidth = 0.6;

/// Coordinates with one decimal: finer than a pixel, short in the file.
std::string num(double v) {
  std::string s = fmt::format("{:.1f}", v);
  if (s == "-0.0") s = "0.0";
  return s;
}

std::string stroke_attributes(const Stroke& s) {
  std::string out = fmt::format(R"( stroke="{}" stroke-width="{}")", s.colour, num(s.width));
  if (!s.dash.empty()) out += fmt::format(R"( stroke-dasharray="{}")", s.dash);
  return out;
}

std::string_view anchor_name(Anchor a) {
  switch (a) {
    case Anchor::middle:
      return "middle";
    case Anchor::end:
      return "end";
    default:
      return "start";
  }
}

}  // namespace

double text_width(std::string_view text, double size) {
  double chars = 0.0;
  for (const char c : text) chars += (static_cast<unsigned char>(c) & 0xC0) != 0x80 ? 1.0 : 0.0;
  return chars * size * kEmWidth;
}

SvgDocument::SvgDocument(double width, double height, std::string_view title) {
  const std::string t = xml_escape(title);
  body_ = fmt::format(
      R"(<svg width="{0}" height="{1}" viewBox="0 0 {0} {1}" role="img" aria-label="{2}" )"
      R"(font-family="Helvetica, Arial, sans-serif" font-size="12"><title>{2}</title>)",
      num(width), num(height), t);
  body_ += fmt::format(R"(<rect x="0" y="0" width="{}" height="{}" fill="#ffffff"/>)", num(width),
                       num(height));
}

void SvgDocument::line(Point a, Point b, const Stroke& stroke) {
  body_ += fmt::format(R"(<line x1="{}" y1="{}" x2="{}" y2="{}"{}/>)", num(a.x), num(a.y), num(b.x),
                       num(b.y), stroke_attributes(stroke));
}

void SvgDocument::rect(Point corner, double width, double height, std::string_view fill,
                       const Stroke& outline) {
  body_ += fmt::format(R"(<rect x="{}" y="{}" width="{}" height="{}" fill="{}"{}/>)", num(corner.x),
                       num(corner.y), num(width), num(height), fill, stroke_attributes(outline));
}

void SvgDocument::circle(Point centre, double radius, std::string_view fill,
                         const Stroke& outline) {
  body_ += fmt::format(R"(<circle cx="{}" cy="{}" r="{}" fill="{}"{}/>)", num(centre.x),
                       num(centre.y), num(radius), fill, stroke_attributes(outline));
}

void SvgDocument::polyline(std::span<const Point> points, const Stroke& stroke) {
  std::string coords;
  for (const Point& p : points) {
    if (!coords.empty()) coords += ' ';
    coords += num(p.x) + ',' + num(p.y);
  }
  body_ += fmt::format(R"(<polyline points="{}" fill="none"{} stroke-linejoin="round"/>)", coords,
                       stroke_attributes(stroke));
}

void SvgDocument::polygon(std::span<const Point> points, std::string_view fill,
                          const Stroke& outline) {
  std::string coords;
  for (const Point& p : points) {
    if (!coords.empty()) coords += ' ';
    coords += num(p.x) + ',' + num(p.y);
  }
  body_ += fmt::format(R"(<polygon points="{}" fill="{}"{}/>)", coords, fill,
                       stroke_attributes(outline));
}

void SvgDocument::text(Point at, std::string_view text, const TextStyle& style) {
  body_ += fmt::format(R"(<text x="{}" y="{}" font-size="{}" fill="{}")", num(at.x), num(at.y),
                       num(style.size), style.fill);
  if (style.anchor != Anchor::start) {
    body_ += fmt::format(R"( text-anchor="{}")", anchor_name(style.anchor));
  }
  if (style.bold) body_ += R"( font-weight="bold")";
  body_ += '>' + xml_escape(text) + "</text>";
}

}  // namespace larder
