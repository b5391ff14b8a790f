#include "reports/svg_chart.hpp"

#include <algorithm>
#include <array>
#include <cmath>
#include <initializer_list>
#include <limits>

#include "reports/chart_scale.hpp"
#include "reports/label_layout.hpp"
#include "reports/svg_writer.hpp"

namespace larder {

namespace {

constexpr std::array<std::string_view, 6> kPalette = {"#0072b2", "#b34d00", "#00775a",
                                                      "#a8457f", "#8a5d00", "#555555"};
constexpr std::array<std::string_view, 6> kDashes = {"", "7 3", "2 3", "9 3 2 3", "4 4", "1 2"};
constexpr std::string_view kGrid = "#d9d9d9";
constexpr std::string_view kAxis = "#6b6b6b";
constexpr double kMargin = 12.0;
constexpr double kTitleSize = 14.0;
constexpr double kLineHeight = 14.0;
constexpr double kInf = std::numeric_limits<double>::infinity();

/// The drawing area of a chart, in pixels.
struct Frame {
  double left;
  double top;
  double right;
  double bottom;
};

struct Box {
  double x0;
  double y0;
  double x1;
  double y1;
  bool overlaps(const Box& o) const { return x0 < o.x1 && o.x0 < x1 && y0 < o.y1 && o.y0 < y1; }
};

bool finite(double v) {
  return std::isfinite(v);
}

double half_or_zero(double h) {
  return finite(h) && h > 0.0 ? h : 0.0;
}

/// `text` cut at a character boundary and ended with "…" so that it fits in `width` pixels.
std::string fit_text(std::string_view text, double width) {
  if (text_width(text) <= width) return std::string(text);
  std::string out;
  std::size_t i = 0;
  while (i < text.size()) {
    std::size_t j = i + 1;
    while (j < text.size() && (static_cast<unsigned char>(text[j]) & 0xC0) == 0x80) ++j;
    const std::string_view ch = text.substr(i, j - i);
    if (text_width(out) + text_width(ch) + text_width("…") > width) break;
    out += ch;
    i = j;
  }
  return out + "…";
}

void draw_title(SvgDocument& svg, std::string_view title) {
  svg.text({kMargin, 22.0}, title, {Anchor::start, kTitleSize, true, kInk});
}

/// Vertical grid lines and tick labels under the frame, the axis label below them.
void draw_value_axis_x(SvgDocument& svg, const Axis& axis, std::span<const double> ticks,
                       const LinearScale& x, const Frame& f, std::string_view label) {
  for (const double t : ticks) {
    const double px = x(t);
    svg.line({px, f.top}, {px, f.bottom}, {kGrid, 1.0});
    svg.line({px, f.bottom}, {px, f.bottom + 4.0}, {kAxis, 1.0});
    svg.text({px, f.bottom + 17.0}, tick_label(axis, t), {Anchor::middle, 11.0, false, kInk});
  }
  svg.line({f.left, f.bottom}, {f.right, f.bottom}, {kAxis, 1.0});
  svg.text({(f.left + f.right) / 2.0, f.bottom + 34.0}, label, {Anchor::middle, 12.0, false, kInk});
}

/// Horizontal grid lines and tick labels left of the frame, the axis label above it.
void draw_value_axis_y(SvgDocument& svg, const Axis& axis, const LinearScale& y, const Frame& f,
                       std::string_view label) {
  for (const double t : axis.ticks) {
    const double py = y(t);
    svg.line({f.left, py}, {f.right, py}, {kGrid, 1.0});
    svg.line({f.left - 4.0, py}, {f.left, py}, {kAxis, 1.0});
    svg.text({f.left - 7.0, py + 4.0}, tick_label(axis, t), {Anchor::end, 11.0, false, kInk});
  }
  svg.line({f.left, f.top}, {f.left, f.bottom}, {kAxis, 1.0});
  svg.text({kMargin, f.top - 12.0}, label, {Anchor::start, 12.0, false, kInk});
}

/// A horizontal error bar from `lo` to `hi` at height `y`, with caps of half-height `cap`.
void error_bar_x(SvgDocument& svg, double lo, double hi, double y, double cap) {
  const Stroke s{kInk, 1.5};
  svg.line({lo, y}, {hi, y}, s);
  svg.line({lo, y - cap}, {lo, y + cap}, s);
  svg.line({hi, y - cap}, {hi, y + cap}, s);
}

void error_bar_y(SvgDocument& svg, double x, double lo, double hi, double cap) {
  const Stroke s{kInk, 1.5};
  svg.line({x, lo}, {x, hi}, s);
  svg.line({x - cap, lo}, {x + cap, lo}, s);
  svg.line({x - cap, hi}, {x + cap, hi}, s);
}

/// The data range of values with their half-widths (non-finite values ignored).
template <typename Lo, typename Hi, typename Range>
std::pair<double, double> data_extent(const Range& items, Lo lo_of, Hi hi_of) {
  double lo = kInf;
  double hi = -kInf;
  for (const auto& it : items) {
    if (!finite(lo_of(it)) || !finite(hi_of(it))) continue;
    lo = std::min(lo, lo_of(it));
    hi = std::max(hi, hi_of(it));
  }
  return {lo, hi};
}

/// The axes of points with crosshairs (x, x_half, y, y_half): each spans its points' extent,
/// crosshairs included.
template <typename Points>
std::pair<Axis, Axis> crosshair_axes(const Points& points) {
  using P = typename Points::value_type;
  const auto [x_lo, x_hi] = data_extent(
      points, [](const P& p) { return p.x - half_or_zero(p.x_half); },
      [](const P& p) { return p.x + half_or_zero(p.x_half); });
  const auto [y_lo, y_hi] = data_extent(
      points, [](const P& p) { return p.y - half_or_zero(p.y_half); },
      [](const P& p) { return p.y + half_or_zero(p.y_half); });
  return {nice_axis(x_lo, x_hi), nice_axis(y_lo, y_hi)};
}

// --- bar chart --------------------------------------------------------------------------

constexpr double kBarRow = 30.0;
constexpr double kBarHeight = 16.0;

/// A bar from 0, or with `dot`, a dot at the value (an axis that does not start at 0 must not
/// draw lengths).
void draw_bar(SvgDocument& svg, const Bar& bar, const LinearScale& x, double label_width,
              const Frame& f, double cy, bool dot) {
  svg.text({f.left - 10.0, cy + 4.0}, fit_text(bar.label, label_width), {Anchor::end, 12.0});
  const double x0 = dot ? f.left : x(0.0);
  double text_x = x0;
  if (finite(bar.value)) {
    const double xv = x(bar.value);
    if (dot) {
      svg.line({f.left, cy}, {xv, cy}, {kGrid, 1.0, "2 3"});
    } else {
      svg.rect({std::min(x0, xv), cy - kBarHeight / 2.0}, std::fabs(xv - x0), kBarHeight, kBarFill,
               {kBarOutline, 1.0});
    }
    text_x = std::max(x0, xv);
    const double h = half_or_zero(bar.half_width);
    if (h > 0.0) {
      error_bar_x(svg, x(bar.value - h), x(bar.value + h), cy, 6.0);
      text_x = std::max(text_x, x(bar.value + h));
    }
    if (dot) svg.circle({xv, cy}, 5.0, kBarOutline, {"#ffffff", 1.0});
  }
  svg.text({text_x + 6.0, cy + 4.0}, bar.value_text, {Anchor::start, 12.0});
}

// --- scatter ----------------------------------------------------------------------------

/// Where a point's label goes: right of the point (left when it would leave the picture), moved
/// down by a line while it overlaps a label placed before.
struct LabelSpot {
  Point at;
  Anchor anchor;
};

LabelSpot place_label(Point p, double width, double picture_width, std::vector<Box>& placed) {
  const bool left = p.x + 8.0 + width > picture_width - 4.0;
  LabelSpot spot{{left ? p.x - 8.0 : p.x + 8.0, p.y - 6.0}, left ? Anchor::end : Anchor::start};
  const double x0 = left ? spot.at.x - width : spot.at.x;
  for (int tries = 0; tries < 12; ++tries) {
    const Box box{x0, spot.at.y - 11.0, x0 + width, spot.at.y + 3.0};
    const bool clash =
        std::any_of(placed.begin(), placed.end(), [&](const Box& b) { return b.overlaps(box); });
    if (!clash || tries == 11) {
      placed.push_back(box);
      break;
    }
    spot.at.y += kLineHeight;
  }
  return spot;
}

// --- line chart -------------------------------------------------------------------------

/// The series as polylines, broken where a value is not finite.
void draw_series(SvgDocument& svg, std::span<const double> xs, const LineSeries& s,
                 const LinearScale& x, const LinearScale& y, const Stroke& stroke) {
  std::vector<Point> run;
  const auto flush = [&] {
    if (run.size() == 1) svg.circle(run.front(), 2.0, stroke.colour, {stroke.colour, 0.0});
    if (run.size() > 1) svg.polyline(run, stroke);
    run.clear();
  };
  for (std::size_t i = 0; i < xs.size() && i < s.y.size(); ++i) {
    if (finite(s.y[i])) {
      run.push_back({x(xs[i]), y(s.y[i])});
    } else {
      flush();
    }
  }
  flush();
}

/// Lays out legend entries named `names` in rows from `top`, wrapping at the picture's margin,
/// and calls `draw(i, x, y)` for each (its sample at x .. x + 24, its name from x + 30 on the
/// baseline y); returns the y below the last row.
template <typename Names, typename Draw>
double legend_rows(const Names& names, double top, double picture_width, Draw&& draw) {
  double x = kMargin;
  double y = top;
  for (std::size_t i = 0; i < names.size(); ++i) {
    const double w = 30.0 + text_width(names[i].name) + 18.0;
    if (x > kMargin && x + w > picture_width - kMargin) {
      x = kMargin;
      y += 18.0;
    }
    draw(i, x, y);
    x += w;
  }
  return y + 10.0;
}

/// Legend entries (a line sample in the series' stroke, then its name), wrapping across rows
/// from `top`; returns the y below the last row.
double draw_legend(SvgDocument* svg, std::span<const LineSeries> series, double top,
                   double picture_width) {
  return legend_rows(series, top, picture_width, [&](std::size_t i, double x, double y) {
    if (svg == nullptr) return;
    const Stroke s{kPalette[i % kPalette.size()], 2.5, kDashes[i % kDashes.size()]};
    svg->line({x, y - 4.0}, {x + 24.0, y - 4.0}, s);
    svg->text({x + 30.0, y}, series[i].name, {Anchor::start, 12.0});
  });
}

// --- series chart -----------------------------------------------------------------------

/// Marker `shape` (0 .. kMarkerShapes - 1) of radius `r` at `c`.
void draw_marker(SvgDocument& svg, std::size_t shape, Point c, double r, std::string_view fill,
                 const Stroke& outline) {
  const auto poly = [&](std::initializer_list<Point> offsets) {
    std::vector<Point> pts;
    for (const Point& o : offsets) pts.push_back({c.x + o.x * r, c.y + o.y * r});
    svg.polygon(pts, fill, outline);
  };
  switch (shape % kMarkerShapes) {
    case 0:
      svg.circle(c, r, fill, outline);
      break;
    case 1:
      svg.rect({c.x - 0.9 * r, c.y - 0.9 * r}, 1.8 * r, 1.8 * r, fill, outline);
      break;
    case 2:
      poly({{0.0, -1.2}, {1.1, 0.8}, {-1.1, 0.8}});
      break;
    case 3:
      poly({{0.0, -1.3}, {1.3, 0.0}, {0.0, 1.3}, {-1.3, 0.0}});
      break;
    case 4:
      poly({{0.0, 1.2}, {1.1, -0.8}, {-1.1, -0.8}});
      break;
    case 5:
      poly({{-1.2, 0.0}, {0.8, -1.1}, {0.8, 1.1}});
      break;
    default:
      poly({{1.2, 0.0}, {-0.8, -1.1}, {-0.8, 1.1}});
      break;
  }
}

constexpr double kMarkerRadius = 4.5;
constexpr double kEmphasisRadius = 7.0;

/// The legend of a series chart (line sample, marker, name), wrapping across rows from `top`;
/// returns the y below the last row.
double draw_series_legend(SvgDocument* svg, std::span<const PointSeries> series, bool connect,
                          double top, double picture_width) {
  return legend_rows(series, top, picture_width, [&](std::size_t i, double x, double y) {
    if (svg == nullptr) return;
    const std::string_view colour = kPalette[i % kPalette.size()];
    if (connect) {
      svg->line({x, y - 4.0}, {x + 24.0, y - 4.0}, {colour, 2.0, kDashes[i % kDashes.size()]});
    }
    draw_marker(*svg, i, {x + 12.0, y - 4.0}, kMarkerRadius, colour, {"#ffffff", 1.0});
    svg->text({x + 30.0, y}, series[i].name, {Anchor::start, 12.0});
  });
}

}  // namespace

std::string svg_series_chart(const SeriesChart& chart) {
  std::vector<PointSeries> series;
  for (const PointSeries& s : chart.series) {
    PointSeries kept{s.name, {}};
    for (const SeriesPoint& p : s.points) {
      if (finite(p.x) && finite(p.y)) kept.points.push_back(p);
    }
    series.push_back(std::move(kept));
  }
  const Frame f{64.0, 56.0, chart.width - 24.0, 372.0};
  const double legend_top = f.bottom + 62.0;
  const double height = draw_series_legend(nullptr, series, chart.connect, legend_top, chart.width);
  std::vector<SeriesPoint> all;
  for (const PointSeries& s : series) all.insert(all.end(), s.points.begin(), s.points.end());
  const auto [ax, ay] = crosshair_axes(all);
  const LinearScale x(ax.lo, ax.hi, f.left, f.right);
  const LinearScale y(ay.lo, ay.hi, f.bottom, f.top);

  SvgDocument svg(chart.width, height, chart.title);
  draw_title(svg, chart.title);
  draw_value_axis_x(svg, ax, ax.ticks, x, f, chart.x_label);
  draw_value_axis_y(svg, ay, y, f, chart.y_label);
  std::vector<LabelRequest> requests;
  std::vector<std::string> texts;
  std::vector<LabelBox> markers;
  for (std::size_t i = 0; i < series.size(); ++i) {
    const std::string_view colour = kPalette[i % kPalette.size()];
    std::vector<Point> at;
    for (const SeriesPoint& p : series[i].points) at.push_back({x(p.x), y(p.y)});
    if (chart.connect && at.size() > 1) {
      svg.polyline(at, {colour, 2.0, kDashes[i % kDashes.size()]});
    }
    for (std::size_t k = 0; k < at.size(); ++k) {
      const SeriesPoint& p = series[i].points[k];
      const double xh = half_or_zero(p.x_half);
      const double yh = half_or_zero(p.y_half);
      if (xh > 0.0) error_bar_x(svg, x(p.x - xh), x(p.x + xh), at[k].y, 3.0);
      if (yh > 0.0) error_bar_y(svg, at[k].x, y(p.y - yh), y(p.y + yh), 3.0);
      const double r = p.emphasised ? kEmphasisRadius : kMarkerRadius;
      if (p.emphasised) svg.circle(at[k], r + 4.0, "none", {kInk, 1.5});
      draw_marker(svg, i, at[k], r, colour, {"#ffffff", 1.0});
      markers.push_back({at[k].x - r, at[k].y - r, at[k].x + r, at[k].y + r});
      // Points of a series drawn at one place share one label: "0.7, 0.8".
      bool drawn_before = false;
      for (std::size_t j = 0; j < k; ++j) {
        drawn_before = drawn_before ||
                       (std::fabs(at[j].x - at[k].x) < 1.0 && std::fabs(at[j].y - at[k].y) < 1.0);
      }
      std::string label = p.label;
      for (std::size_t j = k + 1; j < at.size() && !drawn_before; ++j) {
        const std::string& other = series[i].points[j].label;
        if (!other.empty() && std::fabs(at[j].x - at[k].x) < 1.0 &&
            std::fabs(at[j].y - at[k].y) < 1.0) {
          label += (label.empty() ? "" : ", ") + other;
        }
      }
      if (!label.empty() && !drawn_before) {
        requests.push_back({at[k].x, at[k].y, text_width(label, 11.0), 12.0});
        texts.push_back(std::move(label));
      }
    }
  }
  const std::vector<std::optional<LabelBox>> spots =
      place_labels(requests, markers, {f.left, f.top - 14.0, chart.width - 4.0, f.bottom});
  for (std::size_t k = 0; k < spots.size(); ++k) {
    if (!spots[k]) continue;
    svg.text({spots[k]->x0, spots[k]->y1 - 2.0}, texts[k], {Anchor::start, 11.0, false, kInk});
  }
  draw_series_legend(&svg, series, chart.connect, legend_top, chart.width);
  return svg.str();
}

std::span<const std::string_view> chart_palette() {
  return kPalette;
}

std::span<const std::string_view> chart_dashes() {
  return kDashes;
}

bool zero_hides_differences(std::span<const Bar> bars) {
  double lo = kInf;
  double hi = -kInf;
  double top = 0.0;
  int n = 0;
  for (const Bar& b : bars) {
    if (!finite(b.value)) continue;
    const double h = half_or_zero(b.half_width);
    lo = std::min(lo, b.value - h);
    hi = std::max(hi, b.value + h);
    top = std::max(top, std::fabs(b.value) + h);
    ++n;
  }
  if (n < 2 || top == 0.0 || lo * hi <= 0.0) return false;  // 0 is among the data
  return hi - lo < kVisibleSpread * top;
}

std::string svg_bar_chart(const BarChart& chart) {
  double label_width = 40.0;
  double value_width = 0.0;
  for (const Bar& b : chart.bars) {
    label_width = std::max(label_width, text_width(b.label));
    value_width = std::max(value_width, text_width(b.value_text));
  }
  label_width = std::min(label_width, 0.4 * chart.width);
  const double n = static_cast<double>(chart.bars.size());
  const Frame f{kMargin + label_width + 10.0, 40.0, chart.width - kMargin - value_width - 8.0,
                40.0 + std::max(n, 1.0) * kBarRow};
  const double height = f.bottom + 46.0;

  auto [lo, hi] = data_extent(
      chart.bars, [](const Bar& b) { return b.value - half_or_zero(b.half_width); },
      [](const Bar& b) { return b.value + half_or_zero(b.half_width); });
  const bool dots = chart.axis == BarAxis::data ||
                    (chart.axis == BarAxis::automatic && zero_hides_differences(chart.bars));
  const Axis axis =
      dots ? nice_axis(lo, hi)
           : nice_axis(std::min(finite(lo) ? lo : 0.0, 0.0), std::max(finite(hi) ? hi : 0.0, 0.0));
  const LinearScale x(axis.lo, axis.hi, f.left, f.right);

  SvgDocument svg(chart.width, height, chart.title);
  draw_title(svg, chart.title);
  draw_value_axis_x(svg, axis, axis.ticks, x, f,
                    dots ? chart.axis_label + " (the axis does not start at 0)" : chart.axis_label);
  for (std::size_t i = 0; i < chart.bars.size(); ++i) {
    draw_bar(svg, chart.bars[i], x, label_width, f,
             f.top + (static_cast<double>(i) + 0.5) * kBarRow, dots);
  }
  if (!dots) svg.line({x(0.0), f.top}, {x(0.0), f.bottom}, {kInk, 1.0});
  return svg.str();
}

std::string svg_scatter(const ScatterChart& chart) {
  std::vector<ScatterPoint> points;
  for (const ScatterPoint& p : chart.points) {
    if (finite(p.x) && finite(p.y)) points.push_back(p);
  }
  const Frame f{64.0, 56.0, chart.width - 24.0, 372.0};
  const double height = f.bottom + 46.0;
  const auto [ax, ay] = crosshair_axes(points);
  const LinearScale x(ax.lo, ax.hi, f.left, f.right);
  const LinearScale y(ay.lo, ay.hi, f.bottom, f.top);

  SvgDocument svg(chart.width, height, chart.title);
  draw_title(svg, chart.title);
  draw_value_axis_x(svg, ax, ax.ticks, x, f, chart.x_label);
  draw_value_axis_y(svg, ay, y, f, chart.y_label);
  std::vector<Point> at;
  for (const ScatterPoint& p : points) {
    at.push_back({x(p.x), y(p.y)});
    const double xh = half_or_zero(p.x_half);
    const double yh = half_or_zero(p.y_half);
    if (xh > 0.0) error_bar_x(svg, x(p.x - xh), x(p.x + xh), at.back().y, 4.0);
    if (yh > 0.0) error_bar_y(svg, at.back().x, y(p.y - yh), y(p.y + yh), 4.0);
    svg.circle(at.back(), 4.5, kBarOutline, {"#ffffff", 1.0});
  }
  std::vector<std::size_t> order(points.size());
  for (std::size_t i = 0; i < order.size(); ++i) order[i] = i;
  std::stable_sort(order.begin(), order.end(),
                   [&](std::size_t a, std::size_t b) { return at[a].y < at[b].y; });
  std::vector<Box> placed;
  for (const std::size_t i : order) {
    const LabelSpot spot = place_label(at[i], text_width(points[i].label), chart.width, placed);
    svg.text(spot.at, points[i].label, {spot.anchor, 12.0});
  }
  return svg.str();
}

std::string svg_line_chart(const LineChart& chart) {
  const Frame f{56.0, 56.0, chart.width - 16.0, 276.0};
  const double legend_top = f.bottom + 60.0;
  const double height = draw_legend(nullptr, chart.series, legend_top, chart.width);

  const double x0 = chart.x.empty() ? 0.0 : chart.x.front();
  const double x1 = chart.x.size() > 1 ? chart.x.back() : x0 + 1.0;
  std::vector<double> x_ticks;
  const Axis ax = nice_axis(x0, x1, 8);
  for (const double t : ax.ticks) {
    if (t >= x0 && t <= x1) x_ticks.push_back(t);
  }
  double lo = 0.0;
  double hi = -kInf;
  for (const LineSeries& s : chart.series) {
    for (const double v : s.y) {
      if (!finite(v)) continue;
      lo = std::min(lo, v);
      hi = std::max(hi, v);
    }
  }
  const Axis ay = nice_axis(lo, finite(hi) ? hi : 1.0);
  const LinearScale x(x0, x1, f.left, f.right);
  const LinearScale y(ay.lo, ay.hi, f.bottom, f.top);

  SvgDocument svg(chart.width, height, chart.title);
  draw_title(svg, chart.title);
  draw_value_axis_x(svg, ax, x_ticks, x, f, chart.x_label);
  draw_value_axis_y(svg, ay, y, f, chart.y_label);
  if (chart.marker_x && *chart.marker_x >= x0 && *chart.marker_x <= x1) {
    const double px = x(*chart.marker_x);
    svg.line({px, f.top}, {px, f.bottom}, {kAxis, 1.5, "5 4"});
    const bool right = px + 8.0 + text_width(chart.marker_label, 11.0) < f.right;
    svg.text({right ? px + 5.0 : px - 5.0, f.top + 12.0}, chart.marker_label,
             {right ? Anchor::start : Anchor::end, 11.0, false, kInk});
  }
  for (std::size_t i = 0; i < chart.series.size(); ++i) {
    const Stroke s{kPalette[i % kPalette.size()], 2.0, kDashes[i % kDashes.size()]};
    draw_series(svg, chart.x, chart.series[i], x, y, s);
  }
  draw_legend(&svg, chart.series, legend_top, chart.width);
  return svg.str();
}

}  // namespace larder
