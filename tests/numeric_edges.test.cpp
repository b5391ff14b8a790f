// Numerical edge cases (issue 10): each runs and gives finite, documented outputs (README,
// "Limits and edge cases"): items without demand, a million units a day, cv 3, shelf life 30,
// one replication (intervals not available, never NaN), price below cost (a warning), and a
// run of one store-item-day.

#include <chrono>
#include <cmath>
#include <nlohmann/json.hpp>
#include <regex>

#include "reports/html_report.hpp"
#include "reports/metrics_csv.hpp"
#include "reports/summary_json.hpp"
#include "reports/terminal_table.hpp"
#include "tests/cli_runner.test.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

const char* kArea = "edges";

std::string scenario(const std::string& items, int days = 60, int reps = 4, int warmup = 7) {
  return fmt::format(R"(format: 1
name: edges
seed: 11
horizon: {{ days: {}, warmup_days: {} }}
replications: {}
stores: [ {{ id: corner }} ]
items:
{}
policies:
  - name: fractile
    forecast: {{ method: ses_weekday }}
    censoring: normal_tail
    quantity: {{ rule: critical_fractile }}
  - name: oracle
    forecast: {{ method: oracle }}
    quantity: {{ rule: in_stock_target, level: 0.9 }}
)",
                     days, warmup, reps, items);
}

/// Every metric of every policy and replication is finite.
void require_finite(const RunResult& r) {
  for (const auto& policy : r.values) {
    for (const MetricVector& v : policy) {
      for (Metric m : r.metrics) {
        INFO(metric_name(m));
        REQUIRE(std::isfinite(at(v, m)));
      }
    }
  }
}

double mean_of(const RunResult& r, int policy, Metric m) {
  return test::metric_estimate(r, policy, m).mean;
}

TEST_CASE("an item nobody buys: no demand, finite shares by their documented convention",
          "[edge]") {
  const RunResult r = test::run_scenario(test::scenario_from(
      scenario("  - { id: none, price: 2, unit_cost: 1, demand: { base: 0 } }\n"
               "  - { id: roll, price: 2, unit_cost: 1, demand: { base: 10 } }")));
  require_finite(r);
  // README, Metrics: a share of nothing is taken as fully served (fill rate 1) and no waste.
  const RunResult alone = test::run_scenario(test::scenario_from(
      scenario("  - { id: none, price: 2, unit_cost: 1, demand: { base: 0 } }")));
  require_finite(alone);
  for (int p = 0; p < 2; ++p) {
    CHECK(mean_of(alone, p, Metric::demand_units) == 0.0);
    CHECK(mean_of(alone, p, Metric::fill_rate) == 1.0);
    CHECK(mean_of(alone, p, Metric::no_stockout_share) == 1.0);
  }
  // Whatever is delivered is wasted: nobody buys.
  CHECK(mean_of(alone, 1, Metric::sold_units) == 0.0);
  CHECK(mean_of(alone, 1, Metric::waste_units) <= mean_of(alone, 1, Metric::delivered_units));
}

TEST_CASE("a million units a day run quickly and sell what the Poisson law says", "[edge]") {
  const Scenario s = test::scenario_from(
      scenario("  - { id: flood, price: 2, unit_cost: 1, demand: { base: 1000000 } }", 30, 4, 0));
  const auto start = std::chrono::steady_clock::now();
  const RunResult r = test::run_scenario(s, 2);
  CHECK(std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count() < 20.0);
  require_finite(r);
  // Demand per day: mean 1e6 (Poisson). The mean of 30 days x 4 replications has standard
  // error sqrt(1e6 / 120) = 91.3 units; 4 standard errors (textbook: Var = mean for Poisson).
  const double per_day = mean_of(r, 0, Metric::demand_units) / 30.0;
  CHECK(std::abs(per_day - 1e6) < 4.0 * std::sqrt(1e6 / 120.0));
  // The oracle stocks the 90% in-stock quantile, about mean + 1.28 sd: it sells almost all.
  CHECK(mean_of(r, 1, Metric::fill_rate) > 0.99);
}

TEST_CASE("cv 3 (normal and negative binomial) gives finite results", "[edge]") {
  for (const char* family : {"normal", "negative_binomial"}) {
    INFO(family);
    const RunResult r = test::run_scenario(test::scenario_from(scenario(fmt::format(
        "  - {{ id: wild, price: 3, unit_cost: 1, demand: {{ base: 20, distribution: {}, cv: 3 "
        "}} }}",
        family))));
    require_finite(r);
    CHECK(mean_of(r, 0, Metric::demand_units) > 0.0);
  }
}

TEST_CASE("cv 0: normal demand is the constant mean, negative binomial falls back to Poisson",
          "[edge]") {
  // Normal with variance (0 * mean)^2 = 0 is the point mass at the mean (rounded as the
  // sampler rounds). The oracle in-stock rule (level 0.9) must keep a unit on the shelf at
  // close (model.md, in-stock at close): it orders 21, sells 20 and throws one away a day.
  const RunResult flat = test::run_scenario(
      test::scenario_from(scenario("  - { id: flat, price: 3, unit_cost: 1, demand: { base: 20, "
                                   "distribution: normal, cv: 0 } }")));
  require_finite(flat);
  const double scored_days = 60 - 7;
  CHECK(mean_of(flat, 1, Metric::demand_units) == 20 * scored_days);
  CHECK(test::metric_estimate(flat, 1, Metric::demand_units).stderr_ == 0.0);
  CHECK(mean_of(flat, 1, Metric::sold_units) == 20 * scored_days);
  CHECK(mean_of(flat, 1, Metric::waste_units) == scored_days);
  // A negative binomial needs variance > mean; cv 0 gives the Poisson law of the same mean
  // (README, "Limits"): the replication mean of demand lies within 4 standard errors of
  // 20 per day (Poisson variance = mean, so the sd of a 53-day total is sqrt(20 * 53)).
  const RunResult nb = test::run_scenario(
      test::scenario_from(scenario("  - { id: nb, price: 3, unit_cost: 1, demand: { base: 20, "
                                   "distribution: negative_binomial, cv: 0 } }")));
  require_finite(nb);
  const double se = std::sqrt(20 * scored_days / 4.0);
  CHECK(std::abs(mean_of(nb, 0, Metric::demand_units) - 20 * scored_days) < 4 * se);
}

TEST_CASE("shelf life 30 runs and conserves units", "[edge]") {
  const RunResult r = test::run_scenario(test::scenario_from(
      scenario("  - { id: jar, price: 3, unit_cost: 1, shelf_life_days: 30, demand: { base: 5 } }",
               120, 3, 0)));
  require_finite(r);
  for (const auto& policy : r.values) {
    for (const MetricVector& v : policy) {
      const double out = at(v, Metric::sold_units) + at(v, Metric::waste_units);
      CHECK(at(v, Metric::delivered_units) >= out);
    }
  }
}

TEST_CASE("one store-item-day is a run", "[edge]") {
  const RunResult r = test::run_scenario(test::scenario_from(
      scenario("  - { id: roll, price: 2, unit_cost: 1, demand: { base: 10 } }", 1, 2, 0)));
  require_finite(r);
  CHECK(r.values[0].size() == 2);
}

TEST_CASE("one replication: intervals are not available in every output, never NaN", "[edge]") {
  const auto file = test::scratch_path(kArea, "one.yaml");
  test::write_text(file,
                   scenario("  - { id: roll, price: 2, unit_cost: 1, demand: { base: 10 } }"));
  const auto out = test::scratch_path(kArea, "one-out");
  const test::Outcome o =
      test::run_larder(kArea, fmt::format("run {} -r 1 --out {}", file.string(), out.string()));
  INFO(o.err);
  REQUIRE(o.code == 0);
  CHECK(o.out.find("n/a") != std::string::npos);  // the terminal table
  CHECK(o.out.find("not available") != std::string::npos);
  const auto summary = nlohmann::json::parse(test::slurp(out / "summary.json"));
  const auto& profit = summary["policies"][0]["metrics"]["profit"];
  CHECK(profit["mean"].is_number());
  CHECK(profit["stderr"].is_null());
  CHECK(profit["ci_low"].is_null());
  CHECK(profit["ci_high"].is_null());
  CHECK(summary["differences"][0]["metrics"]["profit"]["ci_low"].is_null());
  // metrics.csv: mean given, stderr and interval empty.
  const std::string csv = test::slurp(out / "metrics.csv");
  CHECK(csv.find("\nfractile,profit,") != std::string::npos);
  const auto row = csv.substr(csv.find("\nfractile,profit,") + 1);
  CHECK(row.substr(0, row.find('\n')).ends_with(",,,,1"));
  for (const char* name :
       {"summary.json", "metrics.csv", "replications.csv", "breakdown.csv", "report.html"}) {
    INFO(name);
    const std::string text = test::slurp(out / name);
    REQUIRE(!text.empty());
    CHECK(!std::regex_search(text, std::regex(R"(\b(nan|inf|infinity)\b)", std::regex::icase)));
  }
}

TEST_CASE("a price below cost is a warning, and the run goes on", "[edge]") {
  const auto file = test::scratch_path(kArea, "loss.yaml");
  test::write_text(file,
                   scenario("  - { id: leader, price: 0.5, unit_cost: 1, demand: { base: 10 } }"));
  const test::Outcome run =
      test::run_larder(kArea, fmt::format("run {} --out {}", file.string(),
                                          test::scratch_path(kArea, "loss-out").string()));
  INFO(run.err);
  CHECK(run.code == 0);
  const std::string warning =
      fmt::format("{}: warning: items[0] 'leader': price 0.5 is below unit_cost 1", file.string());
  CHECK(run.err.find(warning) != std::string::npos);
  const test::Outcome check = test::run_larder(kArea, fmt::format("check {}", file.string()));
  CHECK(check.code == 0);
  CHECK(check.err.find(warning) != std::string::npos);
  // --quiet silences it.
  const test::Outcome quiet =
      test::run_larder(kArea, fmt::format("run {} --quiet --out {}", file.string(),
                                          test::scratch_path(kArea, "loss-out").string()));
  CHECK(quiet.err.empty());
}

}  // namespace
}  // namespace larder
