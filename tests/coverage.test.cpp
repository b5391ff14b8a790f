// The paired-difference interval covers the true difference at about its nominal 95% rate, in
// a repeated experiment with a closed-form answer: two fixed orders, Q = 8 and Q = 12 units a day,
// on Poisson(10) demand with shelf life 1. Sales per day differ by
// E[min(D, 12)] - E[min(D, 8)] = sum_{k=8}^{11} P(D > k) (Boost.Math). 200 runs with different
// seeds and 10 replications each; the count of intervals that cover it is Binomial(200, 0.95)
// when the intervals are right, so it must lie within 4 of its standard deviations of 190.

#include <fmt/format.h>

#include <boost/math/distributions/poisson.hpp>
#include <catch2/catch.hpp>
#include <cmath>

#include "tests/fixture.hpp"

namespace larder {
namespace {

TEST_CASE("paired-difference intervals cover the true difference at the nominal rate",
          "[stats][coverage]") {
  constexpr int kRepeats = 200;
  constexpr int kDays = 30;
  const boost::math::poisson_distribution<double> d(10.0);
  double exact = 0.0;
  for (int k = 8; k <= 11; ++k) exact += cdf(complement(d, k));
  int covered = 0;
  for (int run = 0; run < kRepeats; ++run) {
    const Scenario s = test::scenario_from(fmt::format(R"(
format: 1
name: coverage
seed: {}
horizon: {{ days: {}, warmup_days: 0 }}
replications: 10
stores: [ {{ id: s }} ]
items: [ {{ id: bun, price: 2, unit_cost: 1, demand: {{ base: 10 }} }} ]
policies:
  - {{ name: eight, forecast: {{ method: oracle }}, quantity: {{ rule: fixed, quantity: 8 }} }}
  - {{ name: twelve, forecast: {{ method: oracle }}, quantity: {{ rule: fixed, quantity: 12 }} }}
)",
                                                       1000 + run, kDays));
    const RunResult r = test::run_scenario(s);
    auto twelve = r.series(1, Metric::sold_units);
    auto eight = r.series(0, Metric::sold_units);
    for (double& x : twelve) x /= kDays;
    for (double& x : eight) x /= kDays;
    const Estimate e = estimate_paired_difference(twelve, eight);
    covered += e.ci_low <= exact && exact <= e.ci_high;
  }
  const double expected = 0.95 * kRepeats;
  const double sd = std::sqrt(kRepeats * 0.95 * 0.05);
  INFO("covered " << covered << " of " << kRepeats << " (expected " << expected << ")");
  CHECK(std::abs(covered - expected) <= 4.0 * sd);
}

}  // namespace
}  // namespace larder
