// `order_up_to`: a periodic-review order-up-to rule for perishables with an outdating
// correction, after the "estimated withdrawals and ageing" (EWA) heuristic of Broekmeulen and
// van Donselaar (2009), "A heuristic to manage perishable inventory with batch ordering,
// positive lead-times, and time-varying demand", Computers & Operations Research 36(11)
// (checks.md 5.3; the order-up-to base policy as in Nahmias 1982 and Silver, Pyke and Thomas
// 2017).
//
// An order placed after close on day t arrives on the morning of a = t + L (lead time L).
// It must cover the protection period: the L - 1 days before it arrives and the n days it
// serves, n = min(max(review_days, W), shelf life), where W is the engine's window (the days
// until the next delivery arrives or the units expire: 1 with daily deliveries), cut at the
// end of the horizon.
//   S = smallest integer with P(D <= S) >= level, D the demand of the period: the engine's
//       forecast of its window plus the forecaster's daily forecasts of the other days (means
//       and variances added; closed days and days outside the horizon count 0), under the
//       family of `assume`.
//   IP = stock on hand (every age) + units on order.
//   O(Q) = expected_outdating(): units expected to outdate before the period ends, from
//       running the daily mean demand through the stock by age, the pipeline and the order Q
//       itself (the freshest units), with the store's customers.fifo_share taking the oldest.
//   Q = max(0, S - IP + ceil(O(Q))), found by iterating from Q = max(0, S - IP) until Q
//       repeats (a larger order shields more old stock from the shoppers who take the
//       freshest unit, so Q rises round by round; at most 20 rounds, the last one is kept).
// With lead time 1 and n = 1 (shelf life 1, or review_days 1 with daily deliveries) the period
// is the arrival day, nothing outdates early, and Q is the plain quantile order S - usable
// stock - units on order (FractileRule with extra 0).

#include "policies/quantity/order_up_to.hpp"

#include <vector>

#include "policies/quantity/fractile_rule.hpp"
#include "policies/quantity/item_values.hpp"
#include "policies/registry.hpp"

namespace larder {

namespace {

struct OrderUpToSetup {
  std::vector<double> level;
  std::vector<DemandFamily> family;
  int review_days = 1;
};

/// The rule's state at one store: the protection period's scratch.
class OrderUpToRule : public OrderRule {
 public:
  OrderUpToRule(const OrderUpToSetup& setup, const StoreView& view)
      : setup_(&setup), period_(view.scenario) {}

  void decide(const OrderContext& ctx, std::span<const OrderInput> in,
              std::span<int> out) override {
    period_.prepare(ctx, in, setup_->review_days);
    for (size_t i = 0; i < in.size(); ++i) {
      const int target = forecast_quantile(period_.demand(i), setup_->family[i], setup_->level[i]);
      out[i] = period_.order_to(i, target);
    }
  }

 private:
  const OrderUpToSetup* setup_;
  ProtectionPeriod period_;
};

class OrderUpTo : public QuantityMethod {
 public:
  explicit OrderUpTo(OrderUpToSetup setup) : setup_(std::move(setup)) {}
  std::unique_ptr<OrderRule> make(const StoreView& view) const override {
    return std::make_unique<OrderUpToRule>(setup_, view);
  }

 private:
  OrderUpToSetup setup_;
};

}  // namespace

void register_order_up_to(PolicyRegistry& r) {
  r.quantities.add(
      {"order_up_to",
       "perishables: order up to a quantile of the demand until the delivery is sold or "
       "replaced, plus the stock expected to outdate first (level: number or item map in "
       "(0, 1), default 0.8; review_days: days a delivery serves, default 1, capped at the "
       "shelf life; assume: family)",
       [](PartContext& ctx) -> std::unique_ptr<QuantityMethod> {
         OrderUpToSetup setup;
         if (ctx.params.has("level")) {
           auto level = read_item_values(ctx, "level", {0.0, 1.0, true, true}, true);
           if (!level) return nullptr;
           setup.level = std::move(*level);
         } else {
           setup.level.assign(ctx.scenario.items.size(), 0.8);
         }
         setup.review_days = ctx.params.integer("review_days", 1, Range::between(1, 364));
         setup.family = read_assume(ctx);
         return std::make_unique<OrderUpTo>(std::move(setup));
       }});
}

}  // namespace larder
