#include "reports/pairs_csv.hpp"

#include <fmt/format.h>

#include "reports/comparison.hpp"
#include "reports/csv.hpp"

namespace larder {

std::string pairs_csv(const RunResult& result) {
  const int n = static_cast<int>(result.policies.size());
  if (n < 2) return {};
  std::string out = "policy,versus,metric,difference,stderr,ci_low,ci_high,replications,verdict\n";
  for (int a = 1; a < n; ++a) {
    for (int b = 0; b < a; ++b) {
      for (Metric m : result.metrics) {
        const Estimate d = paired_difference(result, a, b, m);
        out += fmt::format(
            "{},{},{},{},{},{},{},{},{}\n", csv_field(result.policies[static_cast<size_t>(a)]),
            csv_field(result.policies[static_cast<size_t>(b)]), csv_field(metric_name(m)),
            csv_number(d.mean), csv_number(d.stderr_), csv_number(d.ci_low), csv_number(d.ci_high),
            d.n, csv_field(verdict(m, d)));
      }
    }
  }
  return out;
}

}  // namespace larder
