// `fill_rate_target`: order up to the smallest stock Q whose expected fill rate (type 2 or
// beta service) E[min(D, Q)] / E[D] is at least `level`, with D the forecast demand of the
// days the delivery serves (the engine's window: the arrival day with daily deliveries) under
// the family of `assume`, over the protection period (protection_period.hpp: the days until the
// delivery arrives too, and the arrival day netted of a discounted tier's sales); the order
// lifts the perishable inventory position to Q (with lead time 1 and daily deliveries: Q minus
// usable stock and units on order, never below 0). The
// fill rate of one period is 1 - E[(D - Q)+] / E[D]; for normal demand 1 - sd * L(z) / mean with
// the unit normal loss L (Silver, Pyke and Thomas 2017, P2 service; Nahmias, Production and
// Operations Analysis; checks.md 1.2 and 2).

#include "policies/quantity/fill_rate_target.hpp"

#include <algorithm>
#include <array>
#include <cmath>

#include "policies/quantity/fractile_rule.hpp"
#include "policies/quantity/item_values.hpp"
#include "policies/registry.hpp"

namespace larder {

double expected_fill_rate(const CountLaw& law, int q) {
  if (!(law.mean > 0.0)) return 1.0;
  const double sales = law.expected_sales(q);
  // E[D] = E[min(D, q)] + E[(D - q)+] at any q: exact also for the normal count, whose mean
  // differs from the underlying normal's by the mass rounded up to 0.
  const double demand = sales + law.expected_shortage(q);
  return demand > 0.0 ? sales / demand : 1.0;
}

int fill_rate_quantity(const CountLaw& law, double level) {
  if (!(law.mean > 0.0)) return 0;
  // E[min(D, q)] = sum over k < q of P(D > k) rises with q: add 1 - F(k) from the point where
  // F is still negligible (10 sd below the mean: every earlier term is 1 to 1e-23) until the
  // sum reaches level * E[D]. E[D] is the mean for the poisson and negative binomial; for the
  // normal count (rounded and cut at 0) it is E[(D - 0)+].
  const double demand = law.family == DemandFamily::normal ? law.expected_shortage(0) : law.mean;
  const double need = level * demand;
  const double sd = std::sqrt(std::max(law.variance, 0.0));
  const int first = static_cast<int>(std::max(0.0, std::floor(law.mean - 10.0 * sd)));
  if (need <= first) return static_cast<int>(std::ceil(need));
  const CountSampler sampler(law);
  double sales = first;  // E[min(D, first)]
  std::array<double, 64> f{};
  for (int k = first; k < sampler.cap();) {
    sampler.cdf_run(k, f);
    for (double fk : f) {
      sales += 1.0 - fk;  // E[min(D, k + 1)]
      ++k;
      if (sales >= need) return k;
    }
  }
  return sampler.cap();
}

namespace {

class FillRateRule : public OrderRule {
 public:
  FillRateRule(const std::vector<double>& level, const std::vector<DemandFamily>& family,
               const Scenario& scenario)
      : level_(&level), family_(&family), period_(scenario) {}
  void decide(const OrderContext& ctx, std::span<const OrderInput> in,
              std::span<int> out) override {
    period_.prepare(ctx, in, 1);
    for (size_t i = 0; i < in.size(); ++i) {
      const DemandForecast f = period_.demand(i);
      const double mean = std::max(f.mean, 0.0);
      const CountLaw law = CountLaw::from_moments((*family_)[i], mean, f.variance);
      out[i] = period_.order_to(i, fill_rate_quantity(law, (*level_)[i]));
    }
  }

 private:
  const std::vector<double>* level_;
  const std::vector<DemandFamily>* family_;
  ProtectionPeriod period_;
};

class FillRateMethod : public QuantityMethod {
 public:
  FillRateMethod(std::vector<double> level, std::vector<DemandFamily> family)
      : level_(std::move(level)), family_(std::move(family)) {}
  std::unique_ptr<OrderRule> make(const StoreView& view) const override {
    return std::make_unique<FillRateRule>(level_, family_, view.scenario);
  }

 private:
  std::vector<double> level_;
  std::vector<DemandFamily> family_;
};

}  // namespace

void register_fill_rate_target(PolicyRegistry& r) {
  r.quantities.add({"fill_rate_target",
                    "smallest Q with expected fill rate E[min(D, Q)] / E[D] >= level (level: "
                    "number or item map in (0, 1); assume: family)",
                    [](PartContext& ctx) -> std::unique_ptr<QuantityMethod> {
                      auto level = read_item_values(ctx, "level", {0.0, 1.0, true, true}, true);
                      auto family = read_assume(ctx);
                      if (!level) return nullptr;
                      return std::make_unique<FillRateMethod>(std::move(*level), std::move(family));
                    }});
}

}  // namespace larder
