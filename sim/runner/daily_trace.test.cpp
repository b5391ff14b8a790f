// The daily trace against cases worked by hand (a fixed order of a one-day item: delivered Q,
// sold min(D, Q), the rest wasted) and against the run itself: over the scored days its sums
// are the run's own metrics for replication 0, so the trace shows the days the run scored.

#include "sim/runner/daily_trace.hpp"

#include <catch2/catch.hpp>

#include "tests/fixture.hpp"

namespace larder {
namespace {

const char* kTwoStores = R"(
format: 1
name: trace
seed: 5
horizon: { days: 30, warmup_days: 7 }
replications: 2
stores: [ { id: corner }, { id: other } ]
items:
  - { id: bun, price: 1, unit_cost: 0.4, demand: { base: 6 } }
  - { id: loaf, price: 3, unit_cost: 1, demand: { base: 20 } }
policies:
  - { name: eighteen, forecast: { method: oracle }, quantity: { rule: fixed, quantity: 18 } }
  - { name: forty, forecast: { method: oracle }, quantity: { rule: fixed, quantity: 40 } }
)";

TEST_CASE("daily_trace follows the busiest item of the first store, worked by hand",
          "[html][trace]") {
  const Scenario s = test::scenario_from(kTwoStores);
  const std::vector<Policy> policies = test::policies_for(s);
  CHECK(traced_item(s) == 1);  // loaf: base 20 > 6
  const DailyTrace t = daily_trace(s, policies);
  CHECK(t.store == "corner");
  CHECK(t.item == "loaf");
  CHECK(t.replication == 0);
  CHECK(t.warmup_days == 7);
  CHECK(t.left_out.empty());
  REQUIRE(t.traces.size() == 2);
  CHECK(t.traces[0].policy == "eighteen");
  REQUIRE(t.traces[0].days.size() == 30);  // min(42, 30)
  int busy_days = 0;
  for (std::size_t d = 0; d < 30; ++d) {
    for (const auto& [k, q] : {std::pair{0, 18}, std::pair{1, 40}}) {
      const TraceDay& x = t.traces[static_cast<size_t>(k)].days[d];
      INFO("day " << d << ", order " << q);
      CHECK(x.open);
      CHECK(x.delivered == q);  // lead time 1 and the opening order: Q arrives every day
      CHECK(x.sold == std::min(x.demand, q));
      CHECK(x.leftover == q - x.sold);
      CHECK(x.wasted == x.leftover);  // a one-day item: every unit left at close is discarded
      CHECK(x.salvaged + x.donated == 0);
    }
    // Common random numbers: both policies meet the same customers.
    CHECK(t.traces[0].days[d].demand == t.traces[1].days[d].demand);
    busy_days += t.traces[0].days[d].demand > 18 ? 1 : 0;
  }
  // The case must exercise both branches of min(D, 18) for Poisson(20): P(D > 18) = 0.62.
  CHECK(busy_days > 5);
  CHECK(busy_days < 29);
  // Another replication meets other customers.
  const DailyTrace other = daily_trace(s, policies, 1);
  int differ = 0;
  for (std::size_t d = 0; d < 30; ++d) {
    differ += other.traces[0].days[d].demand != t.traces[0].days[d].demand ? 1 : 0;
  }
  CHECK(differ > 10);
}

TEST_CASE("daily_trace sums over the scored days are the run's own metrics", "[html][trace]") {
  // One store and one item, so the run's metrics are those of the traced store-item; a
  // two-day shelf life with mixed picking takes the shelf path, and a learning policy.
  const Scenario s = test::scenario_from(R"(
format: 1
name: trace-vs-run
seed: 11
horizon: { days: 40, warmup_days: 9 }
replications: 2
stores: [ { id: only } ]
items:
  - { id: pie, price: 4, unit_cost: 1.5, shelf_life_days: 2, demand: { base: 12, weekday: { sat: 1.6 } } }
policies:
  - { name: learner, forecast: { method: ses_weekday, alpha: 0.2 }, quantity: { rule: critical_fractile } }
  - { name: fixed, forecast: { method: oracle }, quantity: { rule: fixed, quantity: 14 } }
)");
  const std::vector<Policy> policies = test::policies_for(s);
  const RunResult run = run_policies(s, policies, RunOptions{});
  const DailyTrace t = daily_trace(s, policies);
  REQUIRE(t.traces.size() == 2);
  for (std::size_t p = 0; p < 2; ++p) {
    double demand = 0, sold = 0, wasted = 0, delivered = 0;
    for (std::size_t d = 9; d < 40; ++d) {
      const TraceDay& x = t.traces[p].days[d];
      demand += x.demand;
      sold += x.sold;
      wasted += x.wasted;
      delivered += x.delivered;
    }
    const MetricVector& m = run.values[p][0];
    INFO(t.traces[p].policy);
    CHECK(demand == at(m, Metric::demand_units));
    CHECK(sold == at(m, Metric::sold_units));
    CHECK(wasted == at(m, Metric::waste_units));
    CHECK(delivered == at(m, Metric::delivered_units));
    CHECK(wasted > 0);  // the case says something
  }
}

TEST_CASE("daily_trace leaves network-planned policies out and names them", "[html][trace]") {
  const Scenario s = test::scenario_from(R"(
format: 1
name: trace-network
seed: 3
horizon: { days: 60, warmup_days: 7 }
replications: 1
stores: [ { id: a }, { id: b } ]
items:
  - { id: roll, price: 1.5, unit_cost: 0.4, demand: { base: 30 } }
policies:
  - { name: fixed, forecast: { method: oracle }, quantity: { rule: fixed, quantity: 30 } }
  - { name: net, forecast: { method: oracle }, quantity: { rule: network_in_stock, target: 0.7 } }
)");
  const DailyTrace t = daily_trace(s, test::policies_for(s));
  CHECK(t.left_out == std::vector<std::string>{"net"});
  REQUIRE(t.traces.size() == 1);
  CHECK(t.traces[0].policy == "fixed");
  CHECK(t.traces[0].days.size() == 42);  // min(42, 60)
}

TEST_CASE("daily_trace shows each policy's own demand under goodwill", "[html][trace]") {
  const std::string base = R"(
format: 1
name: trace-goodwill
seed: 12
horizon: { days: 42, warmup_days: 0 }
replications: 1
stores: [ { id: s } ]
items:
  - { id: loaf, price: 3, unit_cost: 1, demand: { base: 20 } }
policies:
  - { name: ample, forecast: { method: oracle }, quantity: { rule: fixed, quantity: 80 } }
  - { name: starved, forecast: { method: oracle }, quantity: { rule: fixed, quantity: 6 } }
)";
  const Scenario off_s = test::scenario_from(base);
  const Scenario on_s = test::scenario_from(
      base + "customers: { goodwill: { sensitivity: 0.8, half_life_days: 7 } }\n");
  const DailyTrace off = daily_trace(off_s, test::policies_for(off_s));
  const DailyTrace on = daily_trace(on_s, test::policies_for(on_s));
  int ample_on = 0, ample_off = 0, starved_on = 0;
  for (std::size_t d = 0; d < 42; ++d) {
    ample_on += on.traces[0].days[d].demand;
    ample_off += off.traces[0].days[d].demand;
    starved_on += on.traces[1].days[d].demand;
  }
  // Never out of stock (P(Poisson(20) > 80) is negligible): goodwill stays 1, the same draws.
  CHECK(ample_on == ample_off);
  // Out of stock every day: goodwill erodes (model.md), so this policy's own demand is lower.
  CHECK(on.traces[1].days[0].demand == on.traces[0].days[0].demand);  // day 0: no history yet
  CHECK(starved_on < 0.8 * ample_on);
}

}  // namespace
}  // namespace larder
