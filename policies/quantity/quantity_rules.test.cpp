// Quantity rules against textbook and reference-library answers.

#include <boost/math/distributions/negative_binomial.hpp>
#include <boost/math/distributions/normal.hpp>
#include <boost/math/distributions/poisson.hpp>
#include <catch2/catch.hpp>

#include "policies/quantity/critical_fractile.hpp"
#include "policies/quantity/fractile_rule.hpp"
#include "sim/engine/demand_model.hpp"

namespace larder {
namespace {

using boost::math::policies::discrete_quantile;
using boost::math::policies::integer_round_up;
using boost::math::policies::policy;
// Smallest k with F(k) >= p: Boost's discrete quantile rounded up (checks.md 1.6 pitfall: the
// default rounds outwards and gives 18 instead of 19 for Poisson(20) at p = 0.4).
using RoundUp = policy<discrete_quantile<integer_round_up>>;

Item item(double price, double cost, Leftovers leftovers = Leftovers::discard,
          double salvage = 0.0) {
  Item it;
  it.id = std::string("x");  // a move: GCC 12 -Wrestrict misfires on the literal at -O3
  it.price = price;
  it.unit_cost = cost;
  it.leftovers = leftovers;
  it.salvage_value = salvage;
  return it;
}

TEST_CASE("critical ratio (p - c + g) / (p - s + g) on the worked examples of checks.md 1",
          "[policies][quantity]") {
  const Scenario plain;  // shelf life 1, lead time 1: the one-day newsvendor
  // Example A: p=3, c=1, s=0, g=0 -> 2/3. Variant A': s=0.5, g=0.5 -> 5/6.
  CHECK(critical_ratio(plain, item(3, 1), 0.0) == Approx(2.0 / 3.0).epsilon(1e-15));
  CHECK(critical_ratio(plain, item(3, 1, Leftovers::salvage, 0.5), 0.5) ==
        Approx(5.0 / 6.0).epsilon(1e-15));
  // Example B: p=5, c=2, s=0.5, g=1 -> 8/11 = 0.7272727273.
  CHECK(critical_ratio(plain, item(5, 2, Leftovers::salvage, 0.5), 1.0) ==
        Approx(0.7272727273).epsilon(1e-10));
  // Salvage value counts only when leftovers are salvaged; donation recovers nothing.
  CHECK(critical_ratio(plain, item(3, 1, Leftovers::donate, 0.5), 0.0) ==
        Approx(2.0 / 3.0).epsilon(1e-15));
  // No margin and no penalty: nothing to gain by stocking.
  CHECK(critical_ratio(plain, item(1, 1), 0.0) == 0.0);
}

TEST_CASE("a next-day discount recovers its price less the full-price sales it takes",
          "[policies][quantity]") {
  // model.md, step 3: a discounted unit sells at price q to the share `take` of customers, and
  // about a share r (the ratio itself: the chance the full-price tier still had a unit) of
  // those would have bought at full price p. So s = take * (q - p * r) + (1 - take) * fallback
  // and r = (p - c) / (p - s), a fixed point. By hand, p = 3, c = 1, q = 1.2, take = 0.5,
  // fallback discarded: r = 2 / (2.4 + 1.5 r), 1.5 r^2 + 2.4 r - 2 = 0, r = (-2.4 + sqrt(17.76))
  // / 3 = 0.604766..., s = 0.6 - 1.5 r = -0.30715: the discount costs more than it brings.
  Scenario sc;
  sc.discount_take_rate = 0.5;
  Item it = item(3, 1, Leftovers::discount_next_day, 0.2);
  it.next_day = NextDayDiscount{1.2, Leftovers::discard, 0.0};
  const double r = (-2.4 + std::sqrt(17.76)) / 3.0;
  CHECK(critical_ratio(sc, it, 0.0) == Approx(r).epsilon(1e-9));
  CHECK(leftover_recovery(sc, it, 0.0) == Approx(0.6 - 1.5 * r).epsilon(1e-9));
  // Nobody takes a discounted unit: the units go to the fallback (salvage 0.2): s = 0.2.
  sc.discount_take_rate = 0.0;
  it.next_day->fallback = Leftovers::salvage;
  CHECK(critical_ratio(sc, it, 0.0) == Approx(2.0 / 2.8).epsilon(1e-9));
}

TEST_CASE("forecast_quantile is the smallest Q with P(D <= Q) >= p (Boost, integer_round_up)",
          "[policies][quantity]") {
  SECTION("Poisson") {
    // checks.md 1.4: Poisson(20) at 2/3 gives Q* = 22 (scipy.stats.poisson.ppf(2/3, 20)).
    CHECK(forecast_quantile({20.0, 20.0}, DemandFamily::poisson, 2.0 / 3.0) == 22);
    CHECK(forecast_quantile({20.0, 20.0}, DemandFamily::poisson, 0.4) == 19);
    for (double mean : {0.7, 4.0, 20.0, 63.5}) {
      for (double p : {0.05, 0.3, 0.5, 0.72, 0.95, 0.999}) {
        const boost::math::poisson_distribution<double, RoundUp> d(mean);
        CHECK(forecast_quantile({mean, mean}, DemandFamily::poisson, p) ==
              static_cast<int>(boost::math::quantile(d, p)));
      }
    }
  }
  SECTION("negative binomial from mean and variance") {
    for (double mean : {3.0, 20.0, 75.0}) {
      for (double cv : {0.4, 0.8}) {
        const double var = cv * cv * mean * mean;
        if (var <= mean) continue;
        const double r = mean * mean / (var - mean);
        const boost::math::negative_binomial_distribution<double, RoundUp> d(r, r / (r + mean));
        for (double p : {0.1, 0.5, 0.8, 0.97}) {
          CHECK(forecast_quantile({mean, var}, DemandFamily::negative_binomial, p) ==
                static_cast<int>(boost::math::quantile(d, p)));
        }
      }
    }
  }
  SECTION("normal with the continuity rule of policies.md") {
    // P(D <= x) = Phi((x + 0.5 - mean) / sd): Q is the smallest integer with
    // Q >= mean + sd * z_p - 0.5, z_p from Boost's normal quantile.
    const boost::math::normal_distribution<double> n;
    for (double mean : {5.0, 40.0, 118.0}) {
      for (double p : {0.2, 0.5, 0.7272727273, 0.95}) {
        const double sd = 0.3 * mean;
        const double x = mean + sd * boost::math::quantile(n, p) - 0.5;
        CHECK(forecast_quantile({mean, sd * sd}, DemandFamily::normal, p) ==
              static_cast<int>(std::ceil(x)));
      }
    }
    // Never below zero.
    CHECK(forecast_quantile({0.2, 0.01}, DemandFamily::normal, 0.1) == 0);
  }
}

TEST_CASE("FractileRule orders the quantile plus extra, less usable stock and units on order",
          "[policies][quantity]") {
  // in_stock_target = quantile + 1; Poisson(20) at 0.70 -> 22 + 1 = 23 (checks.md 1.4 table).
  Scenario sc;
  sc.items.resize(2);
  FractileRule in_stock({0.70, 0.70}, {DemandFamily::poisson, DemandFamily::normal}, 1, sc);
  std::vector<OrderInput> in(2);
  in[0].forecast = {20.0, 20.0};
  in[1].forecast = {100.0, 900.0};
  in[1].usable_stock = 30;
  in[1].on_order = 10;
  std::vector<int> out(2);
  const DemandModel truth(sc);
  const StoreView view{sc, truth, 0};
  const OrderContext ctx{view, 0, 1};
  in_stock.decide(ctx, in, out);
  CHECK(out[0] == 23);
  // Normal(100, 30): ceil(100 + 30 * 0.5244005127 - 0.5) + 1 = 116 + 1; minus 40 in hand.
  CHECK(out[1] == 117 - 40);
  // Stock above the target orders nothing.
  in[0].usable_stock = 50;
  in_stock.decide(ctx, in, out);
  CHECK(out[0] == 0);
}

}  // namespace
}  // namespace larder
