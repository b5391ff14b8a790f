// `pull_to_center`: the mean-anchoring bias of newsvendor decision makers, Q = w * mean +
// (1 - w) * Q*, with Q* the critical-fractile quantity of the forecast the rule is given (the
// days the delivery serves: the arrival day with daily deliveries) and mean its mean (Schweitzer,
// M.E. and Cachon, G.P. 2000, "Decision bias in the newsvendor problem with a known demand
// distribution: experimental evidence", Management Science 46(3); rule (i) of checks.md 7.2).
// Subjects order too little of high-margin items and too much of low-margin ones; w = 0 is the
// critical fractile, w = 1 orders the mean. The stock target is Q rounded to the nearest integer
// (halves up); Q* and the mean are those of the protection period and the order lifts the
// perishable inventory position to the target (protection_period.hpp; with lead time 1 and
// daily deliveries: the target minus usable stock and units on order, never below 0).

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

struct PullSetup {
  std::vector<double> ratio;
  std::vector<DemandFamily> family;
  double w = 0.0;
};

class PullToCenterRule : public OrderRule {
 public:
  PullToCenterRule(const PullSetup& setup, const Scenario& scenario)
      : setup_(&setup), period_(scenario) {}
  void decide(const OrderContext& ctx, std::span<const OrderInput> in,
              std::span<int> out) override {
    period_.prepare(ctx, in, 1);
    for (size_t i = 0; i < in.size(); ++i) {
      const DemandForecast f = period_.demand(i);
      const double ratio = setup_->ratio[i];
      const int q_star = ratio > 0.0 ? forecast_quantile(f, setup_->family[i], ratio) : 0;
      const double t = pull_to_center_target(std::max(f.mean, 0.0), q_star, setup_->w);
      out[i] = period_.order_to(i, static_cast<long>(std::min(std::floor(t + 0.5), 2e9)));
    }
  }

 private:
  const PullSetup* setup_;
  ProtectionPeriod period_;
};

class PullToCenter : public QuantityMethod {
 public:
  explicit PullToCenter(PullSetup setup) : setup_(std::move(setup)) {}
  std::unique_ptr<OrderRule> make(const StoreView& view) const override {
    return std::make_unique<PullToCenterRule>(setup_, view.scenario);
  }

 private:
  PullSetup setup_;
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
         auto family = read_assume(ctx);
         auto ratio = read_critical_ratios(ctx, family);
         return std::make_unique<PullToCenter>(PullSetup{std::move(ratio), std::move(family), w});
       }});
}

}  // namespace larder
