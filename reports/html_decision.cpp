#include "reports/html_decision.hpp"

#include <fmt/format.h>

#include <algorithm>

#include "reports/comparison.hpp"
#include "reports/decision.hpp"
#include "reports/html_page.hpp"
#include "reports/metric_label.hpp"
#include "reports/number_format.hpp"
#include "reports/svg_chart.hpp"
#include "reports/xml_text.hpp"

namespace larder {

namespace {

bool reports(const RunResult& r, Metric m) {
  return std::find(r.metrics.begin(), r.metrics.end(), m) != r.metrics.end();
}

/// A number cell's classes: right-aligned, coloured by its verdict.
std::string_view tone_class(const AnnualChange& c, Metric m) {
  if (!c.available) return "num none";
  switch (verdict_tone(m, c.difference)) {
    case VerdictTone::better:
      return "num better";
    case VerdictTone::worse:
      return "num worse";
    case VerdictTone::neutral:
      return "num neutral";
    default:
      return "num none";
  }
}

/// "-4.10 (-5.00 to -3.20)": the change and its interval, signed.
HtmlCell change_cell(const AnnualChange& c, Metric m, bool money) {
  if (!c.available) return {"n/a", "num none"};
  return {decision_change(c.difference, money), tone_class(c, m)};
}

std::string changes_table(const RunResult& r, const std::vector<DecisionRow>& rows) {
  const std::string& baseline = r.policies[static_cast<std::size_t>(r.baseline)];
  const bool tonnes = !rows.empty() && rows.front().waste_in_tonnes;
  const bool co2e = !rows.empty() && rows.front().co2e.available;
  HtmlTable table(fmt::format(
      "Change per year against {} (paired difference, and its 95% confidence interval)", baseline));
  std::vector<std::string> header = {"policy",
                                     tonnes ? "Waste (t a year)" : "Waste (units a year)"};
  if (co2e) header.push_back("Waste (t CO2e a year)");
  header.push_back("Customers lost (a year)");
  header.push_back(fmt::format("Profit ({} a year)", metric_unit(Metric::profit, r.info.currency)));
  table.header(header);
  for (const DecisionRow& row : rows) {
    std::vector<HtmlCell> cells = {
        {row.policy, {}, true},
        change_cell(row.waste, tonnes ? Metric::waste_kg : Metric::waste_units, false)};
    if (co2e) cells.push_back(change_cell(row.co2e, Metric::co2e_kg, false));
    cells.push_back(change_cell(row.lost, Metric::lost_units, false));
    cells.push_back(change_cell(row.profit, Metric::profit, true));
    table.row(cells);
  }
  return table.str();
}

/// Each policy's CO2e per year (or waste) against its fill rate, the baseline ringed.
std::string trade_off_chart(const RunResult& r) {
  const double year = annual_factor(r.info);
  Metric y_metric = Metric::waste_units;
  double y_scale = year;
  std::string y_label = "Waste (units a year)";
  if (reports(r, Metric::co2e_kg)) {
    y_metric = Metric::co2e_kg;
    y_scale = year / 1000.0;
    y_label = "Waste (t CO2e a year)";
  } else if (reports(r, Metric::waste_kg)) {
    y_metric = Metric::waste_kg;
    y_scale = year / 1000.0;
    y_label = "Waste (t a year)";
  }
  SeriesChart chart;
  chart.width = 760;
  chart.connect = false;
  chart.title = fmt::format("{} against fill rate", y_label);
  chart.x_label = metric_label(Metric::fill_rate, r.info.currency);
  chart.y_label = y_label;
  for (std::size_t p = 0; p < r.policies.size(); ++p) {
    const int k = static_cast<int>(p);
    const Estimate x = policy_estimate(r, k, Metric::fill_rate);
    const Estimate y = scaled(policy_estimate(r, k, y_metric), y_scale);
    const bool baseline = k == r.baseline;
    const std::string name = baseline ? r.policies[p] + " (baseline)" : r.policies[p];
    chart.series.push_back(
        {name, {{100.0 * x.mean, 100.0 * half_width(x), y.mean, half_width(y), name, baseline}}});
  }
  return html_figure(
      svg_series_chart(chart),
      fmt::format("Each policy's waste per year ({}) against its fill rate (the "
                  "share of demand served by the item), with 95% confidence "
                  "intervals both ways; the baseline is ringed. Down and to the "
                  "right is better.",
                  y_label.substr(y_label.find('(') + 1, y_label.size() - y_label.find('(') - 2)));
}

}  // namespace

std::string html_decision_section(const RunResult& result) {
  if (result.policies.size() < 2) return {};
  const std::vector<DecisionRow> rows = decision_rows(result);
  const RunInfo& i = result.info;
  std::string content = html_paragraph(fmt::format(
      "Each policy against the baseline, {}, per year: the sums over the {} scored days (the "
      "days after a warm-up of {}, days a store is closed included) times 365 / {}. Paired "
      "differences: every policy met the same customers. A change is stated only when its 95% "
      "confidence interval excludes zero.",
      result.policies[static_cast<std::size_t>(result.baseline)], scored_days(i), i.warmup_days,
      scored_days(i)));
  content += "<ul class=\"sentences\">\n";
  for (const DecisionRow& row : rows) {
    content += "<li>" + xml_escape(decision_sentence(row, i.currency)) + "</li>\n";
  }
  content += "</ul>\n";
  content += changes_table(result, rows);
  if (reports(result, Metric::fill_rate)) content += trade_off_chart(result);
  return html_section("decision", "Decision summary", content);
}

}  // namespace larder
