// network_in_stock through the engine (policies.md, "Network service-level targets"): with
// the oracle's forecasts the plan's expected in-stock is the true one, so the simulated
// in-stock at close meets the network target within 4 standard errors, and levels per item
// earn at least as much as one level for everything (the single level is one of the choices
// the per-item plan could have made). Re-planning across stores is bit-identical at any thread
// count.

#include <catch2/catch.hpp>
#include <string>

#include "policies/network/level_curve.hpp"
#include "sim/engine/demand_model.hpp"
#include "sim/runner/network_phases.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

constexpr const char* kNetwork = R"(
format: 1
name: network
seed: 77
horizon: { days: 140, warmup_days: 28 }
replications: 30
stores: [ { id: a, size: 1.4 }, { id: b, size: 1.0 }, { id: c, size: 0.6 } ]
items:
  - { id: loaf, price: 4, unit_cost: 1.2, demand: { base: 20, distribution: negative_binomial, cv: 0.4 } }
  - { id: tart, price: 5, unit_cost: 3.5, demand: { base: 6 } }
  - { id: roll, price: 1, unit_cost: 0.2, demand: { base: 40, weekday: { sat: 1.5 } } }
  - { id: soup, price: 6, unit_cost: 2, leftovers: donate, demand: { base: 9, distribution: normal, cv: 0.5 } }
policies:
  - name: per-item
    forecast: { method: oracle }
    quantity: { rule: network_in_stock, target: 0.7, groups: item, replan_days: 14 }
  - name: one-level
    forecast: { method: oracle }
    quantity: { rule: network_in_stock, target: 0.7, groups: all, replan_days: 14 }
  - name: per-store-item
    forecast: { method: oracle }
    quantity: { rule: network_in_stock, target: 0.7, groups: store_item, replan_days: 14 }
)";

TEST_CASE("network_in_stock meets its target and per-item levels earn at least one level's",
          "[engine][network]") {
  const Scenario s = test::scenario_from(kNetwork);
  const RunResult r = test::run_scenario(s, 2);
  for (int p = 0; p < 3; ++p) {
    const Estimate e = test::metric_estimate(r, p, Metric::in_stock_at_close);
    INFO(r.policies[static_cast<size_t>(p)] << ": in stock " << e.mean << " +- " << e.stderr_);
    CHECK(e.stderr_ > 0.0);
    CHECK(e.mean >= 0.7 - 4.0 * e.stderr_);
    // Not far above either: the plan takes the cheapest levels that meet the target. The
    // slack allows for the integer quantities (a level step moves a slow item's in-stock a lot).
    CHECK(e.mean <= 0.7 + 0.04 + 4.0 * e.stderr_);
  }
  // Paired difference of profit, per item minus one level.
  std::vector<double> diff;
  for (size_t rep = 0; rep < r.values[0].size(); ++rep) {
    diff.push_back(at(r.values[0][rep], Metric::profit) - at(r.values[1][rep], Metric::profit));
  }
  const Estimate d = estimate_mean(diff);
  INFO("per-item minus one level: profit " << d.mean << " +- " << d.stderr_);
  CHECK(d.mean >= -4.0 * d.stderr_);
}

TEST_CASE("each plan group achieves the in-stock its plans expected (oracle forecasts)",
          "[engine][network]") {
  // With the true distributions the plan's expected in-stock per group is the truth, so the
  // simulated in-stock at close of each group matches it within 4 standard errors of the
  // paired per-replication difference. Additive metrics of the breakdown add up to the totals.
  const Scenario s = test::scenario_from(kNetwork);
  const RunResult r = test::run_scenario(s, 2);
  const PolicyBreakdown& b = r.breakdown[0];  // per-item groups
  REQUIRE(b.first_group > 0);
  REQUIRE(b.keys.size() - b.first_group == 4);
  for (size_t g = 0; g < 4; ++g) {
    const size_t k = b.first_group + g;
    CHECK(b.keys[k].dimension == "plan_group");
    std::vector<double> diff;
    for (size_t rep = 0; rep < b.values.size(); ++rep) {
      diff.push_back(at(b.values[rep][k], Metric::in_stock_at_close) - b.planned_in_stock[rep][g]);
    }
    const Estimate e = estimate_mean(diff);
    INFO(b.keys[k].key << ": achieved - expected in stock " << e.mean << " +- " << e.stderr_);
    CHECK(e.stderr_ > 0.0);
    CHECK(std::abs(e.mean) <= 4.0 * e.stderr_);
  }
  for (size_t rep = 0; rep < b.values.size(); ++rep) {
    double by_store = 0.0;
    double by_item = 0.0;
    for (size_t k = 0; k < b.keys.size(); ++k) {
      if (b.keys[k].dimension == "store") by_store += at(b.values[rep][k], Metric::demand_units);
      if (b.keys[k].dimension == "item") by_item += at(b.values[rep][k], Metric::demand_units);
    }
    CHECK(by_store == at(r.values[0][rep], Metric::demand_units));
    CHECK(by_item == at(r.values[0][rep], Metric::demand_units));
  }
}

TEST_CASE("network re-planning is bit-identical at 1 and 3 threads", "[engine][network]") {
  // Forecasts that learn from sales, so each plan depends on what every store saw.
  std::string text = kNetwork;
  for (size_t at = text.find("method: oracle"); at != std::string::npos;
       at = text.find("method: oracle", at)) {
    text.replace(at, 14, "method: ses_weekday");
  }
  Scenario s = test::scenario_from(text);
  s.replications = 5;
  const RunResult one = test::run_scenario(s, 1);
  const RunResult three = test::run_scenario(s, 3);
  CHECK(one.values == three.values);
}

/// The diagnostics of building a one-item scenario whose policy has this quantity part.
std::string problems(const std::string& quantity) {
  const Scenario s = test::scenario_from(R"(
format: 1
name: bad
seed: 1
horizon: { days: 28, warmup_days: 0 }
stores: [ { id: s } ]
items: [ { id: loaf, price: 3, unit_cost: 1, attributes: { type: bread }, demand: { base: 9 } } ]
policies:
  - { name: p, forecast: { method: oracle }, quantity: )" +
                                         quantity + " }\n");
  Diagnostics diag;
  build_policies(s, diag);
  return diag.format();
}

TEST_CASE("network_in_stock parameters are checked", "[policies][network][validation]") {
  using Catch::Matchers::Contains;
  CHECK_THAT(problems("{ rule: network_in_stock }"),
             Contains("policies[0].quantity needs 'target'"));
  CHECK_THAT(problems("{ rule: network_in_stock, target: 1 }"),
             Contains("policies[0].quantity.target must be"));
  CHECK_THAT(problems("{ rule: network_in_stock, target: 0.7, groups: items }"),
             Contains("policies[0].quantity.groups must be store_item, item, all, abc, "
                      "attribute:<key> or store_attribute:<key>, or a list of two or three of "
                      "item, abc, attribute:<key> and store_attribute:<key> (got 'items')"));
  CHECK_THAT(problems("{ rule: network_in_stock, target: 0.7, groups: items }"),
             Contains("hint: did you mean 'item'?"));
  CHECK_THAT(problems("{ rule: network_in_stock, target: 0.7, groups: 'attribute:colour' }"),
             Contains("no item has the attribute 'colour'"));
  CHECK_THAT(problems("{ rule: network_in_stock, target: 0.7, replan_days: 0 }"),
             Contains("policies[0].quantity.replan_days must be"));
  CHECK(problems("{ rule: network_in_stock, target: 0.7, groups: 'attribute:type' }").empty());
  CHECK(problems("{ rule: network_in_stock, target: 0.7, groups: abc, replan_days: 7 }").empty());
}

// --- groups by store attribute and combined keys (issue 24) --------------------------------

/// Two stores (one without a format), two items (one without a type); line numbers matter.
std::string attribute_problems(const std::string& quantity) {
  const Scenario s = test::scenario_from(R"(format: 1
name: bad
seed: 1
horizon: { days: 28, warmup_days: 0 }
stores:
  - { id: quay, attributes: { format: big } }
  - { id: mill }
items:
  - { id: loaf, price: 3, unit_cost: 1, attributes: { type: bread }, demand: { base: 9 } }
  - { id: tart, price: 3, unit_cost: 1, demand: { base: 9 } }
policies:
  - { name: p, forecast: { method: oracle }, quantity: )" +
                                         quantity + " }\n");
  Diagnostics diag;
  build_policies(s, diag);
  return diag.format();
}

TEST_CASE("network groups: misspelt keys get suggestions, missing attributes name the item",
          "[policies][network][validation]") {
  using Catch::Matchers::Contains;
  const auto q = [](const std::string& groups) {
    return attribute_problems("{ rule: network_in_stock, target: 0.7, " + groups + " }");
  };
  // A misspelt attribute key: the nearest key the items have.
  CHECK_THAT(q("groups: 'attribute:tpye'"), Contains("no item has the attribute 'tpye'"));
  CHECK_THAT(q("groups: 'attribute:tpye'"), Contains("hint: did you mean 'attribute:type'?"));
  CHECK_THAT(q("groups: itme"), Contains("hint: did you mean 'item'?"));
  CHECK_THAT(q("groups: [attribute:type, store_atribute:format]"),
             Contains("hint: did you mean 'store_attribute:format'?"));
  // A store's key written as an item's.
  CHECK_THAT(q("groups: 'attribute:format'"),
             Contains("hint: 'format' is a store attribute: did you mean "
                      "'store_attribute:format'?"));
  CHECK_THAT(q("groups: 'store_attribute:region'"),
             Contains("no store has the attribute 'region'"));
  // An item without the attribute: an error at the item (line 10, column 5), naming it.
  const std::string item = q("groups: 'attribute:type'");
  CHECK_THAT(item, Contains("test.yaml:10:5: error: item 'tart' (items[1]) has no attribute "
                            "'type', which policies[0].quantity.groups groups by"));
  CHECK_THAT(item, Contains("or add missing: none to policies[0].quantity"));
  // A store without it: at the store (line 7).
  CHECK_THAT(q("groups: 'store_attribute:format'"),
             Contains("test.yaml:7:5: error: store 'mill' (stores[1]) has no attribute "
                      "'format'"));
  // Combined: the keys in order, so the item's missing type comes first.
  CHECK_THAT(q("groups: [attribute:type, store_attribute:format]"),
             Contains("item 'tart' (items[1]) has no attribute 'type'"));
  // missing: none puts them in a group named (none).
  CHECK(q("groups: 'attribute:type', missing: none").empty());
  CHECK(q("groups: [attribute:type, store_attribute:format], missing: none").empty());
  CHECK_THAT(q("groups: 'attribute:type', missing: maybe"),
             Contains("policies[0].quantity.missing must be one of error, none (got maybe)"));
  // Four keys, a repeat, or store_item in a combination: not a grouping.
  CHECK_THAT(q("groups: [item, abc, 'attribute:type', 'store_attribute:format']"),
             Contains("(got 'item + abc + attribute:type + store_attribute:format')"));
  CHECK_THAT(q("groups: [store_item, abc]"), Contains("must be store_item"));
  CHECK_THAT(q("groups: [abc, abc]"), Contains("must be store_item"));
}

// Four stores in two formats, three items of two types, Poisson demand, the oracle's forecasts.
constexpr const char* kFormats = R"(
format: 1
name: formats
seed: 91
horizon: { days: 140, warmup_days: 28 }
replications: 30
stores:
  - { id: a, size: 1.5, attributes: { format: big } }
  - { id: b, size: 0.5, attributes: { format: small } }
  - { id: c, size: 1.2, attributes: { format: big } }
  - { id: d, size: 0.7, attributes: { format: small } }
items:
  - { id: loaf, price: 4, unit_cost: 1.2, attributes: { type: bread }, demand: { base: 12 } }
  - { id: roll, price: 1, unit_cost: 0.6, attributes: { type: bread }, demand: { base: 25, weekday: { sat: 1.5 } } }
  - { id: tart, price: 5, unit_cost: 3, attributes: { type: cake }, demand: { base: 4 } }
policies:
  - name: type-format
    forecast: { method: oracle }
    quantity: { rule: network_in_stock, target: 0.75, groups: [attribute:type, store_attribute:format], replan_days: 14 }
  - name: format
    forecast: { method: oracle }
    quantity: { rule: network_in_stock, target: 0.75, groups: 'store_attribute:format', replan_days: 14 }
)";

/// The best total profit over every choice of one grid level per group whose summed in-stock
/// meets `required` (brute force; 99^groups choices, at most 4 groups).
double brute_force_best(const std::vector<GroupCurve>& curves, double required) {
  const size_t n = curves.size();
  const size_t levels = curves[0].in_stock.size();
  double best = -std::numeric_limits<double>::infinity();
  std::vector<size_t> at(n, 0);
  while (true) {
    double in_stock = 0, profit = 0;
    for (size_t g = 0; g < n; ++g) {
      in_stock += curves[g].in_stock[at[g]];
      profit += curves[g].profit[at[g]];
    }
    if (in_stock >= required) best = std::max(best, profit);
    size_t g = 0;
    while (g < n && ++at[g] == levels) at[g++] = 0;
    if (g == n) break;
  }
  return best;
}

TEST_CASE("store-attribute and combined groups against a hand-built allocation",
          "[engine][network]") {
  // The plan of day 0 from the oracle's forecasts, against curves built here by hand: each
  // store-item-day's one-day newsvendor curve (level_curve, tested against Boost.Math in
  // allocation.test.cpp) for the true Poisson mean base x size x weekday, summed into the
  // groups written out below, and the best allocation by brute force over every level choice.
  const Scenario s = test::scenario_from(kFormats);
  const std::vector<Policy> policies = test::policies_for(s);
  const DemandModel demand(s);
  const SimSetup setup{s, demand, policies, s.seed};
  tbb::task_arena arena(1);
  PhasedRuns runs(setup, 0, 1, arena);
  // Groups by hand: type x format (store a big, b small, c big, d small; loaf, roll bread, tart
  // cake), and format alone.
  const std::vector<std::string> type = {"bread", "bread", "cake"};
  const std::vector<std::string> format = {"big", "small", "big", "small"};
  for (int k = 0; k < 2; ++k) {
    CAPTURE(k);
    const NetworkPlan plan = runs.plan(0, k, true);
    const auto hand_name = [&](size_t st, size_t i) {
      return k == 0 ? type[i] + " / " + format[st] : format[st];
    };
    const std::vector<double> levels = default_levels();
    std::vector<GroupCurve> hand(plan.groups.names.size());
    for (GroupCurve& c : hand) {
      c.in_stock.assign(levels.size(), 0.0);
      c.profit.assign(levels.size(), 0.0);
    }
    std::vector<LevelPoint> points(levels.size());
    for (size_t st = 0; st < 4; ++st) {
      for (size_t i = 0; i < 3; ++i) {
        // The group the plan put this store-item in carries the hand-made name.
        const auto g = static_cast<size_t>(plan.groups.of_store_item[st * 3 + i]);
        REQUIRE(plan.groups.names[g] == hand_name(st, i));
        for (int d : plan_days(0, s.horizon.days)) {
          const Item& it = s.items[i];
          const double mean = it.demand.base * s.stores[st].size *
                              it.demand.weekday[static_cast<size_t>(s.weekday_of(d))];
          level_curve(CountLaw::from_moments(DemandFamily::poisson, mean, mean),
                      {it.price, it.unit_cost, 0.0, 0.0}, levels, points);
          for (size_t l = 0; l < levels.size(); ++l) {
            hand[g].in_stock[l] += points[l].in_stock;
            hand[g].profit[l] += points[l].profit;
          }
          hand[g].days += 1;
        }
        // The engine gets the level of the store's group for this item.
        CHECK(plan.level[st * 3 + i] == plan.group_level[g]);
      }
    }
    CHECK(plan.groups.count() == (k == 0 ? 4 : 2));
    const double required = 0.75 * 4 * 3 * 7;
    const double best = brute_force_best(hand, required);
    INFO("plan profit " << plan.allocation.profit << ", best " << best << ", gap bound "
                        << plan.allocation.gap_bound);
    CHECK(plan.allocation.in_stock >= required - 1e-9);
    CHECK(plan.allocation.profit <= best + 1e-9);
    CHECK(plan.allocation.profit >= best - plan.allocation.gap_bound - 1e-9);
    // The plan's own in-stock, recomputed from the hand curves at its levels.
    double in_stock = 0;
    for (size_t g = 0; g < hand.size(); ++g) {
      in_stock += hand[g].in_stock[static_cast<size_t>(plan.allocation.level[g])];
    }
    CHECK(in_stock == Approx(plan.allocation.in_stock).epsilon(1e-9));
  }
}

TEST_CASE("combined groups are applied per store: each group achieves its planned in-stock",
          "[engine][network]") {
  // With the oracle's forecasts the plan's expected in-stock per (type, format) group is the
  // truth, so the simulated in-stock of each group matches it within 4 standard errors of the
  // paired per-replication difference; a level applied to the wrong store's items would not.
  const Scenario s = test::scenario_from(kFormats);
  const RunResult r = test::run_scenario(s, 2);
  const PolicyBreakdown& b = r.breakdown[0];
  REQUIRE(b.keys.size() - b.first_group == 4);
  for (size_t g = 0; g < 4; ++g) {
    const size_t k = b.first_group + g;
    std::vector<double> diff;
    for (size_t rep = 0; rep < b.values.size(); ++rep) {
      diff.push_back(at(b.values[rep][k], Metric::in_stock_at_close) - b.planned_in_stock[rep][g]);
    }
    const Estimate e = estimate_mean(diff);
    INFO(b.keys[k].key << ": achieved - expected in stock " << e.mean << " +- " << e.stderr_);
    CHECK(e.stderr_ > 0.0);
    CHECK(std::abs(e.mean) <= 4.0 * e.stderr_);
  }
}

}  // namespace
}  // namespace larder
