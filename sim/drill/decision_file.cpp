#include "sim/drill/decision_file.hpp"

#include <fmt/format.h>

namespace larder {

std::string decisions_csv(const DrillGame& game, const DrillDecisions& decided) {
  const Scenario& s = game.scenario();
  const DrillSpec& sp = game.spec();
  const int lead = s.logistics.lead_time_days;
  const std::string& store = s.stores[static_cast<size_t>(sp.store)].id;
  std::string out = "day,store,item,quantity\n";
  const auto row = [&](int day, int item, int quantity) {
    out +=
        fmt::format("{},{},{},{}\n", day, store, s.items[static_cast<size_t>(item)].id, quantity);
  };
  for (int d = -lead; d + lead < game.first_day(); ++d) {
    const int a = d + lead;
    if (!s.is_open(sp.store, a) ||
        !s.logistics.delivery_weekdays[static_cast<size_t>(s.weekday_of(a))]) {
      continue;
    }
    for (const int i : sp.items) row(d, i, game.house_order(d, i));
  }
  const auto turns = game.turns();
  for (size_t j = 0; j < turns.size() && j < decided.size(); ++j) {
    for (size_t k = 0; k < sp.items.size() && k < decided[j].size(); ++k) {
      row(turns[j].order_day, sp.items[k], decided[j][k]);
    }
  }
  return out;
}

}  // namespace larder
