#include "reports/comparison.hpp"

#include <fmt/format.h>

#include <cmath>
#include <limits>

namespace larder {

Estimate report_estimate(std::span<const double> values) {
  return without_interval_below_two(estimate_mean(values, kReportLevel));
}

Estimate without_interval_below_two(Estimate e) {
  if (e.n < 2) {
    e.stderr_ = e.ci_low = e.ci_high = std::numeric_limits<double>::quiet_NaN();
  }
  return e;
}

Estimate policy_estimate(const RunResult& result, int policy, Metric m) {
  const std::vector<double> values = result.series(policy, m);
  return report_estimate(values);
}

Estimate paired_difference(const RunResult& result, int a, int b, Metric m) {
  return without_interval_below_two(
      estimate_paired_difference(result.series(a, m), result.series(b, m), kReportLevel));
}

Estimate baseline_difference(const RunResult& result, int policy, Metric m) {
  return paired_difference(result, policy, result.baseline, m);
}

bool is_significant(const Estimate& difference) {
  return difference.n >= 2 && (difference.ci_low > 0.0 || difference.ci_high < 0.0);
}

std::string verdict(Metric m, const Estimate& difference) {
  return verdict(m, difference, metric_name(m));
}

std::string verdict(Metric m, const Estimate& difference, std::string_view name) {
  if (difference.n < 2 || !std::isfinite(difference.mean) || !std::isfinite(difference.ci_low) ||
      !std::isfinite(difference.ci_high)) {
    return "not available";
  }
  if (!is_significant(difference)) return "no significant difference";
  const bool higher = difference.mean > 0.0;
  const std::string_view direction = higher ? "higher" : "lower";
  const int better = metric_info(m).better;
  if (better == 0) return fmt::format("{} {} (significant)", direction, name);
  const bool good = (better > 0) == higher;
  return fmt::format("{}: {} {} (significant)", good ? "better" : "worse", direction, name);
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
  return report_estimate(v);
}

std::vector<PlanGroupRow> plan_group_rows(const RunResult& result, std::size_t policy) {
  const PolicyBreakdown& b = result.breakdown[policy];
  std::vector<PlanGroupRow> rows;
  if (b.planned_level.empty()) return rows;
  const auto column = [](const std::vector<std::vector<double>>& per_rep, size_t g) {
    std::vector<double> v(per_rep.size());
    for (size_t r = 0; r < v.size(); ++r) v[r] = per_rep[r][g];
    return report_estimate(v);
  };
  for (size_t k = b.first_group; k < b.keys.size(); ++k) {
    const size_t g = k - b.first_group;
    rows.push_back({b.keys[k].key, column(b.planned_level, g), column(b.planned_in_stock, g),
                    breakdown_estimate(b, k, Metric::in_stock_at_close)});
  }
  return rows;
}

std::optional<TargetCheck> target_check(const RunResult& result, std::size_t policy) {
  if (policy >= result.breakdown.size()) return std::nullopt;
  const double target = result.breakdown[policy].network_target;
  if (!std::isfinite(target)) return std::nullopt;
  return TargetCheck{target,
                     policy_estimate(result, static_cast<int>(policy), Metric::in_stock_at_close)};
}

std::string target_text(const TargetCheck& check) {
  const double points = check.points();
  return fmt::format("target {}% -> achieved {:.1f}% ({}{:.1f} points)",
                     fmt::format("{:.4g}", 100.0 * check.target), 100.0 * check.achieved.mean,
                     points >= 0.0 ? "+" : "-", std::abs(points));
}

std::vector<std::string> target_warnings(const RunResult& result) {
  std::vector<std::string> out;
  for (size_t p = 0; p < result.breakdown.size(); ++p) {
    const std::optional<TargetCheck> check = target_check(result, p);
    if (!check || !check->missed()) continue;
    out.push_back(fmt::format(
        "warning: {} misses its network in-stock target: {}, beyond its 95% interval ({:.1f}% to "
        "{:.1f}%). "
        "The plans calibrate themselves on what the stores see at their closes; a short horizon, "
        "few re-plans or a long warm-up leave them less to learn from (README, \"Network plans "
        "for items that keep\").",
        result.policies[p], target_text(*check), 100.0 * check->achieved.ci_low,
        100.0 * check->achieved.ci_high));
  }
  return out;
}

}  // namespace larder
