#include "policies/quantity/fractile_rule.hpp"

#include <algorithm>
#include <cmath>

#include "sim/stats/count_law.hpp"
#include "sim/stats/normal.hpp"

namespace larder {

std::vector<DemandFamily> read_assume(PartContext& ctx) {
  std::vector<DemandFamily> out;
  const std::string a = ctx.params.choice("assume", "", {"poisson", "negative_binomial", "normal"});
  for (const Item& item : ctx.scenario.items) {
    if (a == "poisson") {
      out.push_back(DemandFamily::poisson);
    } else if (a == "negative_binomial") {
      out.push_back(DemandFamily::negative_binomial);
    } else if (a == "normal") {
      out.push_back(DemandFamily::normal);
    } else {
      out.push_back(item.demand.family);
    }
  }
  return out;
}

namespace {
/// The normal count's quantile from a precomputed z = Phi^-1(p): max(0, ceil(x)) with
/// x = mean + sd * z - 0.5, by integer truncation (this runs per store-item-day).
int normal_count_quantile(const DemandForecast& f, double z) {
  const double x = f.mean + std::sqrt(std::max(f.variance, 0.0)) * z - 0.5;
  if (!(x > 0.0)) return 0;
  if (x >= 2e9) return 2000000000;
  const int k = static_cast<int>(x);
  return k + (static_cast<double>(k) < x ? 1 : 0);
}
}  // namespace

int forecast_quantile(const DemandForecast& f, DemandFamily family, double p) {
  if (family == DemandFamily::normal) return normal_count_quantile(f, normal_quantile(p));
  const double var = family == DemandFamily::poisson ? f.mean : f.variance;
  return CountLaw::from_moments(family, std::max(f.mean, 0.0), var).quantile(p);
}

FractileRule::FractileRule(std::vector<double> probability, std::vector<DemandFamily> family,
                           int extra, const Scenario& scenario)
    : family_(std::move(family)), extra_(extra), period_(scenario) {
  set_probability(probability);
}

void FractileRule::set_probability(std::span<const double> probability) {
  probability_.assign(probability.begin(), probability.end());
  z_.clear();
  for (double p : probability_) z_.push_back(p > 0.0 && p < 1.0 ? normal_quantile(p) : 0.0);
}

void FractileRule::decide(const OrderContext& ctx, std::span<const OrderInput> in,
                          std::span<int> out) {
  period_.prepare(ctx, in, 1);
  for (size_t i = 0; i < in.size(); ++i) {
    const double p = probability_[i];
    if (period_.plain(i)) {
      // The daily fast path: the quantile target minus usable stock and units on order.
      int target = 0;
      if (p > 0.0) {
        target = (family_[i] == DemandFamily::normal
                      ? normal_count_quantile(in[i].forecast, z_[i])
                      : forecast_quantile(in[i].forecast, family_[i], p)) +
                 extra_;
      }
      out[i] = std::max(0, target - in[i].usable_stock - in[i].on_order);
      continue;
    }
    out[i] = period_.quantile_order(i, family_[i], p, extra_);
  }
}

}  // namespace larder
