// The demand multipliers' moments from long simulated series against the lognormal closed
// forms (Johnson, Kotz and Balakrishnan, Continuous Univariate Distributions, vol. 1, the
// lognormal chapter): for X = exp(x - s^2/2) with x ~ N(0, s^2), E[X] = 1 and
// Var[X] = exp(s^2) - 1; for a Gaussian AR(1) log with coefficient phi at the lag,
// Corr(X_t, X_{t-lag}) = (exp(phi s^2) - 1) / (exp(s^2) - 1). Tolerances: 4 standard errors.

#include "sim/engine/demand_shocks.hpp"

#include <catch2/catch.hpp>
#include <vector>

#include "sim/random/stream.hpp"
#include "sim/stats/normal.hpp"
#include "sim/stats/summary.hpp"

namespace larder {
namespace {

/// A long series of the persistence multiplier at `lag` (lag 1 with phi 0: i.i.d. shocks).
std::vector<double> series(double cv, double phi, int lag, int n, std::uint64_t seed) {
  pcg32 g(seed, 3);
  const double s = lognormal_sigma(cv);
  std::vector<double> x(static_cast<size_t>(n));
  std::vector<double> out(static_cast<size_t>(n));
  for (int t = 0; t < n; ++t) {
    const double z = normal_quantile(to_unit(g()));
    const double prev = t >= lag ? x[static_cast<size_t>(t - lag)] : 0.0;
    x[static_cast<size_t>(t)] = log_ar1_step(prev, z, phi, s, t < lag);
    out[static_cast<size_t>(t)] = mean_one_multiplier(x[static_cast<size_t>(t)], s);
  }
  return out;
}

TEST_CASE("the traffic shock has mean 1 and the given cv", "[engine][shocks]") {
  const double cv = 0.2;
  const auto v = series(cv, 0.0, 1, 400000, 11);
  const Estimate mean = estimate_mean(v);
  CHECK(std::abs(mean.mean - 1.0) <= 4.0 * mean.stderr_);
  std::vector<double> sq;
  for (double x : v) sq.push_back((x - 1.0) * (x - 1.0));
  const Estimate var = estimate_mean(sq);
  CHECK(std::abs(var.mean - cv * cv) <= 4.0 * var.stderr_);
  CHECK(var.stderr_ < 0.02 * cv * cv);
}

TEST_CASE("persistence: mean 1, the given cv and the lognormal autocorrelation at its lag",
          "[engine][shocks]") {
  for (int lag : {1, 7}) {
    const double cv = 0.15;
    const double phi = 0.6;
    // Block means over replications of the series give honest standard errors for the
    // correlated draws (one series per seed).
    std::vector<double> means, cov, var;
    for (std::uint64_t seed = 0; seed < 40; ++seed) {
      const auto v = series(cv, phi, lag, 20000, 100 + seed);
      double m = 0, c = 0, s2 = 0;
      for (double x : v) m += x;
      m /= static_cast<double>(v.size());
      for (size_t t = static_cast<size_t>(lag); t < v.size(); ++t) {
        c += (v[t] - 1.0) * (v[t - static_cast<size_t>(lag)] - 1.0);
      }
      for (double x : v) s2 += (x - 1.0) * (x - 1.0);
      means.push_back(m);
      cov.push_back(c / static_cast<double>(v.size() - static_cast<size_t>(lag)));
      var.push_back(s2 / static_cast<double>(v.size()));
    }
    const double s2 = std::log1p(cv * cv);
    const double exact_cov = std::exp(phi * s2) - 1.0;  // Cov = exp(phi s^2) - 1 (mean 1)
    INFO("lag " << lag);
    const Estimate m = estimate_mean(means);
    const Estimate c = estimate_mean(cov);
    const Estimate v = estimate_mean(var);
    CHECK(std::abs(m.mean - 1.0) <= 4.0 * m.stderr_);
    CHECK(std::abs(v.mean - cv * cv) <= 4.0 * v.stderr_);
    CHECK(std::abs(c.mean - exact_cov) <= 4.0 * c.stderr_);
    CHECK(c.stderr_ < 0.05 * exact_cov);
  }
}

}  // namespace
}  // namespace larder
