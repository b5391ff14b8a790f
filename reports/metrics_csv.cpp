#include "reports/metrics_csv.hpp"

#include <fmt/format.h>

#include "reports/comparison.hpp"
#include "reports/csv.hpp"

namespace larder {

std::string metrics_csv(const RunResult& result) {
  std::string out = "policy,metric,mean,stderr,ci_low,ci_high,replications\n";
  const int n_policies = static_cast<int>(result.policies.size());
  for (int p = 0; p < n_policies; ++p) {
    const std::string policy = csv_field(result.policies[static_cast<size_t>(p)]);
    for (Metric m : result.metrics) {
      const Estimate e = policy_estimate(result, p, m);
      out += fmt::format("{},{},{},{},{},{},{}\n", policy, csv_field(metric_name(m)),
                         csv_number(e.mean), csv_number(e.stderr_), csv_number(e.ci_low),
                         csv_number(e.ci_high), e.n);
    }
  }
  return out;
}

}  // namespace larder
