#include "reports/html_trace.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <array>

#include "reports/html_page.hpp"
#include "reports/number_format.hpp"
#include "reports/svg_chart.hpp"

namespace larder {

namespace {

/// What a day's field means, in the legend and the table.
struct Field {
  std::string_view name;
  int (*value)(const TraceDay&);
};

constexpr std::array<Field, 5> kFields = {{
    {"demand (customers)", [](const TraceDay& d) { return d.demand; }},
    {"delivered", [](const TraceDay& d) { return d.delivered; }},
    {"sold", [](const TraceDay& d) { return d.sold; }},
    {"left at close", [](const TraceDay& d) { return d.leftover; }},
    {"wasted/salvaged/donated", [](const TraceDay& d) { return d.unsold_out(); }},
}};

std::string days_span(const PolicyTrace& t) {
  return fmt::format("days 0 to {}", t.days.empty() ? 0 : t.days.size() - 1);
}

constexpr std::size_t kLeftover = 3;
constexpr std::size_t kUnsold = 4;

/// True when every unit left at close left the shelf that evening (a shelf life of one day):
/// the two lines would lie on each other, so the chart draws one.
bool leftover_leaves(const PolicyTrace& t) {
  return std::all_of(t.days.begin(), t.days.end(),
                     [](const TraceDay& d) { return d.leftover == d.unsold_out(); });
}

std::string chart(const DailyTrace& trace, const PolicyTrace& t) {
  LineChart c;
  c.title = fmt::format("{}: {} at {}, {}", t.policy, trace.item, trace.store, days_span(t));
  c.x_label = "day of the run";
  c.y_label = "units";
  for (std::size_t d = 0; d < t.days.size(); ++d) c.x.push_back(static_cast<double>(d));
  const bool merged = leftover_leaves(t);
  for (std::size_t i = 0; i < kFields.size(); ++i) {
    if (merged && i == kLeftover) continue;
    LineSeries s{merged && i == kUnsold ? "left at close = wasted/salvaged/donated"
                                        : std::string(kFields[i].name),
                 {}};
    for (const TraceDay& d : t.days) s.y.push_back(kFields[i].value(d));
    c.series.push_back(std::move(s));
  }
  if (trace.warmup_days > 0 && static_cast<std::size_t>(trace.warmup_days) < t.days.size()) {
    c.marker_x = trace.warmup_days;
    c.marker_label = fmt::format("scored from day {}", trace.warmup_days);
  }
  return svg_line_chart(c);
}

/// The day's flows summed (stock left at close is a level, not a flow, so it is not summed).
std::string totals(const PolicyTrace& t) {
  std::string out = fmt::format("Totals over {}:", days_span(t));
  const char* separator = " ";
  for (std::size_t i = 0; i < kFields.size(); ++i) {
    if (i == kLeftover) continue;
    long long sum = 0;
    for (const TraceDay& d : t.days) sum += kFields[i].value(d);
    out += fmt::format("{}{} {}", separator, kFields[i].name,
                       format_number(static_cast<double>(sum), 0));
    separator = "; ";
  }
  out += ".";
  if (leftover_leaves(t)) {
    out += " Every unit left at close leaves the shelf that evening, so one line shows both.";
  }
  return out;
}

std::string day_table(const PolicyTrace& t) {
  HtmlTable table(fmt::format("{}: the days (units)", t.policy));
  table.header({"day", "open", "demand", "delivered", "sold", "left at close", "wasted", "salvaged",
                "donated"});
  for (std::size_t d = 0; d < t.days.size(); ++d) {
    const TraceDay& x = t.days[d];
    const auto n = [](int v) { return HtmlCell{std::to_string(v), "num"}; };
    table.row({{std::to_string(d), {}, true},
               {x.open ? "yes" : "closed"},
               n(x.demand),
               n(x.delivered),
               n(x.sold),
               n(x.leftover),
               n(x.wasted),
               n(x.salvaged),
               n(x.donated)});
  }
  return table.str();
}

std::string left_out_note(const DailyTrace& trace) {
  if (trace.left_out.empty()) return {};
  std::string names;
  for (const std::string& n : trace.left_out) names += (names.empty() ? "" : ", ") + n;
  return html_paragraph(
      fmt::format("Not shown: {}. A network-planned policy sets its levels from the forecasts of "
                  "every store, so it cannot be followed in one store on its own.",
                  names),
      "note");
}

}  // namespace

std::string html_trace_section(const DailyTrace& trace) {
  if (trace.traces.empty() && trace.left_out.empty()) return {};
  std::string content = html_paragraph(fmt::format(
      "One store-item followed day by day: replication {}, store {}, item {} (the item with the "
      "largest base demand), under every policy on the same customers. Days before day {} are "
      "the warm-up, simulated but not scored. Units left at close stay on the shelf while they "
      "are within their shelf life.",
      trace.replication, trace.store, trace.item, trace.warmup_days));
  for (const PolicyTrace& t : trace.traces) {
    content += html_figure(chart(trace, t), totals(t));
    content += html_details(fmt::format("{}: the days as a table", t.policy), day_table(t), false);
  }
  content += left_out_note(trace);
  return html_section("daily", "A sample store-item, day by day", content);
}

}  // namespace larder
