#include "policies/quantity/rule_warnings.hpp"

#include <fmt/format.h>

#include "policies/quantity/chain_ratio.hpp"

namespace larder {

std::vector<std::string> rule_warnings(const Scenario& sc) {
  std::vector<std::string> out;
  for (size_t k = 0; k < sc.policies.size(); ++k) {
    const PolicySpec& p = sc.policies[k];
    if (p.quantity.method != "base_stock") continue;
    for (const Item& item : sc.items_of(static_cast<int>(k))) {
      if (!item.next_day) continue;
      out.push_back(fmt::format(
          "{}: warning: policy '{}': base_stock's level does not net item '{}''s next-day "
          "discounted units, which take some of its full-price customers; critical_fractile or "
          "order_up_to net them",
          sc.file, p.name, item.id));
    }
  }
  // One line per item for the rules whose recovery value is approximated there (each policy
  // sees the items as it handles their leftovers).
  std::vector<std::string> names(sc.items.size());
  for (size_t k = 0; k < sc.policies.size(); ++k) {
    const PolicySpec& p = sc.policies[k];
    const std::string& rule = p.quantity.method;
    if (rule != "critical_fractile" && rule != "pull_to_center") continue;
    Scenario own;
    const Scenario* seen = &sc;
    if (!p.items.empty()) {
      own = sc;
      own.items = p.items;
      seen = &own;
    }
    for (size_t i = 0; i < seen->items.size(); ++i) {
      const Item& item = seen->items[i];
      if (plain_newsvendor(*seen, item) ||
          typical_chain(*seen, static_cast<int>(i), item.stockout_penalty, item.demand.family)) {
        continue;
      }
      names[i] += fmt::format("{}'{}'", names[i].empty() ? "" : ", ", p.name);
    }
  }
  for (size_t i = 0; i < sc.items.size(); ++i) {
    if (names[i].empty()) continue;
    out.push_back(fmt::format(
        "{}: warning: item '{}': the leftover recovery value of policies {} is approximated "
        "(its exact chain is too large, or it has an evening markdown or deliveries that are "
        "not daily); compare with order_up_to at a few levels",
        sc.file, sc.items[i].id, names[i]));
  }
  return out;
}

}  // namespace larder
