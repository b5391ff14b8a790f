#include "reports/breakdown_csv.hpp"

#include <fmt/format.h>

#include "reports/comparison.hpp"
#include "reports/csv.hpp"
#include "sim/stats/summary.hpp"

namespace larder {

namespace {

std::string row(const std::string& policy, const BreakdownKey& k, std::string_view metric,
                const std::vector<double>& v) {
  const Estimate e = report_estimate(v);
  return fmt::format("{},{},{},{},{},{}\n", policy, csv_field(k.dimension), csv_field(k.key),
                     metric, csv_number(e.mean), csv_number(e.stderr_));
}

}  // namespace

std::string breakdown_csv(const RunResult& result) {
  std::string out = "policy,dimension,key,metric,mean,stderr\n";
  for (size_t p = 0; p < result.breakdown.size(); ++p) {
    const PolicyBreakdown& b = result.breakdown[p];
    const std::string policy = csv_field(result.policies[p]);
    std::vector<double> v(b.values.size());
    for (size_t k = 0; k < b.keys.size(); ++k) {
      for (Metric m : result.metrics) {
        for (size_t r = 0; r < b.values.size(); ++r) v[r] = at(b.values[r][k], m);
        out += row(policy, b.keys[k], metric_name(m), v);
      }
      if (b.planned_level.empty() || k < b.first_group) continue;
      const size_t g = k - b.first_group;
      std::vector<double> planned(b.planned_level.size());
      for (size_t r = 0; r < planned.size(); ++r) planned[r] = b.planned_level[r][g];
      out += row(policy, b.keys[k], "planned_level", planned);
      for (size_t r = 0; r < planned.size(); ++r) planned[r] = b.planned_in_stock[r][g];
      out += row(policy, b.keys[k], "planned_in_stock", planned);
    }
  }
  return out;
}

}  // namespace larder
