// `network_in_stock`: per-group in-stock levels chosen across the whole network to maximise
// expected profit subject to an average in-stock target (policies.md). Between re-plans it
// orders like `in_stock_target` with its group's level: the smallest Q with
// P(D <= Q - 1) >= level. The levels come from the runner every `replan_days`
// (policies/network/network_plan.hpp: the policy's own forecasts of the coming week, a
// Lagrangian relaxation of the network constraint with bisection on the multiplier,
// policies/network/allocation.hpp).

#include <fmt/format.h>

#include "policies/network/network_target.hpp"
#include "policies/quantity/fractile_rule.hpp"
#include "policies/registry.hpp"

namespace larder {

namespace {

/// in_stock_target with levels the runner sets.
class NetworkInStockRule : public FractileRule {
 public:
  NetworkInStockRule(std::vector<double> level, std::vector<DemandFamily> family,
                     const Scenario& scenario)
      : FractileRule(std::move(level), std::move(family), 1, scenario) {}
  void set_levels(std::span<const double> level) override { set_probability(level); }
};

class NetworkInStock : public QuantityMethod {
 public:
  explicit NetworkInStock(NetworkTarget t) : target_(std::move(t)) {}
  std::unique_ptr<OrderRule> make(const StoreView& store) const override {
    // Until the first plan, every item at the target itself.
    return std::make_unique<NetworkInStockRule>(
        std::vector<double>(static_cast<size_t>(store.item_count()), target_.target),
        target_.family, store.scenario);
  }
  const NetworkTarget* network() const override { return &target_; }

 private:
  NetworkTarget target_;
};

}  // namespace

void register_network_in_stock(PolicyRegistry& r) {
  r.quantities.add(
      {"network_in_stock",
       "one in-stock level per group (groups: store_item, item, all, attribute:<key>, abc), "
       "chosen network-wide for the most expected profit with an average in-stock of `target`; "
       "re-planned every replan_days [28] (assume: family)",
       [](PartContext& ctx) -> std::unique_ptr<QuantityMethod> {
         NetworkTarget t;
         Params& p = ctx.params;
         const auto target = p.optional_number("target", {0.0, 1.0, true, true});
         if (!target && !p.has("target")) {
           p.error({}, fmt::format("{} needs 'target'", p.path()),
                   "the average share of store-item-days in stock at close, e.g. target: 0.7");
         }
         const std::string groups = p.text("groups", "item");
         const auto grouping = parse_grouping(groups);
         if (!grouping) {
           p.error("groups", fmt::format("{} must be store_item, item, all, attribute:<key> or abc "
                                         "(got '{}')",
                                         p.path_of("groups"), groups));
         }
         t.replan_days = p.integer("replan_days", t.replan_days, Range::between(1, 3650));
         t.family = read_assume(ctx);
         if (!target || !grouping) return nullptr;
         t.target = *target;
         t.grouping = *grouping;
         if (grouping->kind == GroupingKind::attribute) {
           bool any = false;
           for (const Item& item : ctx.scenario.items) {
             any = any || item.attributes.count(grouping->attribute) > 0;
           }
           if (!any) {
             p.error("groups",
                     fmt::format("{}: no item has the attribute '{}'", p.path_of("groups"),
                                 grouping->attribute),
                     "give items attributes: { key: value }, or choose another grouping");
             return nullptr;
           }
         }
         return std::make_unique<NetworkInStock>(std::move(t));
       }});
}

}  // namespace larder
