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

namespace larder {

std::vector<std::string> setting_warnings(const Scenario& scenario) {
  std::vector<std::string> out;
  const std::string& file = scenario.file;
  for (std::size_t i = 0; i < scenario.items.size(); ++i) {
    const Item& item = scenario.items[i];
    if (item.shelf_capacity && *item.shelf_capacity < item.pack_size) {
      out.push_back(fmt::format(
          "{}: warning: items[{}] '{}': shelf_capacity {} is below pack_size {}: no pack fits on "
          "the shelf, so the item is never delivered",
          file, i, item.id, *item.shelf_capacity, item.pack_size));
    }
    if (item.demand.cv && *item.demand.cv > 5.0) {
      out.push_back(fmt::format(
          "{}: warning: items[{}] '{}': cv {} is a spread of {:.0f} times the mean; cv is a "
          "ratio (0.38 for 38%), not a percentage",
          file, i, item.id, *item.demand.cv, *item.demand.cv));
    }
  }
  if (scenario.logistics.lead_time_days >= scenario.horizon.days) {
    out.push_back(fmt::format(
        "{}: warning: logistics.lead_time_days {} is not shorter than the horizon of {} days: "
        "no order arrives before the end",
        file, scenario.logistics.lead_time_days, scenario.horizon.days));
  }
  for (std::size_t s = 0; s < scenario.stores.size(); ++s) {
    bool any_open = false;
    for (int t = scenario.horizon.warmup_days; t < scenario.horizon.days && !any_open; ++t) {
      any_open = scenario.is_open(static_cast<int>(s), t);
    }
    if (!any_open) {
      out.push_back(fmt::format(
          "{}: warning: stores[{}] '{}' is closed on every scored day: its results are all "
          "zero (check its open_weekdays and closures)",
          file, s, scenario.stores[s].id));
      if (out.size() > 50) break;  // a generated network: a few lines say enough
    }
  }
  return out;
}

}  // namespace larder
