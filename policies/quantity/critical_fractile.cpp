// `critical_fractile`: the newsvendor quantity, the smallest Q with
// P(D <= Q) >= (p - c + g) / (p - s + g) for price p, unit cost c, recovery s per leftover unit
// (leftover_recovery) and stockout penalty g (Arrow, Harris
// and Marschak 1951; Nahmias, Production and Operations Analysis, the newsvendor chapter).

#include "policies/quantity/critical_fractile.hpp"

#include <fmt/format.h>

#include "policies/quantity/fractile_rule.hpp"
#include "policies/registry.hpp"

namespace larder {

double leftover_recovery(const Item& item, double discount_take_rate) {
  if (item.leftovers == Leftovers::salvage) return item.salvage_value;
  if (!item.next_day) return 0.0;
  const double rest = item.next_day->fallback == Leftovers::salvage ? item.salvage_value : 0.0;
  return discount_take_rate * item.next_day->price + (1.0 - discount_take_rate) * rest;
}

double critical_ratio(const Item& item, double penalty, double discount_take_rate) {
  const double s = leftover_recovery(item, discount_take_rate);
  const double under = item.price - item.unit_cost + penalty;
  const double denominator = item.price - s + penalty;
  if (under <= 0.0 || denominator <= 0.0) return 0.0;
  return std::min(under / denominator, 1.0);
}

std::vector<double> read_critical_ratios(PartContext& ctx) {
  const auto penalty = ctx.params.optional_number("penalty", Range::at_least(0.0));
  std::vector<double> ratio;
  for (const Item& item : ctx.scenario.items) {
    const double cr = critical_ratio(item, penalty.value_or(item.stockout_penalty),
                                     ctx.scenario.discount_take_rate);
    if (cr >= 1.0) {
      ctx.params.error("",
                       fmt::format("{}: item '{}' has a critical ratio of 1 (its leftovers "
                                   "recover the full cost)",
                                   ctx.params.path(), item.id),
                       "salvage_value and next_day.price must be below unit_cost");
    }
    ratio.push_back(cr);
  }
  return ratio;
}

void register_critical_fractile(PolicyRegistry& r) {
  r.quantities.add(
      {"critical_fractile",
       "newsvendor: smallest Q with P(D <= Q) >= (p - c + g) / (p - s + g) from item economics "
       "(penalty: overrides the items' stockout_penalty; assume: family)",
       [](PartContext& ctx) -> std::unique_ptr<QuantityMethod> {
         auto ratio = read_critical_ratios(ctx);
         return std::make_unique<FractileMethod>(std::move(ratio), read_assume(ctx), 0);
       }});
}

}  // namespace larder
