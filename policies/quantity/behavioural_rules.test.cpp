// pull_to_center and leftover_aversion against their closed forms (checks.md 7.2) and Boost.Math
// quantiles (checks.md 1.6), on the economics of checks.md 1.4 (p = 3, c = 1: CR = 2/3, Q* = 22
// for Poisson(20)).

#include <fmt/format.h>

#include <boost/math/distributions/normal.hpp>
#include <boost/math/distributions/poisson.hpp>
#include <catch2/catch.hpp>

#include "policies/quantity/critical_fractile.hpp"
#include "policies/quantity/leftover_aversion.hpp"
#include "policies/quantity/part_fixture.test.hpp"
#include "policies/quantity/pull_to_center.hpp"

namespace larder {
namespace {

using qty_test::poisson_quantile;

std::string one_item(const std::string& item, const std::string& quantity) {
  return fmt::format(R"(format: 1
name: t
seed: 1
stores: [ {{ id: s }} ]
items:
  - {{ id: loaf, {}, demand: {{ base: 20 }} }}
policies:
  - {{ name: a, forecast: {{ method: oracle }}, quantity: {} }}
)",
                     item, quantity);
}

std::vector<OrderInput> forecast(double mean, double variance, int usable = 0, int on_order = 0) {
  std::vector<OrderInput> in(1);
  in[0].forecast = {mean, variance};
  in[0].usable_stock = usable;
  in[0].on_order = on_order;
  return in;
}

TEST_CASE("pull_to_center moves Q* toward the mean by exactly the share w (checks.md 7.2 (i))",
          "[policies][quantity]") {
  // Q = (1 - w) Q* + w mu, so Q* - Q = w (Q* - mu) for every w, above or below the mean.
  for (double q_star : {22.0, 14.0, 100.0}) {
    for (double w : {0.0, 0.1, 0.3, 0.5, 1.0}) {
      const double q = pull_to_center_target(20.0, q_star, w);
      CHECK(q_star - q == Approx(w * (q_star - 20.0)).margin(1e-12));
    }
  }
  CHECK(pull_to_center_target(20.0, 22.0, 0.3) == Approx(21.4).epsilon(1e-15));
}

TEST_CASE("pull_to_center orders the anchored quantity rounded to the nearest unit",
          "[policies][quantity]") {
  const std::string high_margin = "price: 3, unit_cost: 1";
  // checks.md 1.4: Q* = 22 for Poisson(20) at CR 2/3 (scipy poisson.ppf(2/3, 20)).
  REQUIRE(poisson_quantile(20.0, 2.0 / 3.0) == 22);
  const auto order = [&](const std::string& item, const std::string& w, int usable = 0) {
    qty_test::PartHarness h(
        one_item(item, fmt::format("{{ rule: pull_to_center, assume: poisson{} }}", w)));
    return h.order(0, forecast(20.0, 20.0, usable))[0];
  };
  CHECK(order(high_margin, "") == 21);             // default w = 0.3: 21.4 -> 21
  CHECK(order(high_margin, ", w: 0.25") == 22);    // 21.5 -> 22 (halves round up)
  CHECK(order(high_margin, ", w: 0") == 22);       // the newsvendor
  CHECK(order(high_margin, ", w: 1") == 20);       // the mean
  CHECK(order(high_margin, ", w: 0.3", 8) == 13);  // target 21 less 8 in stock
  // A low-margin item (p = 3, c = 2.5: CR = 1/6) is pulled up toward the mean.
  const int low_q = poisson_quantile(20.0, 0.5 / 3.0);
  REQUIRE(low_q < 20);
  CHECK(order("price: 3, unit_cost: 2.5", ", w: 0.5") ==
        static_cast<int>(std::floor(0.5 * 20.0 + 0.5 * low_q + 0.5)));
}

TEST_CASE("pull_to_center validates w", "[policies][quantity][validation]") {
  CHECK(qty_test::build_problems(
            one_item("price: 3, unit_cost: 1", "{ rule: pull_to_center, w: 1.5 }")) ==
        "p.yaml:8:83: error: policies[0].quantity.w must be in [0, 1] (got 1.5)\n");
}

Item item(double price, double cost) {
  Item it;
  it.price = price;
  it.unit_cost = cost;
  return it;
}

TEST_CASE("leftover_aversion ratio is cu / (cu + co + cost) (Ho, Lim and Cui; checks.md 7.2)",
          "[policies][quantity]") {
  const Scenario plain;  // shelf life 1, lead time 1: the one-day newsvendor
  // cu = 2, co = 1 (checks.md 1.4): no psychological cost gives the critical ratio 2/3.
  CHECK(leftover_aversion_ratio(plain, item(3, 1), 0.0, 0.0, 0.0) ==
        Approx(critical_ratio(plain, item(3, 1), 0.0)).epsilon(1e-15));
  CHECK(leftover_aversion_ratio(plain, item(3, 1), 0.0, 1.0, 0.0) ==
        Approx(2.0 / 4.0).epsilon(1e-15));
  CHECK(leftover_aversion_ratio(plain, item(3, 1), 0.0, 3.0, 0.0) ==
        Approx(2.0 / 6.0).epsilon(1e-15));
  // With a stockout cost delta_u as well: (cu + du) / (cu + co + du + do).
  CHECK(leftover_aversion_ratio(plain, item(3, 1), 0.0, 1.0, 0.5) ==
        Approx(2.5 / 4.5).epsilon(1e-15));
  // The penalty g raises cu: (2 + 1) / (2 + 1 + 1 + 1).
  CHECK(leftover_aversion_ratio(plain, item(3, 1), 1.0, 1.0, 0.0) ==
        Approx(3.0 / 5.0).epsilon(1e-15));
  // The ratio falls as the cost rises.
  double last = 1.0;
  for (double cost : {0.0, 0.5, 1.0, 2.0, 5.0}) {
    const double r = leftover_aversion_ratio(plain, item(3, 1), 0.0, cost, 0.0);
    CHECK(r < last);
    last = r;
  }
}

TEST_CASE("leftover_aversion orders the quantile at the lowered ratio (Boost)",
          "[policies][quantity]") {
  const auto order = [](const std::string& quantity, std::vector<OrderInput> in) {
    qty_test::PartHarness h(one_item("price: 3, unit_cost: 1", quantity));
    return h.order(0, in)[0];
  };
  // cost 1: CR = 1/2, Poisson(20) median 20 (Boost) instead of the newsvendor's 22.
  CHECK(order("{ rule: leftover_aversion, cost: 1, assume: poisson }", forecast(20, 20)) ==
        poisson_quantile(20.0, 0.5));
  CHECK(poisson_quantile(20.0, 0.5) == 20);
  CHECK(order("{ rule: leftover_aversion, cost: 3, assume: poisson }", forecast(20, 20, 4, 2)) ==
        poisson_quantile(20.0, 1.0 / 3.0) - 6);
  // Normal: smallest Q with Phi((Q + 0.5 - mean) / sd) >= CR, z from Boost's quantile.
  const boost::math::normal_distribution<double> n;
  const double x = 100.0 + 30.0 * boost::math::quantile(n, 2.0 / 6.0) - 0.5;
  CHECK(order("{ rule: leftover_aversion, cost: 3, assume: normal }", forecast(100, 900)) ==
        static_cast<int>(std::ceil(x)));
}

TEST_CASE("leftover_aversion needs a cost", "[policies][quantity][validation]") {
  CHECK(
      qty_test::build_problems(one_item("price: 3, unit_cost: 1", "{ rule: leftover_aversion }")) ==
      "p.yaml:8:56: error: policies[0].quantity needs 'cost'\n"
      "  hint: give one number for every item, or a map from item id to number\n");
  CHECK(qty_test::build_problems(
            one_item("price: 3, unit_cost: 1", "{ rule: leftover_aversion, cost: -1 }")) ==
        "p.yaml:8:89: error: policies[0].quantity.cost must be >= 0 (got -1)\n");
}

}  // namespace
}  // namespace larder
