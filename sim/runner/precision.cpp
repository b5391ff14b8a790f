#include "sim/runner/precision.hpp"

#include <algorithm>
#include <cmath>

#include "sim/stats/summary.hpp"

namespace larder {

std::optional<PrecisionTarget> parse_precision(const std::string& text) {
  PrecisionTarget t;
  std::string rest = text;
  const std::string prefix = "difference:";
  if (rest.rfind(prefix, 0) == 0) {
    t.difference = true;
    rest = rest.substr(prefix.size());
  }
  const size_t eq = rest.find('=');
  if (eq == std::string::npos) return std::nullopt;
  const std::string name = rest.substr(0, eq);
  std::string value = rest.substr(eq + 1);
  bool found = false;
  for (size_t k = 0; k < kMetricCount; ++k) {
    if (metric_name(static_cast<Metric>(k)) == name) {
      t.metric = static_cast<Metric>(k);
      found = true;
    }
  }
  if (!found || value.empty()) return std::nullopt;
  if (value.back() == '%') {
    t.relative = true;
    value.pop_back();
  }
  try {
    size_t used = 0;
    t.half_width = std::stod(value, &used) / (t.relative ? 100.0 : 1.0);
    if (used != value.size() || !(t.half_width > 0.0) || !std::isfinite(t.half_width)) {
      return std::nullopt;
    }
  } catch (const std::exception&) {
    return std::nullopt;
  }
  return t;
}

double precision_ratio(const RunResult& result, const PrecisionTarget& target) {
  double worst = 0.0;
  const auto base = result.series(result.baseline, target.metric);
  for (size_t p = 0; p < result.policies.size(); ++p) {
    const int k = static_cast<int>(p);
    if (target.difference && k == result.baseline) continue;
    const auto own = result.series(k, target.metric);
    const Estimate e =
        target.difference ? estimate_paired_difference(own, base) : estimate_mean(own);
    if (e.n < 2) return std::numeric_limits<double>::infinity();
    const double half = e.ci_high - e.mean;
    const double allowed =
        target.relative ? target.half_width * std::fabs(e.mean) : target.half_width;
    worst = std::max(worst, allowed > 0.0
                                ? half / allowed
                                : (half > 0.0 ? std::numeric_limits<double>::infinity() : 0.0));
  }
  return worst;
}

RunResult run_to_precision(const Scenario& scenario, const std::vector<Policy>& policies,
                           RunOptions options, const PrecisionTarget& target,
                           int max_replications) {
  int n = std::min(std::max(scenario.replications, 2), max_replications);
  options.first_replication = 0;
  options.replications = n;
  RunResult result = run_policies(scenario, policies, options);
  while (result.info.replications < max_replications &&
         (options.stop == nullptr || !options.stop->load())) {
    const double ratio = precision_ratio(result, target);
    if (ratio <= 1.0) break;
    // The half-width shrinks like 1 / sqrt(n): aim a little past the estimate.
    const int have = result.info.replications;
    const double want = std::isfinite(ratio) ? 1.1 * have * ratio * ratio : 2.0 * have;
    // Capped in floating point first: a huge ratio must not overflow the conversion to int.
    const int target_n =
        static_cast<int>(std::ceil(std::min(want, static_cast<double>(max_replications))));
    // At least a tenth more, never past the maximum (which wins when the two disagree).
    const int more =
        std::min(std::max(target_n - have, std::max(1, have / 10)), max_replications - have);
    options.first_replication = have;
    options.replications = more;
    result.append(run_policies(scenario, policies, options));
  }
  return result;
}

}  // namespace larder
