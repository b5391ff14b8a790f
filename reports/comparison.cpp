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

}  // namespace larder
