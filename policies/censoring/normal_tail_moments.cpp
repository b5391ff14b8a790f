// Truncated-normal tail moments (Tobin 1958; Nahmias 1994): the inverse Mills ratio from the
// normal density and upper tail, or from Laplace's continued fraction far in the tail.

#include "policies/censoring/normal_tail_moments.hpp"

#include <algorithm>
#include <cmath>

#include "sim/stats/normal.hpp"

namespace larder {

namespace {

/// Beyond this standardised cut, the continued fraction (30 terms give full double precision
/// from a = 5 on, checked against mpmath).
constexpr double kContinuedFraction = 5.0;
constexpr int kTerms = 30;

/// lambda(a) - a = 1/(a + 2/(a + 3/(a + ...))), evaluated from the 30th term back.
double mills_excess(double a) {
  double t = 0.0;
  for (int k = kTerms; k >= 2; --k) t = k / (a + t);
  return 1.0 / (a + t);
}

}  // namespace

double inverse_mills(double a) {
  if (a <= kContinuedFraction) return normal_pdf(a) / normal_sf(a);
  return a + mills_excess(a);
}

TailMoments normal_upper_tail(double mean, double variance, double cut) {
  if (!(variance > 0.0) || !std::isfinite(variance)) return {std::max(mean, cut), 0.0};
  const double sd = std::sqrt(variance);
  const double a = (cut - mean) / sd;
  double lambda = 0.0;
  double factor = 0.0;  // Var[Z | Z >= a] for standard normal Z
  if (a <= kContinuedFraction) {
    lambda = normal_pdf(a) / normal_sf(a);
    factor = 1.0 + a * lambda - lambda * lambda;
  } else {
    const double excess = mills_excess(a);
    lambda = a + excess;
    factor = 1.0 - lambda * excess;
  }
  return {mean + sd * lambda, variance * std::max(factor, 0.0)};
}

TailMoments count_upper_tail(double mean, double variance, double s) {
  TailMoments t = normal_upper_tail(mean, variance, s - 0.5);
  t.mean = std::max(t.mean, s);
  return t;
}

}  // namespace larder
