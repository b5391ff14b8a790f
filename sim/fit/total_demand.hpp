#pragma once
// An item's demand on a store-day as the fit models it: its own demand (the item's family at
// its fitted mean and cv) plus the customers of other items that found theirs out and came to
// it (substitution). The sum is scored as the item's family with the summed mean and variance
// (a moment match: exact for the mean and variance, an approximation of the law's shape).

#include "sim/scenario/scenario.hpp"

namespace larder {

/// Substitute demand a store-item-day gains: expected customers and their variance. A `mean`
/// that is NaN leaves the day out of the fit (a sell-out of unknown time hid how many came).
struct ExtraDemand {
  double mean = 0.0;
  double var = 0.0;
};

/// The variance of the own demand: the mean for poisson (and for a negative binomial with
/// cv^2 mean <= 1, which is Poisson, model.md), (cv mean)^2 otherwise.
double own_variance(DemandFamily family, double mean, double cv);

/// The cv of own + extra demand: sqrt(own variance + extra.var) / (mean + extra.mean); the
/// own cv when there is no extra demand.
double total_cv(DemandFamily family, double mean, double cv, const ExtraDemand& extra);

/// log P(D = x) or log P(D >= x) (`at_least`) for D = own demand (mean, cv) + extra demand.
double total_log_likelihood(DemandFamily family, double mean, double cv, const ExtraDemand& extra,
                            int x, bool at_least);

/// P(D <= x) for the same D (0 for x < 0).
double total_cdf(DemandFamily family, double mean, double cv, const ExtraDemand& extra, int x);

}  // namespace larder
