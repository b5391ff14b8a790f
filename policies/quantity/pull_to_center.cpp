// `pull_to_center`: the mean-anchoring bias of newsvendor decision makers, Q = w * mean +
// (1 - w) * Q*, with Q* the critical-fractile quantity of the forecast the rule is given (the
// days the delivery serves: the arrival day with daily deliveries) and mean its mean (Schweitzer,
// M.E. and Cachon, G.P. 2000, "Decision bias in the newsvendor problem with a known demand
// distribution: experimental evidence", Management Science 46(3); rule (i) of checks.md 7.2).
// Subjects order too little of high-margin items and too much of low-margin ones; w = 0 is the
// critical fractile, w = 1 orders the mean. The stock target is Q rounded to the nearest integer
// (halves up); the order is the target minus usable stock and units on order, never below 0.

#include "policies/quantity/pull_to_center.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "policies/quantity/critical_fractile.hpp"
#include "policies/quantity/fractile_rule.hpp"
#include "policies/registry.hpp"

namespace larder {

double pull_to_center_target(double mean, double q_star, double w) {
  return w * mean + (1.0 - w) * q_star;
}

namespace {

class PullToCenter : public OrderRule, public QuantityMethod {
 public:
  PullToCenter(std::vector<double> ratio, std::vector<DemandFamily> family, double w)
      : ratio_(std::move(ratio)), family_(std::move(family)), w_(w) {}
  void decide(const OrderContext&, std::span<const OrderInput> in, std::span<int> out) override {
    for (size_t i = 0; i < in.size(); ++i) {
      const DemandForecast& f = in[i].forecast;
      const int q_star = ratio_[i] > 0.0 ? forecast_quantile(f, family_[i], ratio_[i]) : 0;
      const double t = pull_to_center_target(std::max(f.mean, 0.0), q_star, w_);
      const int target = static_cast<int>(std::min(std::floor(t + 0.5), 2e9));
      out[i] = std::max(0, target - in[i].usable_stock - in[i].on_order);
    }
  }
  std::unique_ptr<OrderRule> make(const StoreView&) const override {
    return std::make_unique<PullToCenter>(ratio_, family_, w_);
  }

 private:
  std::vector<double> ratio_;
  std::vector<DemandFamily> family_;
  double w_;
};

}  // namespace

void register_pull_to_center(PolicyRegistry& r) {
  r.quantities.add(
      {"pull_to_center",
       "behavioural: w * mean + (1 - w) * the critical-fractile quantity, anchored on mean "
       "demand (w in [0, 1], default 0.3; penalty: overrides the items' stockout_penalty; "
       "assume: family)",
       [](PartContext& ctx) -> std::unique_ptr<QuantityMethod> {
         const double w = ctx.params.number("w", 0.3, Range::probability());
         auto ratio = read_critical_ratios(ctx);
         return std::make_unique<PullToCenter>(std::move(ratio), read_assume(ctx), w);
       }});
}

}  // namespace larder
