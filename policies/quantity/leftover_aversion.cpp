// `leftover_aversion`: reference-dependent newsvendor preferences, where every unit left over
// carries a psychological cost on top of its money cost (Ho, T.-H., Lim, N. and Cui, T.H. 2010,
// "Reference dependence in multilocation newsvendor models: a structural analysis", Management
// Science 56(11); checks.md 7.2). Maximising E[profit] - cost * E[(Q - D)+] -
// stockout_cost * E[(D - Q)+] gives the smallest Q with
//   P(D <= Q) >= (cu + stockout_cost) / (cu + co + stockout_cost + cost),
// cu = p - c + g, co = c - s: with leftover aversion (cost > stockout_cost) the ratio falls
// and the planner orders less than the newsvendor. The order is that quantile minus usable
// stock and units on order, never below 0.

#include "policies/quantity/leftover_aversion.hpp"

#include <fmt/format.h>

#include <algorithm>

#include "policies/quantity/critical_fractile.hpp"
#include "policies/quantity/fractile_rule.hpp"
#include "policies/quantity/item_values.hpp"
#include "policies/registry.hpp"

namespace larder {

double leftover_aversion_ratio(const Scenario& scenario, const Item& item, double penalty,
                               double leftover_cost, double stockout_cost) {
  const double s = leftover_recovery(scenario, item, penalty);
  const double under = item.price - item.unit_cost + penalty + stockout_cost;
  const double over = item.unit_cost - s + leftover_cost;
  if (under <= 0.0) return 0.0;
  if (over <= 0.0) return 1.0;
  return under / (under + over);
}

void register_leftover_aversion(PolicyRegistry& r) {
  r.quantities.add(
      {"leftover_aversion",
       "behavioural: newsvendor quantile at (cu + stockout_cost) / (cu + co + stockout_cost + "
       "cost), a psychological cost per leftover unit (cost: number or item map >= 0, "
       "required; stockout_cost: default 0; penalty: overrides the items' stockout_penalty; "
       "assume: family)",
       [](PartContext& ctx) -> std::unique_ptr<QuantityMethod> {
         const auto cost = read_item_values(ctx, "cost", Range::at_least(0.0), true);
         const auto stockout = read_item_values(ctx, "stockout_cost", Range::at_least(0.0), false);
         const auto penalty = ctx.params.optional_number("penalty", Range::at_least(0.0));
         auto family = read_assume(ctx);
         if (!cost) return nullptr;
         std::vector<double> ratio;
         for (size_t i = 0; i < ctx.scenario.items.size(); ++i) {
           const Item& item = ctx.scenario.items[i];
           const double cr =
               leftover_aversion_ratio(ctx.scenario, item, penalty.value_or(item.stockout_penalty),
                                       (*cost)[i], stockout ? (*stockout)[i] : 0.0);
           if (cr >= 1.0) {
             ctx.params.error("cost",
                              fmt::format("{}: item '{}' has a ratio of 1 (its leftovers cost "
                                          "nothing, money and psychological cost together)",
                                          ctx.params.path(), item.id),
                              "give a cost above 0, or a salvage_value below unit_cost");
           }
           ratio.push_back(std::min(cr, 1.0));
         }
         return std::make_unique<FractileMethod>(std::move(ratio), std::move(family), 0);
       }});
}

}  // namespace larder
