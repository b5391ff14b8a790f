#include "sim/runner/run_result.hpp"

namespace larder {

std::vector<double> RunResult::series(int policy, Metric m) const {
  std::vector<double> out;
  const auto& rows = values[static_cast<size_t>(policy)];
  out.reserve(rows.size());
  for (const auto& r : rows) out.push_back(at(r, m));
  return out;
}

void RunResult::append(RunResult&& more) {
  const auto move_rows = [](auto& into, auto& from) {
    into.insert(into.end(), std::make_move_iterator(from.begin()),
                std::make_move_iterator(from.end()));
  };
  for (size_t p = 0; p < values.size(); ++p) {
    move_rows(values[p], more.values[p]);
    if (p < substituted.size()) move_rows(substituted[p], more.substituted[p]);
    if (p < breakdown.size()) {
      move_rows(breakdown[p].values, more.breakdown[p].values);
      move_rows(breakdown[p].planned_level, more.breakdown[p].planned_level);
      move_rows(breakdown[p].planned_in_stock, more.breakdown[p].planned_in_stock);
    }
  }
  info.replications += more.info.replications;
  info.seconds += more.info.seconds;
}

}  // namespace larder
