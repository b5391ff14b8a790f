#include "reports/html_breakdown.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <map>
#include <utility>

#include "reports/comparison.hpp"
#include "reports/html_page.hpp"
#include "reports/metric_label.hpp"
#include "reports/number_format.hpp"
#include "reports/xml_text.hpp"

namespace larder {

namespace {

constexpr std::array kBreakdownMetrics = {Metric::waste_units, Metric::waste_share,
                                          Metric::in_stock_at_close, Metric::fill_rate,
                                          Metric::profit};
constexpr std::size_t kOpenRows = 12;
constexpr std::string_view kPlanGroup = "plan_group";

using KeyIndex = std::map<std::pair<std::string, std::string>, std::size_t>;

KeyIndex index_keys(const PolicyBreakdown& b) {
  KeyIndex out;
  for (std::size_t k = 0; k < b.keys.size(); ++k) out[{b.keys[k].dimension, b.keys[k].key}] = k;
  return out;
}

/// The dimensions of the first policy's breakdown in order, each with its values in order
/// (plan groups excluded: they differ by policy and have their own section).
std::vector<std::pair<std::string, std::vector<std::string>>> dimensions(const RunResult& r) {
  std::vector<std::pair<std::string, std::vector<std::string>>> out;
  for (const BreakdownKey& k : r.breakdown.front().keys) {
    if (k.dimension == kPlanGroup) continue;
    if (out.empty() || out.back().first != k.dimension) out.push_back({k.dimension, {}});
    out.back().second.push_back(k.key);
  }
  return out;
}

std::string dimension_label(const std::string& dimension) {
  if (dimension == "store" || dimension == "item") return fmt::format("By {}", dimension);
  return fmt::format("By item attribute \"{}\"", dimension);
}

/// One metric by the values of one dimension: a row per value, a column per policy.
std::string metric_table(const RunResult& r, const std::vector<KeyIndex>& index,
                         const std::string& dimension, const std::vector<std::string>& values,
                         Metric m) {
  const std::string_view unit = metric_info(m).unit;
  HtmlTable table(
      fmt::format("{} by {} ({})", metric_label(m, r.info.currency), dimension, kEstimateCaption));
  std::vector<std::string> header = {dimension};
  header.insert(header.end(), r.policies.begin(), r.policies.end());
  table.header(header);
  for (const std::string& value : values) {
    std::vector<Estimate> est(r.policies.size());
    int decimals = 0;
    for (std::size_t p = 0; p < r.policies.size(); ++p) {
      const auto it = index[p].find({dimension, value});
      if (it == index[p].end()) continue;
      est[p] = breakdown_estimate(r.breakdown[p], it->second, m);
      decimals = std::max(decimals, estimate_decimals(half_width(est[p]), unit));
    }
    std::vector<HtmlCell> row = {{value, {}, true}};
    for (std::size_t p = 0; p < r.policies.size(); ++p) {
      const bool has = index[p].count({dimension, value}) > 0;
      row.push_back(
          {has ? format_estimate(est[p].mean, half_width(est[p]), unit, decimals) : "n/a", "num"});
    }
    table.row(row);
  }
  return table.str();
}

std::string plan_group_table(const RunResult& r, std::size_t policy,
                             const std::vector<PlanGroupRow>& rows) {
  HtmlTable table(fmt::format("{}: plan groups, % ({})", r.policies[policy], kEstimateCaption));
  table.header({"group", "planned level", "expected in stock", "in stock at close"});
  const auto pct = [](const Estimate& e) {
    return HtmlCell{format_estimate(e.mean, half_width(e), "share"), "num"};
  };
  for (const PlanGroupRow& row : rows) {
    table.row({{row.group, {}, true},
               pct(row.planned_level),
               pct(row.planned_in_stock),
               pct(row.in_stock_at_close)});
  }
  return table.str();
}

}  // namespace

std::string html_breakdown_section(const RunResult& result) {
  if (result.breakdown.size() != result.policies.size() || result.breakdown.empty() ||
      result.breakdown.front().values.empty()) {
    return {};
  }
  std::vector<KeyIndex> index;
  for (const PolicyBreakdown& b : result.breakdown) index.push_back(index_keys(b));
  std::string content = html_paragraph(
      "The same numbers as breakdown.csv: each metric over the store-item-days of one store, "
      "one item or the items sharing an attribute value (shares are ratios of sums), as the "
      "mean over replications with the half-width of its 95% confidence interval.");
  for (const auto& [dimension, values] : dimensions(result)) {
    std::string tables;
    for (const Metric m : kBreakdownMetrics) {
      if (std::find(result.metrics.begin(), result.metrics.end(), m) == result.metrics.end()) {
        continue;
      }
      tables += metric_table(result, index, dimension, values, m);
    }
    content += html_details(fmt::format("{} ({} value{})", dimension_label(dimension),
                                        values.size(), values.size() == 1 ? "" : "s"),
                            tables, values.size() <= kOpenRows);
  }
  return html_section("breakdown", "Breakdowns by store, item and attribute", content);
}

std::string html_plan_group_section(const RunResult& result) {
  std::string content;
  for (std::size_t p = 0; p < result.breakdown.size() && p < result.policies.size(); ++p) {
    const std::vector<PlanGroupRow> rows = plan_group_rows(result, p);
    if (rows.empty()) continue;
    content += fmt::format("<h3>{}</h3>\n", xml_escape(result.policies[p]));
    if (const auto check = target_check(result, p)) {
      content += html_paragraph(
          check->missed()
              ? fmt::format("{}: missed beyond its 95% interval ({:.1f}% to {:.1f}%).",
                            target_text(*check), 100.0 * check->achieved.ci_low,
                            100.0 * check->achieved.ci_high)
              : fmt::format("{} (95% interval {:.1f}% to {:.1f}%).", target_text(*check),
                            100.0 * check->achieved.ci_low, 100.0 * check->achieved.ci_high));
    }
    content +=
        html_details(fmt::format("{} plan group{}", rows.size(), rows.size() == 1 ? "" : "s"),
                     plan_group_table(result, p, rows), rows.size() <= kOpenRows);
  }
  if (content.empty()) return {};
  return html_section(
      "plan-groups", "Network plans: planned against achieved",
      html_paragraph("For each plan group of a network_in_stock policy: the in-stock level its "
                     "plans set (mean over the plans made on scored days), the share of "
                     "store-item-days in stock at close those plans expected, and the share the "
                     "simulation achieved.") +
          content);
}

}  // namespace larder
