// fill_rate_target against the fill rate (type 2 service) of checks.md 1.4 and 2, the normal
// loss function closed form of checks.md 1.2, and Boost.Math Poisson probabilities.

#include "policies/quantity/fill_rate_target.hpp"

#include <fmt/format.h>

#include <boost/math/distributions/normal.hpp>
#include <boost/math/distributions/poisson.hpp>
#include <catch2/catch.hpp>

#include "policies/quantity/part_fixture.test.hpp"

namespace larder {
namespace {

/// Fill rate E[min(D, q)] / mean of Poisson(mean) from Boost.Math's pmf (an external reference).
double boost_poisson_fill_rate(double mean, int q) {
  const boost::math::poisson_distribution<double> d(mean);
  double sales = 0.0;
  for (int k = 0; k < 400; ++k) sales += boost::math::pdf(d, k) * std::min(k, q);
  return sales / mean;
}

/// Closed form of checks.md 1.2 / 2: fill rate 1 - sd * L(z) / mean at z = (q - mean) / sd,
/// L(z) = phi(z) - z (1 - Phi(z)) from Boost.Math's normal pdf and cdf complement.
double normal_fill_rate_closed_form(double mean, double sd, double q) {
  const boost::math::normal_distribution<double> n;
  const double z = (q - mean) / sd;
  const double loss = boost::math::pdf(n, z) - z * boost::math::cdf(boost::math::complement(n, z));
  return 1.0 - sd * loss / mean;
}

TEST_CASE("expected fill rate of Poisson(20) matches checks.md 1.4 and Boost",
          "[policies][quantity]") {
  const CountLaw law = CountLaw::from_moments(DemandFamily::poisson, 20.0, 20.0);
  // checks.md 1.4 [C]: fill rate E[sales] / mu = 0.9510251710 at Q = 22; variant A':
  // 0.9756199630 at Q = 24.
  CHECK(expected_fill_rate(law, 22) == Approx(0.9510251710).epsilon(1e-9));
  CHECK(expected_fill_rate(law, 24) == Approx(0.9756199630).epsilon(1e-9));
  for (int q : {0, 5, 15, 20, 21, 23, 30, 45}) {
    CHECK(expected_fill_rate(law, q) == Approx(boost_poisson_fill_rate(20.0, q)).epsilon(1e-12));
  }
}

TEST_CASE("fill_rate_quantity is the smallest Q reaching the level (Poisson, checks.md 1.4)",
          "[policies][quantity]") {
  const CountLaw law = CountLaw::from_moments(DemandFamily::poisson, 20.0, 20.0);
  // checks.md 1.4 table: E[sales] 18.664201 at Q = 21 (fill rate 0.93321), 19.0205034 at 22
  // (0.95103), 19.299892 at 23 (0.96499), 19.512399 at 24 (0.97562).
  CHECK(fill_rate_quantity(law, 0.95) == 22);
  CHECK(fill_rate_quantity(law, 0.9510) == 22);
  CHECK(fill_rate_quantity(law, 0.9511) == 23);
  CHECK(fill_rate_quantity(law, 0.93) == 21);
  CHECK(fill_rate_quantity(law, 0.97) == 24);
  // Every level: the answer reaches it and one unit less does not (Boost pmf sums).
  for (double level : {0.2, 0.5, 0.8, 0.9, 0.99, 0.999}) {
    const int q = fill_rate_quantity(law, level);
    CHECK(boost_poisson_fill_rate(20.0, q) >= level);
    CHECK(boost_poisson_fill_rate(20.0, q - 1) < level);
  }
  // No demand: nothing to order.
  CHECK(fill_rate_quantity(CountLaw::from_moments(DemandFamily::poisson, 0.0, 0.0), 0.9) == 0);
}

TEST_CASE("fill_rate_quantity for normal demand follows 1 - sd L(z) / mean (checks.md 1.2)",
          "[policies][quantity]") {
  // checks.md 1.5 [C]: mu = 100, sigma = 30, Q = 118.137560 has fill rate 0.949774; the
  // closed form used below reproduces it.
  CHECK(normal_fill_rate_closed_form(100, 30, 118.137560) == Approx(0.949774).epsilon(1e-6));
  const double mean = 100.0, sd = 30.0;
  const CountLaw law = CountLaw::from_moments(DemandFamily::normal, mean, sd * sd);
  // The count is X rounded and cut at 0 (policies.md), so its fill rate differs from the
  // closed form by the midpoint rule's error (E[min(D, q)] sums P(X >= k - 0.5) where the
  // closed form integrates P(X >= x): about phi(z) / (24 sd) units) and by the mass below 0
  // that the count rounds up to 0 (sd L(mean / sd) = 0.003 units): below 3e-5 here.
  for (int q : {60, 100, 118, 130, 160}) {
    CHECK(std::abs(expected_fill_rate(law, q) - normal_fill_rate_closed_form(mean, sd, q)) < 3e-5);
  }
  // A level halfway between the closed-form fill rates of Q - 1 and Q must give Q: the two
  // differ by more than 9e-4 here, thirty times the approximation error above.
  for (int q : {90, 110, 118, 125, 140}) {
    const double level = 0.5 * (normal_fill_rate_closed_form(mean, sd, q - 1) +
                                normal_fill_rate_closed_form(mean, sd, q));
    CHECK(fill_rate_quantity(law, level) == q);
  }
}

std::string one_item(const std::string& quantity) {
  return fmt::format(R"(format: 1
name: t
seed: 1
stores: [ {{ id: s }} ]
items:
  - {{ id: loaf, price: 3, unit_cost: 1, demand: {{ base: 20 }} }}
policies:
  - {{ name: a, forecast: {{ method: oracle }}, quantity: {} }}
)",
                     quantity);
}

TEST_CASE("fill_rate_target orders Q minus usable stock and units on order",
          "[policies][quantity]") {
  qty_test::PartHarness h(one_item("{ rule: fill_rate_target, level: 0.95, assume: poisson }"));
  std::vector<OrderInput> in(1);
  in[0].forecast = {20.0, 20.0};
  CHECK(h.order(3, in) == std::vector<int>{22});  // checks.md 1.4: Q = 22 at 0.95
  in[0].usable_stock = 5;
  in[0].on_order = 3;
  CHECK(h.order(3, in) == std::vector<int>{14});
  in[0].usable_stock = 30;
  CHECK(h.order(3, in) == std::vector<int>{0});
}

TEST_CASE("fill_rate_target validates its level", "[policies][quantity][validation]") {
  CHECK(qty_test::build_problems(one_item("{ rule: fill_rate_target, level: 1 }")) ==
        "p.yaml:8:89: error: policies[0].quantity.level must be in (0, 1) (got 1)\n");
  CHECK(qty_test::build_problems(one_item("{ rule: fill_rate_target }")) ==
        "p.yaml:8:56: error: policies[0].quantity needs 'level'\n"
        "  hint: give one number for every item, or a map from item id to number\n");
}

}  // namespace
}  // namespace larder
