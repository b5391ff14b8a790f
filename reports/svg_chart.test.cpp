// The SVG charts: geometry on a bar chart worked by hand, escaping, well-formedness (Python's
// xml.etree parses every chart), labels in text for every bar, point and series, and colour
// contrast by the WCAG 2.1 formulas (relative luminance and contrast ratio, success criteria
// 1.4.3 and 1.4.11).

#include "reports/svg_chart.hpp"

#include <catch2/catch.hpp>
#include <cmath>
#include <set>

#include "reports/markup_check.test.hpp"

namespace larder {
namespace {

/// The y attribute of the <text> element whose content is `content`; NaN if there is none.
double text_y(const std::string& svg, const std::string& content) {
  const std::size_t end = svg.find(">" + content + "</text>");
  if (end == std::string::npos) return std::nan("");
  const std::size_t start = svg.rfind("<text ", end);
  const std::size_t y = svg.find(" y=\"", start);
  return std::stod(svg.substr(y + 4));
}

std::size_t count(const std::string& text, const std::string& needle) {
  std::size_t n = 0;
  for (std::size_t at = text.find(needle); at != std::string::npos;
       at = text.find(needle, at + 1)) {
    ++n;
  }
  return n;
}

/// WCAG 2.1 relative luminance of "#rrggbb".
double luminance(std::string_view hex) {
  double l = 0.0;
  const double weight[3] = {0.2126, 0.7152, 0.0722};
  for (int c = 0; c < 3; ++c) {
    const double v = std::stoi(std::string(hex.substr(1 + 2 * c, 2)), nullptr, 16) / 255.0;
    l += weight[c] * (v <= 0.04045 ? v / 12.92 : std::pow((v + 0.055) / 1.055, 2.4));
  }
  return l;
}

double contrast_on_white(std::string_view hex) {
  return 1.05 / (luminance(hex) + 0.05);
}

TEST_CASE("bar chart geometry, worked by hand", "[html]") {
  BarChart c;
  c.width = 500.0;
  c.title = "t";
  c.axis_label = "share";
  c.bars = {{"a", 0.5, 0.1, "x"}, {"b", 0.2, std::nan(""), "y"}};
  const std::string svg = svg_bar_chart(c);
  INFO(svg);
  // Labels need 40 px at least (1 character is 7.2 px), so the plot starts at 12 + 40 + 10 = 62;
  // the widest value text is 7.2 px, so it ends at 500 - 12 - 7.2 - 8 = 472.8. The data span
  // [0, 0.6] (0.5 + 0.1) gives ticks 0, 0.2, 0.4, 0.6, so x(v) = 62 + v / 0.6 x 410.8.
  CHECK_THAT(svg,
             Catch::StartsWith(R"(<svg width="500.0" height="146.0" viewBox="0 0 500.0 146.0")"));
  // Bar a: x(0.5) = 404.33, width 342.33; row centre 40 + 15 = 55, so y = 55 - 8.
  CHECK_THAT(svg, Catch::Contains(R"(<rect x="62.0" y="47.0" width="342.3" height="16.0")"));
  // Its error bar from x(0.4) = 335.87 to x(0.6) = 472.8, with caps.
  CHECK_THAT(svg, Catch::Contains(R"(<line x1="335.9" y1="55.0" x2="472.8" y2="55.0")"));
  CHECK_THAT(svg, Catch::Contains(R"(<line x1="472.8" y1="49.0" x2="472.8" y2="61.0")"));
  // Bar b: x(0.2) = 198.93; no interval, no error bar on its row (y = 85).
  CHECK_THAT(svg, Catch::Contains(R"(<rect x="62.0" y="77.0" width="136.9" height="16.0")"));
  CHECK(count(svg, R"(y1="85.0" x2=)") == 0);
  // Value texts just right of the whisker (472.8 + 6) and of the bar (198.9 + 6).
  CHECK(text_y(svg, "x") == 59.0);
  CHECK_THAT(svg, Catch::Contains(R"(<text x="478.8" y="59.0")"));
  CHECK_THAT(svg, Catch::Contains(R"(<text x="204.9" y="89.0")"));
  for (const char* tick : {"0.0", "0.2", "0.4", "0.6"}) {
    CHECK_THAT(svg, Catch::Contains(std::string(">") + tick + "</text>"));
  }
  CHECK(test::markup_problems(svg, "xml", "svg").empty());
}

TEST_CASE("bar chart: negative values, long labels, missing values", "[html]") {
  BarChart c;
  c.title = "profit by policy";
  c.axis_label = "profit, EUR";
  c.bars = {{"a policy name far too long to fit in the space kept for labels", -2000.0, 150.0,
             "-2,000 ± 150"},
            {"gain", 3500.0, 0.0, "3,500 ± 0"},
            {"broken", std::nan(""), std::nan(""), "n/a"}};
  const std::string svg = svg_bar_chart(c);
  INFO(svg);
  CHECK(test::markup_problems(svg, "xml", "svg").empty());
  CHECK(svg.find(R"(width="-)") == std::string::npos);  // bars left of zero have a width >= 0
  CHECK_THAT(svg, Catch::Contains("…</text>"));         // the long label is cut
  CHECK_THAT(svg, Catch::Contains(">gain</text>") && Catch::Contains(">n/a</text>") &&
                      Catch::Contains(">-2,000 ± 150</text>"));
  // [-2150, 3500]: s = 1000 gives ceil(3.5) - floor(-2.15) = 4 + 3 = 7 > 5; s = 2000 gives
  // 2 + 2 = 4: ticks -4,000 to 4,000.
  CHECK_THAT(svg, Catch::Contains(">-4,000</text>") && Catch::Contains(">4,000</text>"));
  CHECK(count(svg, "<rect ") == 1 + 2);  // the background and two bars
}

TEST_CASE("charts escape their text and parse as XML", "[html]") {
  const std::string evil = "<b>\"fish & chips\"</b>";
  BarChart bars{500.0, evil, evil, {{evil, 1.0, 0.5, evil}}};
  ScatterChart scatter{500.0, evil, evil, evil, {{evil, 1.0, 0.1, 2.0, 0.2}}};
  LineChart lines;
  lines.title = evil;
  lines.x = {0, 1, 2};
  lines.series = {{evil, {1, 2, 3}}};
  lines.marker_x = 1.0;
  lines.marker_label = evil;
  for (const std::string& svg :
       {svg_bar_chart(bars), svg_scatter(scatter), svg_line_chart(lines)}) {
    INFO(svg);
    CHECK(test::markup_problems(svg, "xml", "svg").empty());
    CHECK(svg.find("<b>") == std::string::npos);
    CHECK_THAT(svg, Catch::Contains("&lt;b&gt;&quot;fish &amp; chips&quot;&lt;/b&gt;"));
    CHECK_THAT(svg, Catch::Contains(R"(role="img" aria-label="&lt;b&gt;)"));
    CHECK(svg.find("http") == std::string::npos);  // no xmlns: inline SVG names no URL
  }
}

TEST_CASE("scatter: every point labelled in text, overlapping labels moved apart", "[html]") {
  ScatterChart c;
  c.title = "waste against in-stock";
  c.x_label = "in stock, %";
  c.y_label = "waste, %";
  c.points = {{"first", 50.0, 2.0, 10.0, 1.0},
              {"second", 50.0, 2.0, 10.0, 1.0},  // the same place
              {"far", 90.0, 0.0, 25.0, 0.0},
              {"lost", std::nan(""), 0.0, 1.0, 0.0}};
  const std::string svg = svg_scatter(c);
  INFO(svg);
  CHECK(test::markup_problems(svg, "xml", "svg").empty());
  CHECK(count(svg, "<circle ") == 3);  // the point without an x is left out
  CHECK(svg.find(">lost</text>") == std::string::npos);
  const double y1 = text_y(svg, "first");
  const double y2 = text_y(svg, "second");
  REQUIRE(std::isfinite(y1));
  REQUIRE(std::isfinite(y2));
  CHECK(std::fabs(y1 - y2) >= 14.0);  // one line apart
  CHECK(std::isfinite(text_y(svg, "far")));
  // Axes: x over [48, 90] in steps of 10 (s = 5 needs ceil(18) - floor(9.6) = 9 intervals,
  // s = 10 needs 9 - 4 = 5), so 40 to 90 onto [64, 476]; y over [9, 25] in steps of 5 (s = 2
  // needs 13 - 4 = 9, s = 5 needs 5 - 1 = 4), so 5 to 25 onto [372, 56]. The first two points'
  // x error bars run from x(48) = 64 + 8 / 50 x 412 = 129.92 to x(52) = 162.88 at
  // y(10) = 372 - 5 / 20 x 316 = 293.
  CHECK(count(svg, R"(<line x1="129.9" y1="293.0" x2="162.9" y2="293.0")") == 2);
  // Their y error bars at x(50) = 146.4 from y(9) = 308.8 to y(11) = 277.2.
  CHECK(count(svg, R"(<line x1="146.4" y1="308.8" x2="146.4" y2="277.2")") == 2);
  CHECK_THAT(svg, Catch::Contains(">40</text>") && Catch::Contains(">90</text>") &&
                      Catch::Contains(">25</text>"));
}

TEST_CASE("line chart: series differ by dash as well as colour, legend in text", "[html]") {
  LineChart c;
  c.title = "a store-item";
  c.x_label = "day";
  c.y_label = "units";
  c.x = {0, 1, 2, 3, 4, 5};
  c.series = {{"demand", {5, 6, 7, 6, 5, 4}},
              {"sold", {5, 6, std::nan(""), 6, 5, 4}},  // a gap: two polylines
              {"wasted", {0, 0, 1, 0, 2, 0}}};
  c.marker_x = 2.0;
  c.marker_label = "scored from day 2";
  const std::string svg = svg_line_chart(c);
  INFO(svg);
  CHECK(test::markup_problems(svg, "xml", "svg").empty());
  CHECK(count(svg, "<polyline ") == 4);
  for (const char* name : {"demand", "sold", "wasted", "scored from day 2"}) {
    CHECK_THAT(svg, Catch::Contains(std::string(">") + name + "</text>"));
  }
  // The legend's samples carry each series' dash: solid, then the next two patterns.
  CHECK(count(svg, std::string(R"(stroke-dasharray=")") + std::string(chart_dashes()[1]) + "\"") ==
        2 + 1);  // the two pieces of "sold" and its legend sample
  CHECK(count(svg, std::string(R"(stroke-dasharray=")") + std::string(chart_dashes()[2]) + "\"") ==
        1 + 1);
  // y axis from 0 to the nice end above 7: s = 2 gives ceil(3.5) = 4 intervals, 0 to 8.
  CHECK_THAT(svg, Catch::Contains(">8</text>"));
}

TEST_CASE("chart colours contrast with white by WCAG 2.1", "[html]") {
  // Hand check of the formula: #555555 on white is 7.46:1 (0x55 / 255 = 1/3, linearised
  // ((1/3 + 0.055) / 1.055)^2.4 = 0.0908; (1 + 0.05) / (0.0908 + 0.05) = 7.46).
  CHECK(contrast_on_white("#555555") == Approx(7.46).margin(0.01));
  CHECK(contrast_on_white("#ffffff") == Approx(1.0));
  // Lines and points (non-text, 1.4.11) need 3:1; ours meet the 4.5:1 of text (1.4.3).
  for (const std::string_view c : chart_palette()) {
    INFO(c);
    CHECK(contrast_on_white(c) >= 4.5);
  }
  CHECK(contrast_on_white(kBarOutline) >= 4.5);
  CHECK(contrast_on_white(kInk) >= 4.5);
  // Patterns are all different, so series never differ by colour alone.
  const std::set<std::string_view> dashes(chart_dashes().begin(), chart_dashes().end());
  CHECK(dashes.size() == chart_dashes().size());
  CHECK(chart_dashes().size() == chart_palette().size());
}

}  // namespace
}  // namespace larder
