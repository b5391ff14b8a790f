#include "sim/runner/run_result.hpp"

namespace larder {

std::vector<double> RunResult::series(int policy, Metric m) const {
  std::vector<double> out;
  const auto& rows = values[static_cast<size_t>(policy)];
  out.reserve(rows.size());
  for (const auto& r : rows) out.push_back(at(r, m));
  return out;
}

}  // namespace larder
