// Censoring treatments through the engine: the "spiral down" of learning demand from sales,
// and its cure. One store, one item with normal demand N(20, 8^2) (cv 0.4, rounded to a count;
// model.md), a weekday-smoothing forecast started from the data (`initial: first_week`, so
// nothing starts from the truth) and an in-stock target of 0.75 with a normal quantity model.
// The policies differ only in the censoring treatment.
//
// - `ignore` learns from sales, which are demand cut off by sell-outs: on a sold-out day it
//   records less than the demand, the forecast drifts low, the next orders are lower, more days
//   sell out and the forecast drifts lower still (the spiral down of checks.md 3(d), Cooper,
//   Homem-de-Mello and Kleywegt 2006). Its spread is also learnt from cut-off sales.
// - `drop` skips the sold-out days, i.e. the high-demand days, which biases it lower still
//   (checks.md 3(d)); here it never gets started: the first orders come from an empty forecast,
//   every day sells out, and a treatment that skips sold-out days learns nothing.
// - `normal_tail` (Tobit-type conditional mean) and `product_limit` (Kaplan-Meier) estimate the
//   demand behind the sell-outs and come within a few points of the target.
// - `intraday` (with `observe: intraday`) scales a sold-out day's sales by the share of the
//   day elapsed at the sell-out time and also comes within a few points (a little above: the
//   ratio n / F(t) overstates the rate by about n / (n - 1), the Gamma mean of 1 / T).
//
// The first year is warm-up: with the first orders made from no data, every treatment starts
// by climbing out of a sell-out every day; `normal_tail`'s correction scales with the
// estimated spread, which starts tiny, so it needs the most time (about a year here).

#include <fmt/format.h>

#include <boost/math/distributions/poisson.hpp>
#include <catch2/catch.hpp>
#include <cmath>

#include "sim/engine/demand_model.hpp"
#include "sim/engine/store_run.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

/// The scenario: six policies sharing the forecast and the quantity rule.
std::string scenario_text() {
  return fmt::format(R"(
format: 1
name: censoring-spiral
seed: 20240607
horizon: {{ days: 728, warmup_days: 364 }}
replications: 40
stores: [ {{ id: corner }} ]
items:
  - id: rye
    price: 3
    unit_cost: 1
    demand: {{ base: 20, distribution: normal, cv: 0.4 }}
policies:
  - {{ name: ignore, forecast: {ses}, censoring: ignore, quantity: {target} }}
  - {{ name: drop, forecast: {ses}, censoring: drop, quantity: {target} }}
  - {{ name: normal_tail, forecast: {ses}, censoring: normal_tail, quantity: {target} }}
  - {{ name: product_limit, forecast: {ses}, censoring: product_limit, quantity: {target} }}
  - {{ name: oracle, forecast: {{ method: oracle }}, quantity: {target} }}
  - {{ name: km_restricted, forecast: {ses}, quantity: {target},
       censoring: {{ method: product_limit, tail: restricted }} }}
  - {{ name: intraday, observe: intraday, forecast: {ses}, censoring: intraday,
       quantity: {target} }}
)",
                     fmt::arg("ses", "{ method: ses_weekday, alpha: 0.15, initial: first_week }"),
                     fmt::arg("target", "{ rule: in_stock_target, level: 0.75, assume: normal }"));
}

TEST_CASE("sales-fed forecasts spiral down; normal_tail and product_limit reach the target",
          "[policies][censoring][engine]") {
  const Scenario sc = test::scenario_from(scenario_text());
  const RunResult r = test::run_scenario(sc, 2);
  constexpr double kTarget = 0.75;
  // "A few points": what a forecast estimated from a year of one weekday's data may lose
  // against the nominal level (estimation noise in the quantile), on top of 4 standard errors
  // of the across-replication mean.
  constexpr double kFewPoints = 0.03;
  // "Well short": at least 10 points below the target, by more than 4 standard errors.
  constexpr double kWellShort = 0.10;
  const char* names[] = {"ignore",        "drop",   "normal_tail",
                         "product_limit", "oracle", "product_limit, restricted tail",
                         "intraday"};
  Estimate e[7];
  for (int p = 0; p < 7; ++p) {
    e[p] = test::metric_estimate(r, p, Metric::in_stock_at_close);
    INFO(names[p] << ": in stock at close " << e[p].mean << " +- " << e[p].stderr_);
    CHECK(e[p].stderr_ > 0.0);
  }
  const auto info = fmt::format(
      "in stock at close: ignore {:.4f}, drop {:.4f}, normal_tail {:.4f}, product_limit {:.4f}, "
      "oracle {:.4f}, restricted tail {:.4f}, intraday {:.4f}",
      e[0].mean, e[1].mean, e[2].mean, e[3].mean, e[4].mean, e[5].mean, e[6].mean);
  INFO(info);
  // The yardstick: with the true distribution the rule meets the target (normal demand,
  // normal quantity model: only the rounding of Q moves it).
  CHECK(std::abs(e[4].mean - kTarget) <= 4.0 * e[4].stderr_ + kFewPoints);
  for (int p : {0, 1}) {
    INFO(names[p]);
    CHECK(e[p].mean + 4.0 * e[p].stderr_ < kTarget - kWellShort);
  }
  for (int p : {2, 3, 6}) {
    INFO(names[p]);
    CHECK(std::abs(e[p].mean - kTarget) <= 4.0 * e[p].stderr_ + kFewPoints);
  }
  // The band is sharp enough to reject a treatment that learns too little: Kaplan-Meier with
  // the unplaced mass at the largest sold-out value is the law of min(D, Q) under a steady
  // order Q, i.e. the sales again (product_limit.hpp), and falls outside it.
  CHECK(e[5].mean + 4.0 * e[5].stderr_ < kTarget - kFewPoints);
}

TEST_CASE("intraday recovers demand from the sell-out time under a known profile",
          "[policies][censoring][engine]") {
  // Poisson(lambda) customers a day over a morning-peak profile, Q units every day. By the
  // time change of a Poisson process, lambda F(T) at the Q-th arrival is Gamma(Q, 1), so on a
  // sold-out day the estimate Q / F(T) has E[Q / F(T); sold out] = lambda Q / (Q - 1)
  // P(Poisson(lambda) >= Q - 1) (integrating the Gamma density; the n / (n - 1) excess is the
  // method's own). Other days feed D: E[D; D < Q]. Values from Boost.Math; the engine records
  // E[T | the hour's count], which moves the mean by far less than a standard error here.
  constexpr double kLambda = 20.0;
  constexpr int kQ = 17;
  constexpr int kDays = 30000;
  const Scenario sc = test::scenario_from(R"(
format: 1
name: intraday-recovery
seed: 12
horizon: { days: 30000, warmup_days: 0 }
stores: [ { id: s } ]
items: [ { id: bun, price: 1, unit_cost: 0.5, demand: { base: 20, intraday: morning_peak } } ]
policies:
  - name: watch
    observe: intraday
    forecast: { method: oracle }
    censoring: intraday
    quantity: { rule: fixed, quantity: 17 }
)");
  const auto policies = test::policies_for(sc);
  const DemandModel truth(sc);
  const SimSetup setup{sc, truth, policies, sc.seed};
  StoreRun run(setup, 0, 0);
  auto state = policies[0].censoring->make({sc, truth, 0});
  std::vector<DemandForecast> predicted(1);
  std::vector<double> estimate(1);
  double sum = 0.0;
  double sum_sq = 0.0;
  for (int day = 0; day < kDays; ++day) {
    run.run_days(day, day + 1);
    state->treat(day, run.observations(0), predicted, estimate);
    REQUIRE(std::isfinite(estimate[0]));
    sum += estimate[0];
    sum_sq += estimate[0] * estimate[0];
  }
  const boost::math::poisson_distribution<double> d(kLambda);
  double below = 0.0;  // E[D; D < Q]
  for (int k = 0; k < kQ; ++k) below += k * pdf(d, k);
  const double exact = below + kLambda * kQ / (kQ - 1.0) * cdf(complement(d, kQ - 2));
  const double mean = sum / kDays;
  const double se = std::sqrt((sum_sq / kDays - mean * mean) / kDays);
  INFO("mean estimate " << mean << " +- " << se << ", exact " << exact << ", lambda " << kLambda);
  CHECK(std::abs(mean - exact) <= 4.0 * se);
  // And much closer to lambda than the sales are (E[min(D, Q)] = 16.37 here, by scipy).
  double sales = below;
  sales += kQ * cdf(complement(d, kQ - 1));
  CHECK(std::abs(mean - kLambda) < 0.5 * std::abs(sales - kLambda));
}

/// A scenario whose first policy has the given censoring part.
std::string with_censoring(const std::string& censoring) {
  return fmt::format(R"(
format: 1
name: bad-censoring
seed: 1
horizon: {{ days: 28, warmup_days: 0 }}
replications: 1
stores: [ {{ id: s }} ]
items: [ {{ id: loaf, price: 3, unit_cost: 1, demand: {{ base: 20 }} }} ]
policies:
  - name: km
    forecast: {{ method: ses_weekday }}
    censoring: {}
    quantity: {{ rule: in_stock_target, level: 0.75 }}
)",
                     censoring);
}

/// The diagnostics of building the policies of a scenario with that censoring part.
std::string problems(const std::string& censoring) {
  const Scenario sc = test::scenario_from(with_censoring(censoring));
  Diagnostics diag;
  build_policies(sc, diag);
  return diag.format();
}

TEST_CASE("bad censoring parameters are reported with their path", "[policies][censoring]") {
  using Catch::Matchers::Contains;
  CHECK_THAT(problems("{ method: product_limit, weeks: 0 }"),
             Contains("policies[0].censoring.weeks must be >= 1 (got 0)"));
  CHECK_THAT(problems("{ method: product_limit, weeks: 2.5 }"),
             Contains("policies[0].censoring.weeks must be a whole number (got 2.5)"));
  CHECK_THAT(problems("{ method: product_limit, weeks: 1000 }"),
             Contains("policies[0].censoring.weeks must be at most 520 (got 1000)"));
  CHECK_THAT(problems("{ method: product_limit, tail: exponential }"),
             Contains("policies[0].censoring.tail must be one of") && Contains("restricted"));
  CHECK_THAT(problems("{ method: normal_tail, weeks: 4 }"),
             Contains("unknown key 'weeks' in policies[0].censoring"));
  CHECK_THAT(problems("{ method: tobit }"), Contains("unknown censoring treatment 'tobit'") &&
                                                Contains("normal_tail") && Contains("drop"));
  // Good ones: the name alone, or a mapping with the defaults spelt out.
  CHECK(problems("product_limit").empty());
  CHECK(problems("drop").empty());
  CHECK(problems("{ method: product_limit, weeks: 8, tail: normal }").empty());
}

}  // namespace
}  // namespace larder
