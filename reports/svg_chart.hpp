#pragma once
// The report's charts as inline SVG (report.html): a horizontal bar chart with error bars (one
// bar per policy), a scatter plot with error bars in both directions, and a line chart of
// several series over days. Every bar, point and series carries its name in text, so no chart
// relies on colour alone; series also differ by dash pattern. Colours have a contrast of at
// least 4.5:1 against the white background (WCAG 2.1, 1.4.3 and 1.4.11).

#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

namespace larder {

/// Colours of series and points, in order of use: the hues of the Okabe-Ito palette, chosen to
/// stay apart under the common colour-vision deficiencies, darkened to be readable as text on
/// white; a series also differs by its dash pattern and marker shape.
std::span<const std::string_view> chart_palette();
/// Dash patterns of line series, in order of use (the first is solid).
std::span<const std::string_view> chart_dashes();
/// Fill and outline of bars, and the colour of error bars.
inline constexpr std::string_view kBarFill = "#9db9de";
inline constexpr std::string_view kBarOutline = "#1f4e8c";
inline constexpr std::string_view kInk = "#222222";

/// One bar: a category, its value and the half-width of its interval.
struct Bar {
  std::string label;        ///< written left of the bar (a policy name)
  double value = 0.0;       ///< not finite: no bar is drawn, only value_text
  double half_width = 0.0;  ///< of the 95% interval; not finite or 0: no error bar
  std::string value_text;   ///< written right of the bar, e.g. "12.3 ± 0.8"
};

/// Where a bar chart's value axis starts: at 0 (bars), over the data only (dots at the values,
/// since lengths from a cut axis would mislead), or chosen by zero_hides_differences.
enum class BarAxis { automatic, from_zero, data };

struct BarChart {
  double width = 500.0;    ///< pixels; the height follows from the number of bars
  std::string title;       ///< drawn above the bars and the picture's accessible name
  std::string axis_label;  ///< under the value axis, e.g. "waste share, %"
  std::vector<Bar> bars;
  BarAxis axis = BarAxis::automatic;
};

/// The spread of the bars (their intervals included) below which an axis from 0 hides the
/// differences: a tenth of the largest value's distance from 0.
inline constexpr double kVisibleSpread = 0.1;

/// True when every bar lies on one side of 0, far from it compared with their spread: from 0,
/// 7.50 M against 7.55 M would look equal. Needs two finite bars.
bool zero_hides_differences(std::span<const Bar> bars);

/// Horizontal bars from zero, one row per bar, the value axis (always including 0) below; or,
/// when the axis starts elsewhere (BarAxis::data, or automatic and zero_hides_differences), a
/// dot per value on an axis over the data, which the axis label says.
std::string svg_bar_chart(const BarChart& chart);

/// One labelled point with the half-widths of its intervals in x and in y.
struct ScatterPoint {
  std::string label;
  double x = 0.0;
  double x_half = 0.0;
  double y = 0.0;
  double y_half = 0.0;
};

struct ScatterChart {
  double width = 500.0;  ///< pixels (the height is fixed)
  std::string title;
  std::string x_label;
  std::string y_label;
  std::vector<ScatterPoint> points;  ///< points with a non-finite coordinate are left out
};

/// Points with error bars in both directions; each label sits beside its point and is moved
/// down when it would overlap a label placed before it.
std::string svg_scatter(const ScatterChart& chart);

struct LineSeries {
  std::string name;       ///< shown in the legend with the series' colour and dash
  std::vector<double> y;  ///< one value per x; non-finite values break the line
};

struct LineChart {
  double width = 760.0;  ///< pixels; the height grows with the legend
  std::string title;
  std::string x_label;
  std::string y_label;
  std::vector<double> x;  ///< increasing
  std::vector<LineSeries> series;
  std::optional<double> marker_x;  ///< a vertical reference line (e.g. the end of the warm-up)
  std::string marker_label;        ///< written beside the reference line
};

/// Marker shapes of series, in order of use (one more than the colours, so that series that
/// share a colour differ by shape).
inline constexpr std::size_t kMarkerShapes = 7;

/// One point of a series chart with the half-widths of its intervals.
struct SeriesPoint {
  double x = 0.0;
  double x_half = 0.0;
  double y = 0.0;
  double y_half = 0.0;
  std::string label;        ///< written beside the point where there is room; may be empty
  bool emphasised = false;  ///< drawn larger, with a ring (a baseline)
};

/// One series: its points in order, drawn in one colour, dash and marker shape.
struct PointSeries {
  std::string name;  ///< in the legend
  std::vector<SeriesPoint> points;
};

struct SeriesChart {
  double width = 760.0;  ///< pixels; the height grows with the legend
  std::string title;
  std::string x_label;
  std::string y_label;
  std::vector<PointSeries> series;
  bool connect = true;  ///< join each series' points by a line, in order
};

/// Points with error bars in both directions, each series in its own colour, dash and marker
/// shape, joined in order when `connect`; labels never overlap each other or a point
/// (label_layout.hpp; points of one series at one place share one label) and a legend under
/// the plot names every series. Points with a non-finite
/// coordinate are left out.
std::string svg_series_chart(const SeriesChart& chart);

/// Several series over a common x, with a y axis from 0 (or below, for negative values) and a
/// legend under the plot.
std::string svg_line_chart(const LineChart& chart);

}  // namespace larder
