#pragma once
// Binomial(n, p) by inversion of one uniform: the oldest-versus-freshest split of a day's sales
// (model.md, step 3). n is a day's sales of one item, so a sequential search is cheap.

namespace larder {

/// Smallest k in [0, n] with P(X <= k) >= u for X ~ Binomial(n, p); u in (0, 1).
int binomial_inverse(double u, int n, double p);

/// The same with log(1 - p) given, for callers that draw many times with one p.
int binomial_inverse(double u, int n, double p, double log_q);

}  // namespace larder
