#pragma once
// Moments of the upper tail of a normal distribution, X given X >= c (the truncated normal of
// Tobin 1958 and Nahmias 1994), and their use for an integer demand count D that is known only
// to be at least the sales s of a sold-out day (checks.md 3(a)). Shared by the `normal_tail`
// and `product_limit` censoring treatments.

namespace larder {

/// Mean and variance of a distribution (here: of a tail).
struct TailMoments {
  double mean = 0.0;
  double variance = 0.0;
};

/// The inverse Mills ratio lambda(a) = phi(a) / (1 - Phi(a)), the hazard of the standard
/// normal: the ratio itself up to a = 5; beyond, Laplace's continued fraction for the Mills
/// ratio (Abramowitz and Stegun, ch. 26), lambda = a + 1/(a + 2/(a + 3/(a + ...))), which keeps
/// full precision where 1 - Phi loses relative accuracy and, from a = 37, underflows.
double inverse_mills(double a);

/// Mean and variance of X given X >= cut, X ~ N(mean, variance): mean + sd * lambda(a) and
/// variance * (1 + a * lambda(a) - lambda(a)^2) with a = (cut - mean) / sd (the truncated
/// normal; Johnson, Kotz and Balakrishnan, Continuous Univariate Distributions, ch. 13). Beyond
/// a = 5 the variance factor is 1 - lambda * (lambda - a) with lambda - a from the continued
/// fraction, so it does not cancel. A variance <= 0 (or not finite) is a point mass: mean
/// max(mean, cut), variance 0.
TailMoments normal_upper_tail(double mean, double variance, double cut);

/// Mean and variance of an integer count D given D >= s (a sold-out day with sales s: demand
/// was at least the stock, checks.md 3), with D approximated by N(mean, variance) and the
/// continuity correction D >= s <=> X >= s - 0.5. The mean is raised to s when the normal
/// approximation puts it below (possible far in the tail: D >= s holds for certain).
TailMoments count_upper_tail(double mean, double variance, double s);

}  // namespace larder
