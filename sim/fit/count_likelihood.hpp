#pragma once
// One day's contribution to a censored demand likelihood (checks.md 3(a)): log P(D = x) on a
// day that did not sell out, log P(D >= x) on a sold-out day with sales x. "Sold out" means
// the last unit went, so demand was at least the sales: the censored term is log sf(x - 1) in
// scipy's terms, not log sf(x), which would read the flag as D > x (the integer trap of
// checks.md 3(a)-(b)). The laws are those the simulator draws from (`CountLaw`, model.md):
// Poisson, the negative binomial and the normal rounded to the nearest integer, both spread by
// a cv (variance = (cv * mean)^2).

#include "sim/scenario/scenario.hpp"

namespace larder {

/// log P(D = x) (`at_least` false) or log P(D >= x) (`at_least` true) for a count with this
/// mean under `family`, spread by `cv` (ignored for poisson). The negative binomial has size
/// r = mean / (cv^2 mean - 1); when cv^2 mean <= 1 it cannot exist and is Poisson, as in the
/// simulator. The normal is max(0, round(X)), X ~ N(mean, (cv mean)^2): P(D = x) =
/// Phi((x + 0.5 - mean) / sd) - Phi((x - 0.5 - mean) / sd), P(D >= x) = 1 - Phi((x - 0.5 -
/// mean) / sd) for x >= 1. Returns 0 for log P(D >= 0) and -inf for an impossible value.
double count_log_likelihood(DemandFamily family, double mean, double cv, int x, bool at_least);

/// The continuous Tobit term (Tobin 1958): log of the N(mean, sd^2) density at x, or of
/// P(X >= x) when censored. The form of checks.md 3(a)'s check values.
double tobit_log_likelihood(double mean, double sd, double x, bool censored);

}  // namespace larder
