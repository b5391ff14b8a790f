#pragma once
// Persistence of demand: the correlation of an item's demand with the same store's demand `lag`
// days earlier (7: the same weekday a week before; 1: the day before), estimated by a censored
// bivariate likelihood on the pairs of days `lag` apart (a pairwise likelihood; Varin, Reid
// and Firth 2011). Each day's demand is the fitted count law (its mean, cv and any substitute
// demand, `total_demand.hpp`); the pair is joined by a Gaussian copula with correlation rho:
// D = F^-1(Phi(Z)), (Z_t-lag, Z_t) standard bivariate normal. A day that did not sell out says
// D = sales, so Z lies in (Phi^-1(F(x - 1)), Phi^-1(F(x))]; a sold-out day says D >= sales, so
// Z lies above Phi^-1(F(x - 1)). A pair scores the bivariate normal probability of its
// rectangle. Sold-out days are kept as what they say, so the selection of the days that did
// not sell out (stock follows past sales) does not bias rho: the stock of a day is known from
// the past, and the censored likelihood treats any known bound alike. The margins are held at
// their fitted values (inference functions for margins; Joe 2005), so the interval leaves out
// their uncertainty. The interval is the profile-likelihood one (the 95% point of chi-square
// with one degree of freedom, 3.841, from memory), which at rho = 0 is about +-1.96 /
// sqrt(pairs).

#include <span>

#include "sim/fit/decomposition.hpp"
#include "sim/fit/series.hpp"

namespace larder {

struct PersistenceFit {
  int lag = 7;
  int pairs = 0;
  double correlation = 0.0;      ///< NaN with fewer than 30 pairs
  double se = 0.0;               ///< from the observed information
  double low = 0.0, high = 0.0;  ///< 95% profile-likelihood interval
  /// Whether the interval leaves out 0: persistence that can be told from none.
  bool distinguishable() const { return low > 0.0 || high < 0.0; }
};

/// The item's correlation at `lag` days; `extra` per row (empty = none) is its substitute demand.
PersistenceFit fit_persistence(const FitData& data, const Decomposition& fit, int item, int lag,
                               std::span<const ExtraDemand> extra = {});

}  // namespace larder
