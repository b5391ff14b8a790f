#include "reports/substitution_csv.hpp"

#include <fmt/format.h>

#include "reports/comparison.hpp"
#include "reports/csv.hpp"
#include "sim/stats/summary.hpp"

namespace larder {

std::string substitution_csv(const RunResult& result) {
  if (result.substitution_pairs.empty()) return {};
  std::string out = "policy,from_item,to_item,mean,stderr,ci_low,ci_high,replications\n";
  for (size_t p = 0; p < result.policies.size(); ++p) {
    const auto& reps = result.substituted[p];
    for (size_t k = 0; k < result.substitution_pairs.size(); ++k) {
      std::vector<double> v;
      v.reserve(reps.size());
      for (const auto& row : reps) v.push_back(row[k]);
      const Estimate e = report_estimate(v);
      const SubstitutionPair& pair = result.substitution_pairs[k];
      out += fmt::format("{},{},{},{},{},{},{},{}\n", csv_field(result.policies[p]),
                         csv_field(pair.from), csv_field(pair.to), csv_number(e.mean),
                         csv_number(e.stderr_), csv_number(e.ci_low), csv_number(e.ci_high), e.n);
    }
  }
  return out;
}

}  // namespace larder
