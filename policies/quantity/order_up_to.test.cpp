// order_up_to: the EWA outdating estimate and the rule on cases worked by hand, the shelf
// life 1 case against the plain quantile rule and Boost.Math quantiles (checks.md 1.6, 5.3).

#include "policies/quantity/order_up_to.hpp"

#include <fmt/format.h>

#include <boost/math/distributions/poisson.hpp>
#include <catch2/catch.hpp>

#include "policies/quantity/fractile_rule.hpp"
#include "policies/quantity/part_fixture.test.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

using qty_test::poisson_quantile;

DemandFamily family_named(const std::string& name) {
  if (name == "normal") return DemandFamily::normal;
  return name == "poisson" ? DemandFamily::poisson : DemandFamily::negative_binomial;
}

TEST_CASE("expected_outdating runs mean withdrawals through the stock by age (hand-worked)",
          "[policies][quantity]") {
  const std::vector<double> two_days = {6.0, 6.0};
  // Shelf life 3; 10 units on their last day tomorrow (slot 0), an order of 5 arriving
  // tomorrow; 6 sold per day. FIFO: the 6 come from the old units, 4 old units outdate at the
  // close of day 0; what happens on the last day does not count.
  const std::vector<std::int32_t> old_stock = {10, 0, 0};
  const std::vector<std::int32_t> order5 = {5, 0};
  CHECK(expected_outdating(old_stock, order5, 3, two_days, 1.0) == Approx(4.0).margin(1e-12));
  // Half the shoppers take the freshest: 3 from the old units, 3 from the order: 7 outdate.
  CHECK(expected_outdating(old_stock, order5, 3, two_days, 0.5) == Approx(7.0).margin(1e-12));
  // LIFO with no order: the old units are all there is, 6 sold, 4 outdate; with an order of
  // 10 every sale takes a fresh unit and all 10 old units outdate.
  const std::vector<std::int32_t> none = {0, 0};
  const std::vector<std::int32_t> order10 = {10, 0};
  CHECK(expected_outdating(old_stock, none, 3, two_days, 0.0) == Approx(4.0).margin(1e-12));
  CHECK(expected_outdating(old_stock, order10, 3, two_days, 0.0) == Approx(10.0).margin(1e-12));
  // The same 10 units with two days to live (slot 1) sell out over the period: nothing is
  // lost before its end (FIFO: 6 on day 0, 4 of the remaining on day 1).
  const std::vector<std::int32_t> younger = {0, 10, 0};
  CHECK(expected_outdating(younger, order5, 3, two_days, 1.0) == Approx(0.0).margin(1e-12));
  // One day only: outdating at the close of the last day never counts.
  const std::vector<double> one_day = {0.0};
  CHECK(expected_outdating(old_stock, none, 3, one_day, 1.0) == 0.0);
}

std::string perishable(int life, double fifo, int lead, const std::string& quantity) {
  return fmt::format(R"(format: 1
name: t
seed: 1
stores: [ {{ id: s }} ]
customers: {{ fifo_share: {} }}
logistics: {{ lead_time_days: {} }}
items:
  - {{ id: milk, price: 2, unit_cost: 1, shelf_life_days: {}, demand: {{ base: 6 }} }}
policies:
  - {{ name: a, forecast: {{ method: oracle }}, quantity: {} }}
)",
                     fifo, lead, life, quantity);
}

TEST_CASE("order_up_to: old stock that expires tomorrow raises the order (hand-worked EWA)",
          "[policies][quantity]") {
  // Lead time 1, shelf life 3, review_days 2: the order arriving tomorrow (day a) serves days
  // a and a + 1. Demand Poisson with mean 6 a day, so the period's demand is Poisson(12) and
  // S = smallest k with F(k) >= 0.8 = 15 (Boost; F(14) = 0.772, F(15) = 0.844).
  REQUIRE(poisson_quantile(12.0, 0.8) == 15);
  const qty_test::ConstantForecaster six(6.0, 6.0);
  std::vector<OrderInput> in(1);
  in[0].forecast = {6.0, 6.0};
  const std::vector<std::int32_t> no_pipeline = {0};
  in[0].pipeline = no_pipeline;
  SECTION("FIFO shoppers") {
    qty_test::PartHarness h(perishable(
        3, 1.0, 1, "{ rule: order_up_to, level: 0.8, review_days: 2, assume: poisson }"));
    // 10 units with two days to live: all can be sold in the period; order 15 - 10 = 5.
    const std::vector<std::int32_t> young = {0, 10, 0};
    in[0].stock_by_age = young;
    in[0].usable_stock = 10;
    CHECK(h.order(20, in, &six) == std::vector<int>{5});
    // The same 10 units on their last day tomorrow: 6 sold tomorrow, 4 outdate before day
    // a + 1, so the order is 15 - 10 + 4 = 9.
    const std::vector<std::int32_t> old = {10, 0, 0};
    in[0].stock_by_age = old;
    CHECK(h.order(20, in, &six) == std::vector<int>{9});
  }
  SECTION("half the shoppers take the freshest unit") {
    qty_test::PartHarness h(perishable(
        3, 0.5, 1, "{ rule: order_up_to, level: 0.8, review_days: 2, assume: poisson }"));
    // Tomorrow 3 sales come from the old units and 3 from the new delivery (as long as it has
    // 3), so 7 old units outdate: first round Q = 5, then Q = 15 - 10 + 7 = 12, which repeats.
    const std::vector<std::int32_t> old = {10, 0, 0};
    in[0].stock_by_age = old;
    in[0].usable_stock = 10;
    CHECK(h.order(20, in, &six) == std::vector<int>{12});
  }
}

TEST_CASE("order_up_to covers the lead-time days and the outdating before arrival (hand-worked)",
          "[policies][quantity]") {
  // Lead time 2, shelf life 2, review_days 1: an order placed on day t arrives on t + 2 and
  // covers days t + 1 and t + 2; mean demand 5 a day, so S = Poisson(10) quantile at 0.8 = 13
  // (Boost; F(12) = 0.792, F(13) = 0.865). FIFO. 3 units arrive on t + 1.
  REQUIRE(poisson_quantile(10.0, 0.8) == 13);
  qty_test::PartHarness h(
      perishable(2, 1.0, 2, "{ rule: order_up_to, level: 0.8, assume: poisson }"));
  const qty_test::ConstantForecaster five(5.0, 5.0);
  std::vector<OrderInput> in(1);
  in[0].forecast = {5.0, 5.0};
  const std::vector<std::int32_t> pipeline = {3, 0};
  in[0].pipeline = pipeline;
  in[0].on_order = 3;
  // 4 units on their last day on t + 1: the 5 sales that day take them and 1 of the 3 new
  // ones; nothing outdates early. Q = 13 - (4 + 3) = 6.
  const std::vector<std::int32_t> four = {4, 0};
  in[0].stock_by_age = four;
  CHECK(h.order(30, in, &five) == std::vector<int>{6});
  // 8 such units: 5 sold on t + 1, 3 outdate at its close. Q = 13 - (8 + 3) + 3 = 5.
  const std::vector<std::int32_t> eight = {8, 0};
  in[0].stock_by_age = eight;
  CHECK(h.order(30, in, &five) == std::vector<int>{5});
}

TEST_CASE("order_up_to with shelf life 1 is the plain quantile rule (FractileRule, Boost)",
          "[policies][quantity]") {
  for (const char* family : {"poisson", "negative_binomial", "normal"}) {
    DYNAMIC_SECTION(family) {
      qty_test::PartHarness h(perishable(
          1, 0.5, 1, fmt::format("{{ rule: order_up_to, review_days: 3, assume: {} }}", family)));
      const DemandFamily f = family_named(family);
      FractileRule plain({0.8}, {f}, 0, h.scenario());
      const std::vector<std::int32_t> empty_shelf = {0};
      const std::vector<std::int32_t> no_pipeline = {0};
      for (double mean : {0.0, 3.5, 20.0, 64.0}) {
        std::vector<OrderInput> in(1);
        in[0].forecast = {mean, 2.0 * mean};
        in[0].stock_by_age = empty_shelf;
        in[0].pipeline = no_pipeline;
        std::vector<int> expected(1);
        const OrderContext ctx{h.view(), 5, 6};
        plain.decide(ctx, in, expected);
        const qty_test::ConstantForecaster other(1000.0, 1000.0);  // must not be used
        CHECK(h.order(5, in, &other) == expected);
      }
    }
  }
  // The default level is 0.8: Poisson(20) gives 24 (Boost; F(23) = 0.787, F(24) = 0.843).
  qty_test::PartHarness h(perishable(1, 0.5, 1, "{ rule: order_up_to, assume: poisson }"));
  std::vector<OrderInput> in(1);
  in[0].forecast = {20.0, 20.0};
  CHECK(h.order(5, in) == std::vector<int>{poisson_quantile(20.0, 0.8)});
  CHECK(poisson_quantile(20.0, 0.8) == 24);
}

TEST_CASE("order_up_to validates its parameters", "[policies][quantity][validation]") {
  CHECK(qty_test::build_problems(perishable(2, 1.0, 1, "{ rule: order_up_to, review_days: 0 }")) ==
        "p.yaml:10:90: error: policies[0].quantity.review_days must be in [1, 364] (got 0)\n");
}

TEST_CASE("order_up_to in the engine matches the exact perishable chain (checks.md 5.2)",
          "[policies][quantity][engine]") {
  // Lead time 1, shelf life 2, FIFO, review_days 1: the period is the arrival day and nothing
  // can outdate before it ends, so the rule orders up to S = Poisson(5) quantile at 0.8 = 7
  // (Boost; F(6) = 0.762, F(7) = 0.867): the chain of checks.md 5.2 [C], row m = 2, FIFO, S = 7.
  REQUIRE(poisson_quantile(5.0, 0.8) == 7);
  constexpr int kDays = 2000;
  constexpr int kWarmup = 50;
  const Scenario s = test::scenario_from(fmt::format(R"(format: 1
name: chain
seed: 5
horizon: {{ days: {}, warmup_days: {} }}
replications: 20
stores: [ {{ id: s }} ]
customers: {{ fifo_share: 1 }}
items:
  - {{ id: milk, price: 2, unit_cost: 1, shelf_life_days: 2, demand: {{ base: 5 }} }}
policies:
  - {{ name: a, forecast: {{ method: oracle }}, quantity: {{ rule: order_up_to, assume: poisson }} }}
)",
                                                     kDays, kWarmup));
  const RunResult r = test::run_scenario(s);
  const double days = kDays - kWarmup;
  const struct {
    Metric metric;
    double exact;
  } rows[] = {{Metric::sold_units, 4.744519},
              {Metric::lost_units, 0.255481},
              {Metric::waste_units, 0.179554},
              {Metric::delivered_units, 4.924073}};
  for (const auto& row : rows) {
    const Estimate e = test::metric_estimate(r, 0, row.metric, days);
    INFO(metric_name(row.metric) << ": simulated " << e.mean << " +- " << e.stderr_ << ", exact "
                                 << row.exact);
    CHECK(std::abs(e.mean - row.exact) <= 4.0 * e.stderr_ + 1e-6);  // table: 6 decimals
  }
}

}  // namespace
}  // namespace larder
