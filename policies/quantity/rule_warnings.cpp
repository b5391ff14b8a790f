#include "policies/quantity/rule_warnings.hpp"

#include <fmt/format.h>

#include "policies/quantity/chain_ratio.hpp"

namespace larder {

std::vector<std::string> rule_warnings(const Scenario& sc) {
  std::vector<std::string> out;
  for (const PolicySpec& p : sc.policies) {
    if (p.quantity.method != "base_stock") continue;
    for (const Item& item : sc.items) {
      if (!item.next_day) continue;
      out.push_back(fmt::format(
          "{}: warning: policy '{}': base_stock's level does not net item '{}''s next-day "
          "discounted units, which take some of its full-price customers; critical_fractile or "
          "order_up_to net them",
          sc.file, p.name, item.id));
    }
  }
  // One line per item for the rules whose recovery value is approximated there.
  for (size_t i = 0; i < sc.items.size(); ++i) {
    const Item& item = sc.items[i];
    if (plain_newsvendor(sc, item)) continue;
    std::string names;
    for (const PolicySpec& p : sc.policies) {
      const std::string& rule = p.quantity.method;
      if (rule != "critical_fractile" && rule != "pull_to_center") continue;
      names += fmt::format("{}'{}'", names.empty() ? "" : ", ", p.name);
    }
    if (names.empty() ||
        typical_chain(sc, static_cast<int>(i), item.stockout_penalty, item.demand.family)) {
      continue;
    }
    out.push_back(fmt::format(
        "{}: warning: item '{}': the leftover recovery value of policies {} is approximated "
        "(its exact chain is too large, or it has an evening markdown or deliveries that are "
        "not daily); compare with order_up_to at a few levels",
        sc.file, item.id, names));
  }
  return out;
}

}  // namespace larder
