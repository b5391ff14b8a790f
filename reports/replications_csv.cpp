#include "reports/replications_csv.hpp"

#include "reports/csv.hpp"

namespace larder {

std::string replications_csv(const RunResult& result) {
  std::string out = "policy,replication";
  for (Metric m : result.metrics) {
    out += ',';
    out += csv_field(metric_name(m));
  }
  out += '\n';
  for (size_t p = 0; p < result.policies.size(); ++p) {
    const std::string policy = csv_field(result.policies[p]);
    const auto& rows = result.values.at(p);
    for (size_t r = 0; r < rows.size(); ++r) {
      out += policy;
      out += ',';
      out += std::to_string(r);
      for (Metric m : result.metrics) {
        out += ',';
        out += csv_number(at(rows[r], m));
      }
      out += '\n';
    }
  }
  return out;
}

}  // namespace larder
