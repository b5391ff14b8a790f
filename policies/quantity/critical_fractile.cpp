// `critical_fractile`: the newsvendor quantity, the smallest Q with
// P(D <= Q) >= (p - c + g) / (p - s + g) for price p, unit cost c, recovery s per leftover unit
// and stockout penalty g (Arrow, Harris and Marschak 1951; Nahmias, Production and Operations
// Analysis, the newsvendor chapter), D the demand of the protection period after the perishable
// inventory position (protection_period.hpp). s is what a leftover really brings: its salvage
// value for one-day items with daily deliveries, otherwise measured on the item's exact chain
// (chain_ratio.hpp), or approximated where the chain is too large.

#include "policies/quantity/critical_fractile.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <utility>

#include "policies/quantity/chain_ratio.hpp"
#include "policies/quantity/fractile_rule.hpp"
#include "policies/registry.hpp"

namespace larder {

double leftover_recovery(const Scenario& scenario, const Item& item, double penalty) {
  if (plain_newsvendor(scenario, item)) {
    return item.leftovers == Leftovers::salvage ? item.salvage_value : 0.0;
  }
  return approximate_recovery(scenario, item, penalty);
}

double critical_ratio(const Scenario& scenario, const Item& item, double penalty) {
  const double s = leftover_recovery(scenario, item, penalty);
  const double under = item.price - item.unit_cost + penalty;
  const double denominator = item.price - s + penalty;
  if (under <= 0.0 || denominator <= 0.0) return 0.0;
  return std::min(under / denominator, 1.0);
}

std::vector<double> read_critical_ratios(PartContext& ctx, std::span<const DemandFamily> family) {
  const auto penalty = ctx.params.optional_number("penalty", Range::at_least(0.0));
  std::vector<double> ratio;
  const Scenario& sc = ctx.scenario;
  // Items with the same chain share its ratio (measured once).
  std::vector<std::pair<ChainSpec, double>> measured;
  for (size_t i = 0; i < sc.items.size(); ++i) {
    const Item& item = sc.items[i];
    const double g = penalty.value_or(item.stockout_penalty);
    double cr = critical_ratio(sc, item, g);
    if (cr > 0.0 && cr < 1.0 && !plain_newsvendor(sc, item)) {
      if (const auto chain = typical_chain(sc, static_cast<int>(i), g, family[i])) {
        const auto same = std::find_if(measured.begin(), measured.end(),
                                       [&](const auto& m) { return m.first == *chain; });
        if (same != measured.end()) {
          cr = same->second;
        } else {
          cr = best_chain_ratio(sc, static_cast<int>(i), *chain, family[i], 0);
          measured.emplace_back(*chain, cr);
        }
      }
    }
    if (cr >= 1.0) {
      // Nothing is lost on a unit left over: the rule would order without limit. Say why.
      if (item.unit_cost <= 0.0) {
        ctx.params.error("",
                         fmt::format("{}: item '{}' has unit_cost 0, so a unit left over costs "
                                     "nothing and the rule would order without limit (a "
                                     "critical ratio of 1)",
                                     ctx.params.path(), item.id),
                         "give the item what a unit costs, or order it with another rule "
                         "(fixed, in_stock_target)");
      } else {
        ctx.params.error(
            "",
            fmt::format("{}: item '{}' has a critical ratio of 1: a unit left over "
                        "brings back {:g} (salvage or a later sale), no less than "
                        "its unit_cost {:g}",
                        ctx.params.path(), item.id, leftover_recovery(sc, item, g), item.unit_cost),
            "salvage_value and next_day.price must be below unit_cost");
      }
    }
    ratio.push_back(cr);
  }
  return ratio;
}

void register_critical_fractile(PolicyRegistry& r) {
  r.quantities.add(
      {"critical_fractile",
       "the recommended rule; newsvendor on the perishable inventory position: smallest Q "
       "with P(D <= X + Q) >= (p - c + g) / (p - s + g), X the stock carried into the arrival "
       "day, s what a leftover really brings (measured on the item's exact chain for items "
       "that keep, lead times above 1 and next-day discounts; README 'Ordering beyond one "
       "day') (penalty: overrides the items' stockout_penalty; assume: family)",
       [](PartContext& ctx) -> std::unique_ptr<QuantityMethod> {
         auto family = read_assume(ctx);
         auto ratio = read_critical_ratios(ctx, family);
         return std::make_unique<FractileMethod>(std::move(ratio), std::move(family), 0);
       }});
}

}  // namespace larder
