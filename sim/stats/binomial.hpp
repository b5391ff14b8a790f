#pragma once
// Binomial(n, p) by inversion of one uniform: the oldest-versus-freshest split of a day's sales
// (model.md, step 3). n is a day's sales of one item, so a sequential search is cheap.

#include <vector>

namespace larder {

/// P(X = k), k = 0..n, X ~ Binomial(n, p) (log space, normalised; exact at p = 0 and 1): the
/// picking and take-rate splits of the exact chains (policies/quantity/item_chain,
/// protection_period).
std::vector<double> binomial_pmf(int n, double p);

/// Smallest k in [0, n] with P(X <= k) >= u for X ~ Binomial(n, p); u in (0, 1).
int binomial_inverse(double u, int n, double p);

/// The same with log(1 - p) given, for callers that draw many times with one p.
int binomial_inverse(double u, int n, double p, double log_q);

}  // namespace larder
