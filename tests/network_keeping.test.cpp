// Network plans for items that keep (issue: network plans that keep their promise; README,
// "Network plans for items that keep"). The plan's level curves of items with shelf lives above
// one day and lead times above one come from the rule simulated on the item's own dynamics
// (sim/runner/level_corrections.hpp), and the plan calibrates its in-stock expectations on the
// closes the stores have seen (policies/network/in_stock_calibration.hpp). Checked here against
// what the engine itself achieves, never against the plan's own numbers:
//   1. With the oracle's forecasts, one level per item earns at least as much as one level for
//      everything at the same achieved in-stock, for shelf lives 1 to 7 and lead times 1 and 2
//      (paired difference, 4 standard errors): the single level is one of the per-item plan's
//      choices, so a plan that values each item's days correctly cannot do worse.
//   2. A plan for a mix of 1-day and 5-day items meets its target and earns at least as much
//      as the best two-level hand rule (one level per shelf life) found by a grid search over
//      the levels on the same customers (common random numbers).
//   3. With learned forecasts (weekday smoothing with the normal-tail correction), the worked
//      grouping scenario meets its network target within one point.
// The target of check 1 (90%) binds: at 80% these margins make both plans stock more than the
// target asks (each group's most profitable level already gives 82-84%), and the two would not
// be compared at the same in-stock.

#include <catch2/catch.hpp>
#include <cmath>
#include <memory>
#include <string>

#include "policies/quantity/fractile_rule.hpp"
#include "reports/comparison.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

std::string keeping_network(int lead_time) {
  return R"(
format: 1
name: keeping
seed: 2402
horizon: { days: 168, warmup_days: 28 }
replications: 16
logistics: { lead_time_days: )" +
         std::to_string(lead_time) + R"( }
stores: [ { id: a, size: 1.5 }, { id: b, size: 1.0 }, { id: c, size: 0.6 } ]
item_defaults:
  demand: { distribution: negative_binomial, cv: 0.4 }
items:
  - { id: d1, price: 3.0, unit_cost: 1.6, shelf_life_days: 1, demand: { base: 14 } }
  - { id: d2, price: 2.5, unit_cost: 1.5, shelf_life_days: 2, demand: { base: 9, cv: 0.6 } }
  - { id: d3, price: 4.0, unit_cost: 1.2, shelf_life_days: 3, demand: { base: 6 } }
  - { id: d4, price: 2.0, unit_cost: 1.3, shelf_life_days: 4, demand: { base: 12 } }
  - { id: d5, price: 5.0, unit_cost: 3.0, shelf_life_days: 5, demand: { base: 4, cv: 0.7 } }
  - { id: d6, price: 1.8, unit_cost: 0.9, shelf_life_days: 6, demand: { base: 18 } }
  - { id: d7, price: 6.0, unit_cost: 4.4, shelf_life_days: 7, demand: { base: 3 } }
policies:
  - name: per-item
    forecast: { method: oracle }
    quantity: { rule: network_in_stock, target: 0.9, groups: item, replan_days: 28 }
  - name: one-level
    forecast: { method: oracle }
    quantity: { rule: network_in_stock, target: 0.9, groups: all, replan_days: 28 }
)";
}

TEST_CASE("network plans: per-item levels earn at least one level's for items that keep",
          "[engine][network][keeping]") {
  const int lead = GENERATE(1, 2);
  const Scenario s = test::scenario_from(keeping_network(lead));
  const RunResult r = test::run_scenario(s, 2);
  INFO("lead time " << lead);
  for (int p = 0; p < 2; ++p) {
    const Estimate e = test::metric_estimate(r, p, Metric::in_stock_at_close);
    INFO(r.policies[static_cast<size_t>(p)] << ": in stock " << e.mean << " +- " << e.stderr_);
    // The target is met; not far above it either (integer quantities move a slow item's
    // in-stock in steps).
    CHECK(e.mean >= 0.9 - 4.0 * e.stderr_ - 0.005);
    CHECK(e.mean <= 0.9 + 0.02 + 4.0 * e.stderr_);
  }
  // At the same achieved in-stock (within 4 standard errors of the paired difference) ...
  const Estimate in = paired_difference(r, 0, 1, Metric::in_stock_at_close);
  INFO("per-item minus one level: in stock " << in.mean << " +- " << in.stderr_);
  CHECK(in.mean >= -4.0 * in.stderr_ - 0.005);
  // ... per-item levels earn at least as much.
  const Estimate d = paired_difference(r, 0, 1, Metric::profit);
  INFO("per-item minus one level: profit " << d.mean << " +- " << d.stderr_);
  CHECK(d.mean >= -4.0 * d.stderr_);
}

constexpr const char* kMix = R"(
format: 1
name: mix
seed: 2403
horizon: { days: 168, warmup_days: 28 }
replications: 16
stores: [ { id: a, size: 1.3 }, { id: b, size: 0.8 } ]
item_defaults:
  demand: { distribution: negative_binomial, cv: 0.45 }
items:
  - { id: bun, price: 2.2, unit_cost: 0.9, demand: { base: 16 } }
  - { id: pie, price: 4.5, unit_cost: 2.9, demand: { base: 7, cv: 0.6 } }
  - { id: milk, price: 1.6, unit_cost: 0.9, shelf_life_days: 5, demand: { base: 12 } }
  - { id: cheese, price: 5.5, unit_cost: 3.6, shelf_life_days: 5, demand: { base: 4 } }
policies:
  - name: plan
    forecast: { method: oracle }
    quantity: { rule: network_in_stock, target: 0.85, groups: item }
)";

TEST_CASE(
    "network plans: a 1-day and 5-day mix meets its target and beats every two-level "
    "hand rule",
    "[engine][network][keeping]") {
  Scenario s = test::scenario_from(kMix);
  // The hand rules: one level for the 1-day items, one for the 5-day items, on a grid.
  std::vector<double> grid;
  for (int k = 0; k <= 10; ++k) grid.push_back(0.50 + 0.049 * k);
  const PolicySpec plan_spec = s.policies[0];
  for (double a : grid) {
    for (double b : grid) {
      PolicySpec p = plan_spec;
      p.name = "hand-" + std::to_string(a) + "-" + std::to_string(b);
      YAML::Node q(YAML::NodeType::Map);
      q["rule"] = "in_stock_target";
      q["level"] = 0.5;
      p.quantity.method = "in_stock_target";
      p.quantity.params.reset(q);  // rebind: assigning would write through the shared node
      s.policies.push_back(std::move(p));
    }
  }
  std::vector<Policy> policies = test::policies_for(s);
  const std::vector<DemandFamily> family(4, DemandFamily::negative_binomial);
  size_t k = 1;
  for (double a : grid) {
    for (double b : grid) {
      policies[k++].quantity =
          std::make_unique<FractileMethod>(std::vector<double>{a, a, b, b}, family, 1);
    }
  }
  RunOptions o;
  o.threads = 2;
  const RunResult r = run_policies(s, policies, o);
  const Estimate plan_in = test::metric_estimate(r, 0, Metric::in_stock_at_close);
  INFO("plan: in stock " << plan_in.mean << " +- " << plan_in.stderr_);
  CHECK(plan_in.mean >= 0.85 - 4.0 * plan_in.stderr_ - 0.005);
  CHECK(plan_in.mean <= 0.85 + 0.03 + 4.0 * plan_in.stderr_);
  // The best hand rule that is in stock at least as often as the plan (within 4 standard
  // errors of the paired difference).
  int best = -1;
  double best_profit = -1e300;
  for (int p = 1; p < static_cast<int>(r.policies.size()); ++p) {
    const Estimate in = paired_difference(r, p, 0, Metric::in_stock_at_close);
    if (in.mean < -4.0 * in.stderr_) continue;
    const double profit = test::metric_estimate(r, p, Metric::profit).mean;
    if (profit > best_profit) {
      best_profit = profit;
      best = p;
    }
  }
  REQUIRE(best > 0);
  const Estimate d = paired_difference(r, 0, best, Metric::profit);
  INFO("plan minus best hand rule " << r.policies[static_cast<size_t>(best)] << ": profit "
                                    << d.mean << " +- " << d.stderr_);
  CHECK(d.mean >= -4.0 * d.stderr_);
}

TEST_CASE("network plans: learned forecasts meet the grouping scenario's target within a point",
          "[engine][network][keeping][slow]") {
  Scenario s = load_scenario_file(std::string(LARDER_SOURCE_DIR) + "/scenarios/grouping.yaml");
  s.replications = 8;
  const RunResult r = test::run_scenario(s, 2);
  for (size_t p = 0; p < r.policies.size(); ++p) {
    if (!std::isfinite(r.breakdown[p].network_target)) continue;
    const Estimate e = test::metric_estimate(r, static_cast<int>(p), Metric::in_stock_at_close);
    INFO(r.policies[p] << ": in stock " << e.mean << " +- " << e.stderr_);
    CHECK(std::abs(e.mean - r.breakdown[p].network_target) <= 0.01);
  }
}

}  // namespace
}  // namespace larder
