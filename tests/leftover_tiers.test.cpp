// Discounted tiers (model.md, steps 3 and 5): next-day discount and evening markdown, by
// hand-computed steady states. Demand is a fixed 8 customers a day (a normal with a negligible
// cv rounds to 8 every day) and 10 units arrive every morning.
//
// Next-day discount, shelf life 1, take rate 1 (every customer prefers a discounted unit):
//   day 0: 10 fresh, 8 sold fresh, 2 left -> tomorrow's discounted tier
//   day 1: 2 discounted + 6 fresh sold, 4 fresh left; day 2: 4 + 4, 6 left; day 3: 6 + 2, 8 left
//   day 4: 8 discounted, 0 fresh, 10 fresh left; from day 5 on: 8 of 10 discounted units sold,
//   2 go to the fallback, all 10 fresh units become tomorrow's discounted tier.
// Take rate 0: 8 fresh sold every day, the 2 discounted units are never chosen and go to the
// fallback. Evening markdown with shelf life 2 and all customers in the markdown hours behaves
// the same way, with yesterday's units marked down instead of kept an extra day.

#include <fmt/format.h>

#include <catch2/catch.hpp>
#include <cmath>

#include "tests/fixture.hpp"

namespace larder {
namespace {

constexpr int kScored = 20;

/// Per-scored-day values (shares as they are) of a scenario with one item `item_yaml`.
MetricVector per_day(const std::string& item_yaml, double take_rate,
                     const std::string& extra = "") {
  const Scenario s = test::scenario_from(fmt::format(R"(
format: 1
name: tiers
seed: 1
horizon: {{ days: 30, warmup_days: 10 }}
replications: 2
calendar: {{ hours: {{ open: 8, close: 12 }} }}
stores: [ {{ id: s }} ]
customers: {{ discount_take_rate: {} }}
{}
items:
  - id: loaf
    price: 3
    unit_cost: 1
    demand: {{ base: 8, distribution: normal, cv: 0.000001, intraday: [0, 0, 1, 0] }}
{}
policies:
  - {{ name: ten, forecast: {{ method: oracle }}, quantity: {{ rule: fixed, quantity: 10 }} }}
)",
                                                     take_rate, extra, item_yaml));
  const RunResult r = test::run_scenario(s);
  MetricVector v = r.values[0][0];
  for (size_t k = 0; k < kMetricCount; ++k) {
    if (metric_info(static_cast<Metric>(k)).unit != "share") v[k] /= kScored;
  }
  return v;
}

TEST_CASE("next-day discount: hand-computed steady states", "[engine][tiers]") {
  const std::string item = R"(    leftovers: discount_next_day
    next_day: { price: 1, fallback: discard })";
  SECTION("every customer prefers the discounted unit") {
    const MetricVector v = per_day(item, 1.0);
    CHECK(at(v, Metric::sold_units) == 8);
    CHECK(at(v, Metric::discounted_units) == 8);
    CHECK(at(v, Metric::discount_revenue) == 8);
    CHECK(at(v, Metric::full_price_revenue) == 0);
    CHECK(at(v, Metric::revenue) == 8);
    CHECK(at(v, Metric::waste_units) == 2);
    CHECK(at(v, Metric::in_stock_at_close) == 1);  // the 10 fresh units are still there
    CHECK(at(v, Metric::profit) == 8 - 10);
  }
  SECTION("no customer takes a discounted unit while fresh ones are there") {
    const MetricVector v = per_day(item, 0.0);
    CHECK(at(v, Metric::sold_units) == 8);
    CHECK(at(v, Metric::discounted_units) == 0);
    CHECK(at(v, Metric::full_price_revenue) == 24);
    CHECK(at(v, Metric::waste_units) == 2);
    CHECK(at(v, Metric::revenue) == 24);
  }
  SECTION("the fallback disposition takes what the extra day did not sell") {
    const MetricVector v = per_day(R"(    leftovers: discount_next_day
    next_day: { price: 1, fallback: donate })",
                                   0.0);
    CHECK(at(v, Metric::waste_units) == 0);
    CHECK(at(v, Metric::donated_units) == 2);
  }
}

TEST_CASE("evening markdown: hand-computed steady states", "[engine][tiers]") {
  // Shelf life 2, all customers come in the third hour, after the markdown at 10:00.
  const std::string item = R"(    shelf_life_days: 2
    markdown: { from_hour: 10, price: 1 })";
  SECTION("every customer prefers the marked-down unit") {
    const MetricVector v = per_day(item, 1.0);
    CHECK(at(v, Metric::sold_units) == 8);
    CHECK(at(v, Metric::discounted_units) == 8);
    CHECK(at(v, Metric::discount_revenue) == 8);
    CHECK(at(v, Metric::waste_units) == 2);
  }
  SECTION("no customer prefers it: the marked-down units are wasted") {
    const MetricVector v = per_day(item, 0.0);
    CHECK(at(v, Metric::full_price_revenue) == 24);
    CHECK(at(v, Metric::discounted_units) == 0);
    CHECK(at(v, Metric::waste_units) == 2);
  }
  SECTION("shelf life 1: units left after the markdown hour sell at the markdown price") {
    // All 10 units are on their last day; from 10:00 they are marked down, and the 8 customers
    // who come then buy them whatever their preference.
    const MetricVector v = per_day(R"(    markdown: { from_hour: 10, price: 1.5 })", 0.0);
    CHECK(at(v, Metric::discounted_units) == 8);
    CHECK(at(v, Metric::discount_revenue) == 12);
    CHECK(at(v, Metric::waste_units) == 2);
  }
}

TEST_CASE("bargain-only customers buy what the discounted tier holds", "[engine][tiers]") {
  // Take rate 0: regular customers buy 8 fresh units, 2 units reach the discounted tier every
  // day. Bargain-only customers are Poisson with mean 0.5 x 8 = 4 a day, so they buy
  // E[min(2, X)] = 2 - 2 P(X = 0) - P(X = 1) = 2 - 6 e^-4 units a day (closed form).
  const std::string item = R"(    leftovers: discount_next_day
    next_day: { price: 1, bargain_demand: 0.5 })";
  const Scenario s = test::scenario_from(fmt::format(R"(
format: 1
name: bargain
seed: 8
horizon: {{ days: 210, warmup_days: 10 }}
replications: 40
stores: [ {{ id: s }} ]
customers: {{ discount_take_rate: 0 }}
items:
  - id: loaf
    price: 3
    unit_cost: 1
    demand: {{ base: 8, distribution: normal, cv: 0.000001 }}
{}
policies:
  - {{ name: ten, forecast: {{ method: oracle }}, quantity: {{ rule: fixed, quantity: 10 }} }}
)",
                                                     item));
  const RunResult r = test::run_scenario(s);
  const double exact = 2.0 - 6.0 * std::exp(-4.0);
  const Estimate e = test::metric_estimate(r, 0, Metric::discounted_units, 200);
  INFO("bargain sales per day: " << e.mean << " +- " << e.stderr_ << ", exact " << exact);
  CHECK(std::abs(e.mean - exact) <= 4.0 * e.stderr_);
  // Bargain customers are not demand: demand stays 8 a day and every one of them is served.
  CHECK(test::metric_estimate(r, 0, Metric::demand_units, 200).mean == 8.0);
  CHECK(test::metric_estimate(r, 0, Metric::fill_rate).mean == 1.0);
}

}  // namespace
}  // namespace larder
