// Time of day in the engine (model.md, steps 2-3): the one-bucket and hourly paths agree when
// no feature depends on the hour, and the recorded sell-out time matches the Poisson process
// it comes from.

#include <boost/math/distributions/poisson.hpp>
#include <catch2/catch.hpp>
#include <cmath>
#include <limits>

#include "sim/engine/demand_model.hpp"
#include "sim/engine/store_run.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

// Multi-day shelf life with mixed picking, a next-day discount tier, closed Sundays, a
// calendar event, lead time 2 with delivery weekdays, traffic shocks, persistence and
// goodwill: everything the day loop does without depending on the hour.
constexpr const char* kNoTimeOfDay = R"(
format: 1
name: no-time-of-day
seed: 99
horizon: { days: 120, warmup_days: 14 }
replications: 6
calendar:
  open_weekdays: [mon, tue, wed, thu, fri, sat]
  events: [ { day: 40, demand: 1.8 }, { day: 41, closed: true } ]
stores: [ { id: a, size: 1.2 }, { id: b, size: 0.7 } ]
customers: { fifo_share: 0.4, discount_take_rate: 0.35, goodwill: { sensitivity: 0.3 } }
demand_shocks: { store_traffic_cv: 0.1, persistence: { lag: 7, coefficient: 0.4, cv: 0.2 } }
logistics: { lead_time_days: 2, delivery_weekdays: [mon, wed, fri] }
items:
  - { id: roll, price: 1, unit_cost: 0.3, demand: { base: 30, distribution: negative_binomial, cv: 0.4 } }
  - { id: milk, price: 2, unit_cost: 0.9, shelf_life_days: 4, leftovers: donate, demand: { base: 12 } }
  - id: loaf
    price: 3
    unit_cost: 1
    shelf_life_days: 2
    leftovers: discount_next_day
    next_day: { price: 1.5, fallback: salvage }
    salvage_value: 0.2
    demand: { base: 9, intraday: evening_peak }
policies:
  - name: smooth
    forecast: { method: ses_weekday, alpha: 0.3 }
    quantity: { rule: order_up_to, level: 0.8 }
  - name: fixed
    forecast: { method: oracle }
    quantity: { rule: fixed, quantity: 25 }
)";

std::vector<std::vector<MetricVector>> values_with(const Scenario& s, DayDetail detail,
                                                   int threads = 1) {
  RunOptions o;
  o.threads = threads;
  o.detail = detail;
  return run_policies(s, test::policies_for(s), o).values;
}

TEST_CASE(
    "hourly, one-bucket and daily paths give identical metrics without time-of-day "
    "features",
    "[engine][intraday]") {
  const Scenario with_tier = test::scenario_from(kNoTimeOfDay);
  const auto one = values_with(with_tier, DayDetail::automatic);  // one bucket: a tier
  CHECK(one == values_with(with_tier, DayDetail::hourly));
  CHECK(one == values_with(with_tier, DayDetail::hourly, 2));

  Scenario plain = with_tier;
  plain.items.pop_back();  // no discounted tier: the plain daily loop
  const auto daily = values_with(plain, DayDetail::automatic);
  CHECK(daily == values_with(plain, DayDetail::one_bucket));
  CHECK(daily == values_with(plain, DayDetail::hourly));
}

TEST_CASE("stock and customers are conserved on every path", "[engine][intraday]") {
  // delivered = sold + wasted + salvaged + donated + stock left; demand = served by the item +
  // served by a substitute + lost. Scored from day 0 so the tallies cover every day.
  Scenario s = test::scenario_from(kNoTimeOfDay);
  s.horizon.warmup_days = 0;
  s.items[0].substitutes = {{1, 0.3}, {2, 0.5}};
  s.items[2].markdown = Markdown{17, 2.0, 0.25};
  const auto policies = test::policies_for(s);
  const DemandModel demand(s);
  for (const DayDetail d : {DayDetail::automatic, DayDetail::hourly}) {
    const SimSetup setup{s, demand, policies, 5, d};
    for (int store = 0; store < 2; ++store) {
      StoreRun run(setup, 0, store);
      run.run_days(0, s.horizon.days);
      CHECK(run.buckets() == 12);  // substitution and markdown need the hours
      for (int p = 0; p < 2; ++p) {
        std::int64_t demand_total = 0;
        std::int64_t served = 0;
        for (int i = 0; i < 3; ++i) {
          const Tally& t = run.tallies(p)[static_cast<size_t>(i)];
          INFO("store " << store << " policy " << p << " item " << i);
          CHECK(t.delivered ==
                t.sold() + t.wasted + t.salvaged + t.donated + run.units_on_hand(p, i));
          demand_total += t.demand;
          served += t.served_by_item + t.substitute + t.lost;
        }
        CHECK(demand_total == served);
      }
    }
  }
}

TEST_CASE("the sell-out time is that of the Poisson process of customers", "[engine][intraday]") {
  // With Poisson(lambda) customers a day spread evenly over H hours and Q units, the stock runs
  // out at the Q-th arrival T ~ Gamma(Q, lambda / H), on days with D >= Q. Then
  // E[T; T <= H] = (Q H / lambda) P(Poisson(lambda) >= Q + 1) (the Gamma-Poisson identity,
  // e.g. Ross, Introduction to Probability Models, ch. 5; from memory). The engine records
  // E[T | the hour's count], so the means agree exactly; values from Boost.Math.
  constexpr double kLambda = 10.0;
  constexpr int kQ = 8;
  constexpr int kDays = 40000;
  const Scenario s = test::scenario_from(R"(
format: 1
name: sellout
seed: 3
horizon: { days: 40000, warmup_days: 0 }
calendar: { hours: { open: 8, close: 20 } }
stores: [ { id: s } ]
items: [ { id: bun, price: 1, unit_cost: 0.5, demand: { base: 10 } } ]
policies:
  - { name: watch, observe: intraday, forecast: { method: oracle }, quantity: { rule: fixed, quantity: 8 } }
)");
  const auto policies = test::policies_for(s);
  const DemandModel demand(s);
  const SimSetup setup{s, demand, policies, s.seed};
  StoreRun run(setup, 0, 0);
  double sum = 0.0;
  double sum_sq = 0.0;
  int sold_out = 0;
  for (int day = 0; day < kDays; ++day) {
    run.run_days(day, day + 1);
    const Observation& o = run.observations(0)[0];
    double t = 0.0;
    if (o.sold_out) {
      REQUIRE(!std::isnan(o.sellout_hour));
      REQUIRE(o.sellout_hour >= 0.0f);
      REQUIRE(o.sellout_hour <= 12.0f);
      t = o.sellout_hour;
      ++sold_out;
    } else {
      REQUIRE(std::isnan(o.sellout_hour));
    }
    sum += t;
    sum_sq += t * t;
  }
  const boost::math::poisson_distribution<double> d(kLambda);
  const double exact = kQ * 12.0 / kLambda * cdf(complement(d, kQ));  // P(D >= Q + 1)
  const double mean = sum / kDays;
  const double se = std::sqrt((sum_sq / kDays - mean * mean) / kDays);
  INFO("E[T; sold out]: simulated " << mean << " +- " << se << ", exact " << exact);
  CHECK(std::abs(mean - exact) <= 4.0 * se);
  const double p_out = cdf(complement(d, kQ - 1));  // P(D >= Q)
  CHECK(std::abs(sold_out / double(kDays) - p_out) <= 4.0 * std::sqrt(p_out * (1 - p_out) / kDays));
}

}  // namespace
}  // namespace larder
