// The normal-tail treatment: the truncated-normal moments against scipy and mpmath, and the
// checks.md 3(a) sample (N(100, 30^2) demand, stock from {90, 110, 130}) where the treated
// values recover the true mean while the naive sales and drop-stockout means are biased low.

#include <catch2/catch.hpp>
#include <cmath>

#include "policies/censoring/normal_tail_moments.hpp"
#include "sim/engine/demand_model.hpp"
#include "sim/random/stream.hpp"
#include "sim/stats/normal.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

TEST_CASE("normal_upper_tail matches scipy truncnorm mean and variance", "[policies][censoring]") {
  // scipy 1.10.1: t = scipy.stats.truncnorm((c - m) / s, numpy.inf, loc=m, scale=s);
  // t.mean(), t.var(). The means also equal scipy.integrate.quad(x * norm.pdf(x, m, s), c, inf)
  // / norm.sf(c, m, s) to 1e-15 (except the last case, where quad is off at 3e-9; mpmath at 40
  // digits agrees with truncnorm: 29.701023460370852). Both are double-precision results of
  // different algorithms: 1e-12 relative for the means. In the last case scipy's variance is
  // 4e-11 off mpmath's (cancellation in 1 + a lambda - lambda^2), so that case uses mpmath's
  // and the others, scipy's, get 1e-10.
  struct Case {
    double m, s, c, mean, var;
  };
  const Case cases[] = {
      {100, 30, 89.5, 117.67692931665083, 401.9184121092969},
      {20, 4.5, 23.5, 26.075872841186914, 4.599324161881458},
      {15.790915, 4.575836, 19.5, 22.08552224738738, 4.663428022210096},
      {50, 10, 20.5, 50.05150824912416, 98.4778535511094},
      {10, 2, 29.5, 29.701023460370926, 0.039632091148911936},  // variance from mpmath
  };
  for (const Case& k : cases) {
    INFO("m " << k.m << ", s " << k.s << ", cut " << k.c);
    const TailMoments t = normal_upper_tail(k.m, k.s * k.s, k.c);
    CHECK(t.mean == Approx(k.mean).epsilon(1e-12));
    CHECK(t.variance == Approx(k.var).epsilon(1e-10));
  }
}

TEST_CASE("the inverse Mills ratio stays accurate far in the tail", "[policies][censoring]") {
  // mpmath, 50-60 digits: lambda = npdf(a) / (erfc(a / sqrt 2) / 2), v = 1 + a lambda -
  // lambda^2. The continued fraction is good to about 1e-16 in lambda; the variance factor
  // loses up to a^2 * 1e-16 (about 2e-13 at a = 40) to the final subtraction, hence 1e-12.
  CHECK(inverse_mills(10.0) == Approx(10.098093233962511963).epsilon(1e-14));
  CHECK(inverse_mills(20.0) == Approx(20.049753068527850542).epsilon(1e-14));
  CHECK(inverse_mills(40.0) == Approx(40.024968847207263723).epsilon(1e-14));
  CHECK(inverse_mills(60.0) == Approx(60.01665742024112493).epsilon(1e-14));
  CHECK(normal_upper_tail(0.0, 1.0, 10.0).variance ==
        Approx(0.0094453778256562611641).epsilon(1e-12));
  CHECK(normal_upper_tail(0.0, 1.0, 25.0).variance ==
        Approx(0.0015848414703928893524).epsilon(1e-12));
  CHECK(normal_upper_tail(0.0, 1.0, 40.0).variance ==
        Approx(0.0006226683785913887735).epsilon(1e-12));
  // Where 1 - Phi underflows (a = 120): the asymptotic series a + 1/a - 2/a^3 + 10/a^5 (whose
  // agreement with mpmath to 1e-12 at a = 30 we checked; the next term is 74/a^7 ~ 2e-13).
  const double a = 120.0;
  const TailMoments far = normal_upper_tail(10.0, 4.0, 250.0);
  CHECK(far.mean ==
        Approx(10.0 + 2.0 * (a + 1 / a - 2 / (a * a * a) + 10 / std::pow(a, 5))).epsilon(1e-14));
  CHECK(far.variance > 0.0);
  // The two forms agree where they meet (a = 5): erfc is accurate to ~3e-15 there.
  CHECK(inverse_mills(5.0) == Approx(inverse_mills(std::nextafter(5.0, 6.0))).epsilon(1e-14));
  CHECK(inverse_mills(5.0) == Approx(5.1865039671258421156).epsilon(1e-14));  // mpmath
  // Below the mean the hazard vanishes: phi(-40) underflows to 0.
  CHECK(inverse_mills(-40.0) == 0.0);
}

TEST_CASE("count_upper_tail: continuity correction, clamp at the sales, no spread",
          "[policies][censoring]") {
  // D >= 24 with N(20, 4.5^2) is X >= 23.5: scipy truncnorm mean 26.075872841186914 (above).
  CHECK(count_upper_tail(20.0, 4.5 * 4.5, 24.0).mean == Approx(26.075872841186914).epsilon(1e-12));
  // N(10, 2^2) puts E[X | X >= 29.5] = 29.70 below 30, but D >= 30 for certain: raised to 30.
  CHECK(count_upper_tail(10.0, 4.0, 30.0).mean == 30.0);
  // sd = 0: a point mass, max(mean, s) (by hand).
  CHECK(count_upper_tail(12.0, 0.0, 15.0).mean == 15.0);
  CHECK(count_upper_tail(20.0, 0.0, 15.0).mean == 20.0);
  CHECK(count_upper_tail(20.0, std::nan(""), 15.0).mean == 20.0);
}

/// One store, one item, the treatments under test (they read nothing from the demand model).
const char* kScenario = R"(
format: 1
name: censoring-unit
seed: 1
horizon: { days: 28, warmup_days: 0 }
replications: 1
stores: [ { id: s } ]
items: [ { id: loaf, price: 3, unit_cost: 1, demand: { base: 20 } } ]
policies:
  - { name: ignore, forecast: { method: oracle }, censoring: ignore, quantity: { rule: fixed, quantity: 1 } }
  - { name: drop, forecast: { method: oracle }, censoring: drop, quantity: { rule: fixed, quantity: 1 } }
  - { name: tail, forecast: { method: oracle }, censoring: normal_tail, quantity: { rule: fixed, quantity: 1 } }
)";

/// Mean and standard error of the non-NaN values.
struct Sample {
  double mean = 0, se = 0;
  int n = 0;
};
Sample summarise(const std::vector<double>& v) {
  double s = 0, ss = 0;
  int n = 0;
  for (double x : v) {
    if (std::isnan(x)) continue;
    s += x;
    ++n;
  }
  const double m = s / n;
  for (double x : v) {
    if (!std::isnan(x)) ss += (x - m) * (x - m);
  }
  return {m, std::sqrt(ss / (n - 1) / n), n};
}

TEST_CASE("normal_tail recovers the mean of censored N(100, 30^2) demand (checks.md 3(a))",
          "[policies][censoring]") {
  // checks.md 3(a): n = 5000, demand N(100, 30^2), stock drawn from {90, 110, 130}. Demand is
  // rounded to a count (D = max(0, round(X)), as the model's normal count), a day sells out
  // when D >= S. The treatments get the true N(100, 900) as the day's forecast.
  const Scenario sc = test::scenario_from(kScenario);
  const auto policies = test::policies_for(sc);
  const DemandModel truth(sc);
  const StoreView view{sc, truth, 0};
  constexpr int kN = 5000;
  std::vector<Observation> obs(kN);
  pcg32 g = make_stream({20240601, 0, 0, 0, Purpose::demand});
  const int stocks[] = {90, 110, 130};
  int censored = 0;
  for (Observation& o : obs) {
    const int demand =
        std::max(0, static_cast<int>(std::lround(100.0 + 30.0 * normal_quantile(to_unit(g())))));
    const int stock = stocks[g() % 3];
    o.open = true;
    o.delivered = stock;
    o.sold = std::min(demand, stock);
    o.leftover = stock - o.sold;
    o.sold_out = o.leftover == 0;
    censored += o.sold_out;
  }
  const std::vector<DemandForecast> truth_forecast(kN, {100.0, 900.0});
  auto treated = [&](int policy) {
    auto state = policies[static_cast<size_t>(policy)].censoring->make(view);
    std::vector<double> out(kN);
    state->treat(0, obs, truth_forecast, out);
    return summarise(out);
  };
  const Sample naive = treated(0), drop = treated(1), tail = treated(2);
  INFO("censored share " << censored / double(kN) << "; naive " << naive.mean << " +- " << naive.se
                         << "; drop " << drop.mean << " +- " << drop.se << "; normal_tail "
                         << tail.mean << " +- " << tail.se);
  // Population values for the rounded count, summed over k = 0..399 with scipy.stats.norm.cdf
  // (pmf of round(X) = cdf(k + 0.5) - cdf(k - 0.5)): naive E[min(D, S)] = 90.7526, drop
  // E[D | D < S] pooled = 83.5518, censored share 0.391767, E[D] = 100.0034. Each sample mean
  // must be within 4 standard errors of them.
  CHECK(std::abs(naive.mean - 90.7526) <= 4.0 * naive.se);
  CHECK(std::abs(drop.mean - 83.5518) <= 4.0 * drop.se);
  CHECK(std::abs(tail.mean - 100.0034) <= 4.0 * tail.se);
  // checks.md 3(a)/3(d) report naive 90.68 and drop 83.65 from their own sample of 5000
  // (continuous demand): two independent samples of the same size, so 4 * sqrt(2) SE.
  CHECK(std::abs(naive.mean - 90.68) <= 4.0 * std::sqrt(2.0) * naive.se);
  CHECK(std::abs(drop.mean - 83.65) <= 4.0 * std::sqrt(2.0) * drop.se);
  // checks.md 3(a): 38.9% censored; binomial SE sqrt(p (1 - p) / n).
  const double p = 0.391767;
  CHECK(std::abs(censored / double(kN) - p) <= 4.0 * std::sqrt(p * (1 - p) / kN));
  // The test can fail: the naive and drop means are many SE from the truth.
  CHECK(100.0 - naive.mean > 10.0 * naive.se);
  CHECK(100.0 - drop.mean > 10.0 * drop.se);
  // drop skips exactly the sold-out days, the others keep all.
  CHECK(drop.n == kN - censored);
  CHECK(tail.n == kN);
}

TEST_CASE("normal_tail feeds sales on other days and skips empty shelves",
          "[policies][censoring]") {
  const Scenario sc = test::scenario_from(kScenario);
  const auto policies = test::policies_for(sc);
  const DemandModel truth(sc);
  auto state = policies[2].censoring->make({sc, truth, 0});
  CHECK(state->needs_forecast());
  std::vector<Observation> obs(4);
  obs[0] = {.delivered = 30, .sold = 17, .leftover = 13, .open = true};
  obs[1] = {.delivered = 24, .sold = 24, .open = true, .sold_out = true};
  obs[2] = {.delivered = 0, .sold = 0, .open = true, .sold_out = true};
  obs[3] = {};  // closed
  const std::vector<DemandForecast> f(4, {20.0, 4.5 * 4.5});
  std::vector<double> out(4);
  state->treat(0, obs, f, out);
  CHECK(out[0] == 17.0);
  CHECK(out[1] == Approx(26.075872841186914).epsilon(1e-12));  // scipy truncnorm, above
  CHECK(std::isnan(out[2]));
  CHECK(std::isnan(out[3]));
}

}  // namespace
}  // namespace larder
