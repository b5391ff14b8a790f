#include "sim/scenario/scenario_warnings.hpp"

#include <fmt/format.h>

namespace larder {

std::vector<std::string> scenario_warnings(const Scenario& scenario) {
  std::vector<std::string> out;
  for (std::size_t i = 0; i < scenario.items.size(); ++i) {
    const Item& item = scenario.items[i];
    if (item.price < item.unit_cost) {
      out.push_back(fmt::format(
          "{}: warning: items[{}] '{}': price {} is below unit_cost {}: every unit sold loses "
          "money, so profit-seeking rules (critical_fractile) order nothing",
          scenario.file, i, item.id, item.price, item.unit_cost));
    }
  }
  return out;
}

}  // namespace larder
