// Substitution (model.md, step 3) against its closed form: item A with a fixed quantity Q_A
// sends each customer it cannot serve to B with probability q, one level only. B's total sales
// are then exactly min(Q_B, D_B + Binomial((D_A - Q_A)+, q)) whatever the order in which the
// customers come, so E[B sales] = sum over D_A, D_B, S of the Poisson and binomial pmfs
// (Boost.Math) times min(Q_B, D_B + S). Tolerance: 4 standard errors over replications.

#include <boost/math/distributions/binomial.hpp>
#include <boost/math/distributions/poisson.hpp>
#include <catch2/catch.hpp>
#include <cmath>

#include "reports/substitution_csv.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

constexpr double kMeanA = 10.0;
constexpr double kMeanB = 5.0;
constexpr int kQA = 6;
constexpr int kQB = 7;
constexpr double kShare = 0.6;

/// E[min(Q_B, D_B + Binomial((D_A - Q_A)+, q))] by summation.
double expected_b_sales() {
  const boost::math::poisson_distribution<double> a(kMeanA);
  const boost::math::poisson_distribution<double> b(kMeanB);
  double e = 0.0;
  for (int da = 0; da < 80; ++da) {
    const int over = std::max(da - kQA, 0);
    const boost::math::binomial_distribution<double> sub(over, kShare);
    for (int s = 0; s <= over; ++s) {
      const double p_as = pdf(a, da) * pdf(sub, s);
      for (int db = 0; db < 60; ++db) {
        e += p_as * pdf(b, db) * std::min(kQB, db + s);
      }
    }
  }
  return e;
}

/// E[min(D_A, Q_A)].
double expected_a_sales() {
  const boost::math::poisson_distribution<double> a(kMeanA);
  double e = 0.0;
  for (int da = 0; da < 80; ++da) e += pdf(a, da) * std::min(da, kQA);
  return e;
}

TEST_CASE("substitute sales match the one-level closed form", "[engine][substitution]") {
  constexpr int kDays = 400;
  const Scenario s = test::scenario_from(R"(
format: 1
name: substitution
seed: 17
horizon: { days: 400, warmup_days: 0 }
replications: 60
stores: [ { id: s } ]
items:
  - { id: a, price: 2, unit_cost: 1, demand: { base: 10, intraday: morning_peak }, substitutes: { b: 0.6 } }
  - { id: b, price: 3, unit_cost: 1, demand: { base: 5, intraday: evening_peak } }
policies:
  - name: fixed
    forecast: { method: oracle }
    quantity: { rule: fixed, quantity: { a: 6, b: 7 } }
)");
  const RunResult r = test::run_scenario(s);
  const double exact = expected_a_sales() + expected_b_sales();
  const Estimate sold = test::metric_estimate(r, 0, Metric::sold_units, kDays);
  INFO("sales per day: simulated " << sold.mean << " +- " << sold.stderr_ << ", exact " << exact);
  CHECK(std::abs(sold.mean - exact) <= 4.0 * sold.stderr_);

  // Customers: every primary customer is served by the item, by the substitute, or lost.
  for (size_t rep = 0; rep < r.values[0].size(); ++rep) {
    const MetricVector& v = r.values[0][rep];
    CHECK(at(v, Metric::demand_units) == at(v, Metric::sold_units) + at(v, Metric::lost_units));
    CHECK(at(v, Metric::served_share) >= at(v, Metric::fill_rate));
    // The breakdown has the one pair, and it carries every substitute unit.
    CHECK(r.substituted[0][rep][0] == at(v, Metric::substitute_units));
  }
  CHECK(substitution_csv(r).rfind("policy,from_item,to_item,mean,", 0) == 0);
  CHECK(substitution_csv(r).find("\nfixed,a,b,") != std::string::npos);
}

TEST_CASE("substitution is one level: a substitute customer who finds it out leaves",
          "[engine][substitution]") {
  // a -> b -> c with b never stocked: a's customers who go to b leave, and none reach c.
  const Scenario s = test::scenario_from(R"(
format: 1
name: one-level
seed: 4
horizon: { days: 60, warmup_days: 0 }
replications: 3
stores: [ { id: s } ]
items:
  - { id: a, price: 2, unit_cost: 1, demand: { base: 10 }, substitutes: { b: 1.0 } }
  - { id: b, price: 2, unit_cost: 1, demand: { base: 5 }, substitutes: { c: 1.0 } }
  - { id: c, price: 2, unit_cost: 1, demand: { base: 5 } }
policies:
  - name: fixed
    forecast: { method: oracle }
    quantity: { rule: fixed, quantity: { a: 0, b: 0, c: 100 } }
)");
  const RunResult r = test::run_scenario(s);
  for (const auto& rep : r.substituted[0]) {
    CHECK(rep[0] == 0.0);  // a -> b: b is empty
    CHECK(rep[1] > 0.0);   // b -> c: b's own customers do reach c
  }
}

}  // namespace
}  // namespace larder
