// Calendar, delivery weekdays, lead time, shelf capacity and goodwill through the engine, on
// cases worked by hand (model.md: deliveries only on delivery weekdays and open days; orders
// arrive lead_time_days later; quantities rounded up to packs and capped by the shelf).

#include <fmt/format.h>

#include <catch2/catch.hpp>

#include "tests/fixture.hpp"

namespace larder {
namespace {

std::string one_item(const std::string& extra, const std::string& item_extra,
                     const std::string& quantity, int days = 14) {
  return fmt::format(R"(
format: 1
name: logistics
seed: 4
horizon: {{ days: {}, warmup_days: 0, start_weekday: mon }}
replications: 3
stores: [ {{ id: s }} ]
items:
  - {{ id: pie, price: 4, unit_cost: 1, demand: {{ base: 6 }} {} }}
policies:
  - {{ name: p, forecast: {{ method: oracle }}, quantity: {} }}
{}
)",
                     days, item_extra, quantity, extra);
}

double per_rep(const RunResult& r, Metric m) {
  return at(r.values[0][0], m);
}

TEST_CASE("deliveries arrive only on delivery weekdays and open days", "[engine][logistics]") {
  // Two weeks from a Monday, deliveries on Monday and Thursday: days 0, 3, 7 and 10, ten units
  // each (worked by hand).
  const auto q = "{ rule: fixed, quantity: 10 }";
  const RunResult r = test::run_scenario(test::scenario_from(
      one_item("logistics: { delivery_weekdays: [mon, thu] }", ", shelf_life_days: 3", q)));
  CHECK(per_rep(r, Metric::delivered_units) == 40);
  // Closing day 3 (a Thursday) cancels that delivery and its sales.
  const RunResult closed = test::run_scenario(
      test::scenario_from(one_item("logistics: { delivery_weekdays: [mon, thu] }\n"
                                   "calendar: { events: [ { day: 3, closed: true } ] }",
                                   ", shelf_life_days: 3", q)));
  CHECK(per_rep(closed, Metric::delivered_units) == 30);
  // No sales on the closed day: the 13 open days sell what the 14 did, or less.
  CHECK(per_rep(closed, Metric::sold_units) <= per_rep(r, Metric::sold_units));
}

TEST_CASE("a delivery covers the days until the next one (within the shelf life)",
          "[engine][logistics]") {
  // Oracle Poisson(6) demand, deliveries Monday and Thursday, shelf life 3: a Monday
  // delivery serves Mon-Wed (3 days, mean 18), a Thursday one Thu-Sat (3 days; Sunday is
  // beyond its life). base_stock orders level - stock, so use in_stock_target on the window:
  // the smallest Q with P(D_window <= Q - 1) >= 0.5 for D_window ~ Poisson(18) is
  // 18 + 1 = 19 (median of Poisson(18) is 18; worked from the Poisson cdf, F(17) = 0.4686,
  // F(18) = 0.5622).
  const RunResult r = test::run_scenario(test::scenario_from(
      one_item("logistics: { delivery_weekdays: [mon, thu] }", ", shelf_life_days: 3",
               "{ rule: in_stock_target, level: 0.5, assume: poisson }", 7)));
  // Week one: Monday's opening order 19; Thursday's order 19 minus usable stock left from
  // Monday (its units expire Wednesday night, so none are usable on Thursday).
  CHECK(per_rep(r, Metric::delivered_units) == 38);
}

TEST_CASE("lead time 2: opening orders fill the pipeline, then one delivery a day",
          "[engine][logistics]") {
  const RunResult r = test::run_scenario(test::scenario_from(
      one_item("logistics: { lead_time_days: 2 }", "", "{ rule: fixed, quantity: 7 }")));
  CHECK(per_rep(r, Metric::delivered_units) == 7 * 14);
}

TEST_CASE("orders round up to packs, then the shelf capacity caps them in whole packs",
          "[engine][logistics]") {
  // 50 wanted, capacity 30, packs of 4: floor(30 / 4) * 4 = 28 a day; 9 wanted: 12.
  const RunResult capped = test::run_scenario(test::scenario_from(
      one_item("", ", shelf_capacity: 30, pack_size: 4", "{ rule: fixed, quantity: 50 }")));
  CHECK(per_rep(capped, Metric::delivered_units) == 28 * 14);
  const RunResult packed = test::run_scenario(
      test::scenario_from(one_item("", ", pack_size: 4", "{ rule: fixed, quantity: 9 }")));
  CHECK(per_rep(packed, Metric::delivered_units) == 12 * 14);
}

TEST_CASE("customers and units are conserved with shocks, lead time and multi-day life",
          "[engine][logistics]") {
  const Scenario s = test::scenario_from(R"(
format: 1
name: conservation
seed: 8
horizon: { days: 200, warmup_days: 0 }
replications: 6
stores: [ { id: a, size: 1.4 }, { id: b } ]
demand_shocks: { store_traffic_cv: 0.2, persistence: { lag: 7, coefficient: 0.5, cv: 0.2 } }
logistics: { lead_time_days: 2, delivery_weekdays: [mon, tue, thu, fri, sat] }
items:
  - { id: a, price: 3, unit_cost: 1, shelf_life_days: 3, demand: { base: 12 } }
  - { id: b, price: 2, unit_cost: 1, leftovers: donate, demand: { base: 30, distribution: negative_binomial, cv: 0.4 } }
policies:
  - name: p
    forecast: { method: ses_weekday }
    quantity: { rule: in_stock_target, level: 0.8 }
)");
  const RunResult r = test::run_scenario(s);
  for (const MetricVector& v : r.values[0]) {
    // Every primary customer is served or lost (no substitution).
    CHECK(at(v, Metric::demand_units) == at(v, Metric::sold_units) + at(v, Metric::lost_units));
    // Units delivered leave by sale, waste or donation, or are still on the shelf at the end
    // (at most one delivery's worth per item and day of life, so the gap is small but >= 0).
    const double out = at(v, Metric::sold_units) + at(v, Metric::waste_units) +
                       at(v, Metric::donated_units) + at(v, Metric::salvaged_units);
    CHECK(at(v, Metric::delivered_units) >= out);
    CHECK(at(v, Metric::delivered_units) - out < 0.02 * at(v, Metric::delivered_units));
  }
}

TEST_CASE("goodwill: stockouts erode demand, ample stock leaves it untouched",
          "[engine][goodwill]") {
  const std::string base = R"(
format: 1
name: goodwill
seed: 12
horizon: { days: 300, warmup_days: 0 }
replications: 8
stores: [ { id: s } ]
items:
  - { id: loaf, price: 3, unit_cost: 1, demand: { base: 20 } }
policies:
  - { name: ample, forecast: { method: oracle }, quantity: { rule: fixed, quantity: 80 } }
  - { name: starved, forecast: { method: oracle }, quantity: { rule: fixed, quantity: 14 } }
)";
  const RunResult off = test::run_scenario(test::scenario_from(base));
  const RunResult on = test::run_scenario(test::scenario_from(
      base + "customers: { goodwill: { sensitivity: 0.8, half_life_days: 7 } }\n"));
  // Never out of stock (P(Poisson(20) > 80) is negligible): goodwill stays 1, so the counts
  // are the same draws as without goodwill (common random numbers).
  CHECK(on.series(0, Metric::demand_units) == off.series(0, Metric::demand_units));
  // Out of stock most days: demand falls well below the unaffected level.
  const Estimate lost = estimate_paired_difference(on.series(1, Metric::demand_units),
                                                   off.series(1, Metric::demand_units));
  CHECK(lost.ci_high < 0.0);
  CHECK(lost.mean < -0.05 * at(off.values[1][0], Metric::demand_units));
}

}  // namespace
}  // namespace larder

namespace larder {
namespace {

TEST_CASE("with lead time 2, one-day items do not count units that expire before arrival",
          "[engine][logistics]") {
  // Poisson(20), shelf life 1, lead time 2, the oracle newsvendor with CR 2/3: every delivery
  // day must receive Q* = 22 (checks.md 1.4), since yesterday's order expires before the day
  // it is ordered for.
  const RunResult r = test::run_scenario(test::scenario_from(R"(
format: 1
name: lead2
seed: 2
horizon: { days: 50, warmup_days: 0 }
replications: 2
stores: [ { id: s } ]
logistics: { lead_time_days: 2 }
items:
  - { id: loaf, price: 3, unit_cost: 1, demand: { base: 20 } }
policies:
  - { name: nv, forecast: { method: oracle }, quantity: { rule: critical_fractile, assume: poisson } }
)"));
  CHECK(at(r.values[0][0], Metric::delivered_units) == 22 * 50);
}

}  // namespace
}  // namespace larder
