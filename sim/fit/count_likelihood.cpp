#include "sim/fit/count_likelihood.hpp"

#include <boost/math/special_functions/beta.hpp>
#include <boost/math/special_functions/gamma.hpp>
#include <cmath>
#include <limits>
#include <numbers>

#include "sim/stats/log_gamma.hpp"
#include "sim/stats/normal.hpp"

namespace larder {

namespace {

constexpr double kMinusInf = -std::numeric_limits<double>::infinity();

/// log of a probability, -inf for 0 (and for a negative value left by rounding).
double log_p(double p) {
  return p > 0.0 ? std::log(p) : kMinusInf;
}

double poisson_term(double mean, int x, bool at_least) {
  const double k = static_cast<double>(x);
  if (at_least) return log_p(boost::math::gamma_p(k, mean));  // P(D >= x) = P(x, mean)
  if (mean == 0.0) return x == 0 ? 0.0 : kMinusInf;
  return k * std::log(mean) - mean - log_gamma(k + 1.0);
}

double negative_binomial_term(double mean, double cv, int x, bool at_least) {
  const double excess = cv * cv * mean - 1.0;
  if (excess <= 0.0 || mean == 0.0) return poisson_term(mean, x, at_least);
  const double r = mean / excess;
  const double p = r / (r + mean);
  const double k = static_cast<double>(x);
  // P(D <= k) = I_p(r, k + 1), so P(D >= x) = 1 - I_p(r, x).
  if (at_least) {
    if (r > 1e4 && x <= 10000) {
      // Near Poisson the incomplete beta at a huge first argument loses accuracy: sum the
      // probabilities below x by the recursion P(j + 1) = P(j) (r + j) / (j + 1) (1 - p).
      double term = std::exp(-r * std::log1p(mean / r)), below = 0.0;
      for (int j = 0; j < x; ++j) {
        below += term;
        term *= (r + j) / (j + 1.0) * (mean / (r + mean));
      }
      if (1.0 - below > 1e-9) return std::log1p(-below);
    }
    return log_p(boost::math::ibetac(r, k, p));
  }
  // log Gamma(k + r) - log Gamma(r): as a sum of logs when r is large and k is not, where the
  // difference of two huge log-gammas would cancel (a negative binomial near Poisson, e.g. a
  // small substitute demand added to a Poisson item's).
  double rising = 0.0;
  if (r > 1e4 && x <= 10000) {
    for (int j = 0; j < x; ++j) rising += std::log(r + j);
  } else {
    rising = log_gamma(k + r) - log_gamma(r);
  }
  return rising - log_gamma(k + 1.0) - r * std::log1p(mean / r) + k * std::log(mean / (r + mean));
}

double normal_term(double mean, double cv, int x, bool at_least) {
  const double sd = cv * mean;
  const double k = static_cast<double>(x);
  if (!(sd > 0.0)) {
    const double point = std::max(0.0, std::round(mean));
    return (at_least ? point >= k : point == k) ? 0.0 : kMinusInf;
  }
  const double lo = (k - 0.5 - mean) / sd;
  if (at_least) return log_p(normal_sf(lo));
  const double hi = (k + 0.5 - mean) / sd;
  if (x == 0) return log_p(normal_cdf(hi));
  // Difference of the tail on the side where it is small, so it does not cancel.
  return log_p(lo > 0.0 ? normal_sf(lo) - normal_sf(hi) : normal_cdf(hi) - normal_cdf(lo));
}

}  // namespace

double count_log_likelihood(DemandFamily family, double mean, double cv, int x, bool at_least) {
  if (x < 0) return kMinusInf;
  if (at_least && x == 0) return 0.0;
  switch (family) {
    case DemandFamily::poisson:
      return poisson_term(mean, x, at_least);
    case DemandFamily::negative_binomial:
      return negative_binomial_term(mean, cv, x, at_least);
    case DemandFamily::normal:
      return normal_term(mean, cv, x, at_least);
  }
  return kMinusInf;
}

double tobit_log_likelihood(double mean, double sd, double x, bool censored) {
  const double z = (x - mean) / sd;
  if (censored) return log_p(normal_sf(z));
  return -0.5 * z * z - std::log(sd) - 0.5 * std::log(2.0 * std::numbers::pi);
}

}  // namespace larder
