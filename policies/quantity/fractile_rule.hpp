#pragma once
// Order up to a quantile of the forecast demand: the shared core of `critical_fractile`,
// `in_stock_target`, `leftover_aversion` and `network_in_stock`. The target is the smallest Q
// with P(D <= Q) >= p for D the demand of the protection period (the days until the delivery
// arrives and the days it serves, the arrival day netted of the sales a discounted tier takes)
// under the family the rule assumes (`assume`), plus `extra` units; the order lifts the
// perishable inventory position to the target (protection_period.hpp). With lead time 1 and
// daily deliveries that is the target minus usable stock and units on order, never below 0.

#include <vector>

#include "policies/quantity/protection_period.hpp"
#include "policies/quantity_rule.hpp"
#include "sim/scenario/scenario.hpp"

namespace larder {

/// Reads `assume: poisson | negative_binomial | normal`; the default is each item's own demand
/// family.
std::vector<DemandFamily> read_assume(PartContext& ctx);

/// Smallest Q >= 0 with P(D <= Q) >= p for a count with the forecast's mean and variance
/// under `family` (normal: P(D <= x) = Phi((x + 0.5 - mean) / sd), policies.md).
int forecast_quantile(const DemandForecast& f, DemandFamily family, double p);

class FractileRule : public OrderRule {
 public:
  /// One probability and family per item; `extra` is added to the quantile.
  FractileRule(std::vector<double> probability, std::vector<DemandFamily> family, int extra,
               const Scenario& scenario);
  void decide(const OrderContext& ctx, std::span<const OrderInput> in, std::span<int> out) override;

 protected:
  /// Replaces the probabilities (one per item).
  void set_probability(std::span<const double> probability);

 private:
  std::vector<double> probability_;
  std::vector<DemandFamily> family_;
  std::vector<double> z_;  ///< normal quantile of each probability (for the normal family)
  int extra_;
  ProtectionPeriod period_;
};

/// A configured quantile rule: one probability and family per item, plus `extra` units.
/// `critical_fractile`, `in_stock_target` and `leftover_aversion` differ only in these.
class FractileMethod : public QuantityMethod {
 public:
  FractileMethod(std::vector<double> probability, std::vector<DemandFamily> family, int extra)
      : probability_(std::move(probability)), family_(std::move(family)), extra_(extra) {}
  std::unique_ptr<OrderRule> make(const StoreView& view) const override {
    return std::make_unique<FractileRule>(probability_, family_, extra_, view.scenario);
  }

 private:
  std::vector<double> probability_;
  std::vector<DemandFamily> family_;
  int extra_;
};

}  // namespace larder
