#include "sim/drill/drill_turns.hpp"

#include "sim/scenario/scenario.hpp"

namespace larder {

std::vector<DrillTurn> drill_turns(const Scenario& s) {
  const int store = s.drill->store;
  const int lead = s.logistics.lead_time_days;
  const int warmup = s.horizon.warmup_days;
  std::vector<DrillTurn> turns;
  for (int a = warmup; a < s.horizon.days; ++a) {
    const bool delivery =
        s.is_open(store, a) && s.logistics.delivery_weekdays[static_cast<size_t>(s.weekday_of(a))];
    if (delivery) turns.push_back({a - lead, a, a - warmup + 1});
  }
  return turns;
}

}  // namespace larder
