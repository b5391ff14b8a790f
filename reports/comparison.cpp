#include "reports/comparison.hpp"

#include <fmt/format.h>

#include <cmath>

namespace larder {

Estimate policy_estimate(const RunResult& result, int policy, Metric m) {
  const std::vector<double> values = result.series(policy, m);
  return estimate_mean(values, kReportLevel);
}

Estimate baseline_difference(const RunResult& result, int policy, Metric m) {
  const std::vector<double> a = result.series(policy, m);
  const std::vector<double> b = result.series(result.baseline, m);
  return estimate_paired_difference(a, b, kReportLevel);
}

bool is_significant(const Estimate& difference) {
  return difference.n >= 2 && (difference.ci_low > 0.0 || difference.ci_high < 0.0);
}

std::string verdict(Metric m, const Estimate& difference) {
  if (difference.n < 2 || !std::isfinite(difference.mean) || !std::isfinite(difference.ci_low) ||
      !std::isfinite(difference.ci_high)) {
    return "not available";
  }
  if (!is_significant(difference)) return "no significant difference";
  const bool higher = difference.mean > 0.0;
  const std::string_view direction = higher ? "higher" : "lower";
  const int better = metric_info(m).better;
  if (better == 0) return fmt::format("{} {} (significant)", direction, metric_name(m));
  const bool good = (better > 0) == higher;
  return fmt::format("{}: {} {} (significant)", good ? "better" : "worse", direction,
                     metric_name(m));
}

VerdictTone verdict_tone(Metric m, const Estimate& difference) {
  if (!is_significant(difference) || !std::isfinite(difference.mean)) return VerdictTone::none;
  const int better = metric_info(m).better;
  if (better == 0) return VerdictTone::neutral;
  return (better > 0) == (difference.mean > 0.0) ? VerdictTone::better : VerdictTone::worse;
}

std::string difference_title(const RunResult& result, int policy) {
  return fmt::format("{}: difference vs {} (paired, 95% CI)",
                     result.policies[static_cast<size_t>(policy)],
                     result.policies[static_cast<size_t>(result.baseline)]);
}

Estimate breakdown_estimate(const PolicyBreakdown& breakdown, std::size_t key, Metric m) {
  std::vector<double> v(breakdown.values.size());
  for (size_t r = 0; r < v.size(); ++r) v[r] = at(breakdown.values[r][key], m);
  return estimate_mean(v, kReportLevel);
}

std::vector<PlanGroupRow> plan_group_rows(const RunResult& result, std::size_t policy) {
  const PolicyBreakdown& b = result.breakdown[policy];
  std::vector<PlanGroupRow> rows;
  if (b.planned_level.empty()) return rows;
  const auto column = [](const std::vector<std::vector<double>>& per_rep, size_t g) {
    std::vector<double> v(per_rep.size());
    for (size_t r = 0; r < v.size(); ++r) v[r] = per_rep[r][g];
    return estimate_mean(v, kReportLevel);
  };
  for (size_t k = b.first_group; k < b.keys.size(); ++k) {
    const size_t g = k - b.first_group;
    rows.push_back({b.keys[k].key, column(b.planned_level, g), column(b.planned_in_stock, g),
                    breakdown_estimate(b, k, Metric::in_stock_at_close)});
  }
  return rows;
}

}  // namespace larder
