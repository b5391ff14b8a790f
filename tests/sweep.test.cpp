// Sweeps: every point equals a separate run of the scenario written with that setting (same
// seed, so the same draws), bit for bit.

#include "sim/runner/sweep.hpp"

#include <fmt/format.h>

#include <catch2/catch.hpp>

#include "reports/policy_ranks.hpp"
#include "reports/sensitivity.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

constexpr const char* kTemplate = R"(format: 1
name: sweep-check
seed: 11
horizon: {{ days: 70, warmup_days: 14 }}
replications: 4
stores: [ {{ id: s, size: 1.2 }}, {{ id: t }} ]
items:
  - {{ id: bun, price: {price}, unit_cost: 0.4, demand: {{ base: 25 }} }}
  - {{ id: pie, price: 4, unit_cost: 1.5, shelf_life_days: 2, demand: {{ base: 7 }} }}
policies:
  - name: target
    forecast: {{ method: ses_weekday }}
    quantity: {{ rule: in_stock_target, level: {level} }}
  - name: newsvendor
    forecast: {{ method: oracle }}
    quantity: {{ rule: critical_fractile }}
)";

std::string text(const std::string& price, const std::string& level) {
  return fmt::format(kTemplate, fmt::arg("price", price), fmt::arg("level", level));
}

TEST_CASE("a sweep's points equal separate runs with the same settings", "[sweep]") {
  SweepSpec spec;
  spec.text = text("1.5", "0.8");
  spec.label = "sweep.yaml";
  spec.settings = {*parse_setting("policies.target.quantity.level=0.6,0.9"),
                   *parse_setting("items.bun.price=1.2,2")};
  spec.options.threads = 2;
  const std::vector<SweepPoint> points = run_sweep(spec);
  REQUIRE(points.size() == 4);
  // First setting slowest.
  CHECK(points[1].values == std::vector<std::string>{"0.6", "2"});
  CHECK(points[2].values == std::vector<std::string>{"0.9", "1.2"});
  for (const SweepPoint& p : points) {
    const Scenario s = test::scenario_from(text(p.values[1], p.values[0]));
    INFO("level " << p.values[0] << ", price " << p.values[1]);
    CHECK(test::run_scenario(s, 1).values == p.result.values);
  }
}

TEST_CASE("a bad sweep path is bad input naming the setting", "[sweep]") {
  SweepSpec spec;
  spec.text = text("1.5", "0.8");
  spec.label = "sweep.yaml";
  spec.settings = {*parse_setting("policies.nope.quantity.level=0.6")};
  CHECK_THROWS_WITH(run_sweep(spec), Catch::Contains("--set policies.nope.quantity.level=0.6") &&
                                         Catch::Contains("policies has no element named 'nope'"));
  spec.settings = {*parse_setting("policies.target.quantity.level=1.5")};
  CHECK_THROWS_WITH(run_sweep(spec), Catch::Contains("policies.target.quantity.level=1.5") &&
                                         Catch::Contains("level must be"));
}

TEST_CASE("vary points equal separate runs with the input scaled", "[sweep]") {
  SweepSpec spec;
  spec.text = text("1.5", "0.8");
  spec.label = "sweep.yaml";
  spec.varies = {*parse_setting("price=-10%,+10%")};
  const std::vector<SweepPoint> points = run_sweep(spec);
  REQUIRE(points.size() == 3);  // the base, then each value alone
  CHECK(points[0].values.empty());
  CHECK(points[2].values == std::vector<std::string>{"price", "+10%"});
  // price: every item's price; bun 1.5 and pie 4 become 1.35 / 3.6 and 1.65 / 4.4.
  const std::string lower = [] {
    std::string t = text("1.35", "0.8");
    t.replace(t.find("price: 4,"), 9, "price: 3.6,");
    return t;
  }();
  CHECK(test::run_scenario(test::scenario_from(lower), 1).values == points[1].result.values);
  CHECK(test::run_scenario(test::scenario_from(text("1.5", "0.8")), 1).values ==
        points[0].result.values);
}

/// A run whose policy 1 earns `diff[r]` more profit than the baseline in replication r.
RunResult with_differences(const std::vector<double>& diff) {
  RunResult r;
  r.policies = {"base", "other"};
  r.metrics = {Metric::profit};
  r.values.resize(2);
  for (double d : diff) {
    MetricVector a{};
    MetricVector b{};
    at(a, Metric::profit) = 100.0;
    at(b, Metric::profit) = 100.0 + d;
    r.values[0].push_back(a);
    r.values[1].push_back(b);
  }
  return r;
}

TEST_CASE("tornado: swings by hand, widest first; ranks: the best changes", "[sweep]") {
  // Base difference +2 (mean of 1, 2, 3). Input x: +1 and +5 (swing 5 - 1 = 4). Input y: -1
  // and +2 (swing 2 - (-1) = 3, and at -1 the baseline becomes the best).
  const std::vector<Setting> varies = {{"x", {"lo", "hi"}}, {"y", {"lo", "hi"}}};
  std::vector<SweepPoint> points = {{{}, with_differences({1, 2, 3})},
                                    {{"x", "lo"}, with_differences({1, 1, 1})},
                                    {{"x", "hi"}, with_differences({4, 5, 6})},
                                    {{"y", "lo"}, with_differences({-1, -1, -1})},
                                    {{"y", "hi"}, with_differences({2, 2, 2})}};
  const std::vector<TornadoRow> rows = tornado(varies, points);
  REQUIRE(rows.size() == 2);
  CHECK(rows[0].path == "x");
  CHECK(rows[0].swing == Approx(4.0));
  CHECK(rows[1].path == "y");
  CHECK(rows[1].swing == Approx(3.0));
  const RankTable ranks = rank_table(points, Metric::profit);
  REQUIRE(ranks.points.size() == 5);
  CHECK(ranks.points[0].best == std::vector<int>{1});
  CHECK(ranks.points[3].input == "y");
  CHECK(ranks.points[3].value == "lo");
  CHECK(ranks.points[3].ranks == std::vector<int>{1, 2});
  CHECK(ranks.points[3].best_changes);
  // The baseline beats the other by exactly 1 in every replication: a clear change.
  CHECK(ranks.points[3].change_clear == std::optional<bool>(true));
  CHECK_FALSE(ranks.points[1].best_changes);
  CHECK_FALSE(ranks.points[1].change_clear.has_value());
  CHECK(sensitivity_csv(points).rfind("input,value,policy,baseline,profit_difference,", 0) == 0);
}

}  // namespace
}  // namespace larder
