#pragma once
// Lag-7 persistence of demand: the correlation of an item's relative residual
// x / mean - 1 with the same store's residual one week earlier, over pairs of days that both
// did not sell out (a sold-out day's demand is unknown). Pooled over the item's stores, centred
// on the pairs' own means (Pearson). Bias: keeping only days that did not sell out cuts off
// high-demand days, which shrinks the residuals' spread and pulls the correlation toward zero,
// so it understates persistence when many days sell out. Its standard error is about
// 1 / sqrt(pairs) when there is no correlation.

#include "sim/fit/decomposition.hpp"
#include "sim/fit/series.hpp"

namespace larder {

struct PersistenceFit {
  int pairs = 0;
  double correlation = 0.0;  ///< NaN with fewer than 3 pairs
  double se = 0.0;           ///< 1 / sqrt(pairs)
};

PersistenceFit fit_lag7_persistence(const FitData& data, const Decomposition& fit, int item);

}  // namespace larder
