#pragma once
// Substitute shares from hourly sales and sell-out times, by stockout-state pooling (Karabati,
// Tan and Öztürk 2009, "A method for estimating stock-out-based substitution rates by using
// point-of-sale data", IIE Transactions 41(5)): the opening hours of every store-day are
// grouped into states by which items were out for the whole hour (hours in which an item sold
// out are left out), and the sales are pooled within each state.
//
// For an item j that is out and a substitute i that is in stock, the share is
//   alpha_ij = sum over hours in state {j} of (sales_i - r_i(h) x mean_i)
//              / sum over the same hours of mean_j x share_j(h),
// with mean_k the fitted daily mean of the store-day, h the clock hour, r_i(h) = i's sales per
// unit of daily mean in hour h over the store-days in state "none out" at that hour (the fitted
// base of i includes its substitute sales, so i's own level is measured, hour by hour, where
// nobody substitutes), and share_j j's hourly profile from store-days on which nothing sold out.
// The denominator is j's lost demand: Poisson arrivals after the sell-out are independent of
// the past. Standard errors by the Poisson bootstrap over store-days (200 replicates, profiles
// and baselines re-estimated). Biases: overdispersed demand for j (a day that sells out early
// is a high-demand day, so later demand is above its mean) pushes alpha up; hours in which i
// is in stock are selected toward low demand for i when i also sells out, pushing it down.
// Only states with exactly one item out are used.

#include <vector>

#include "sim/fit/decomposition.hpp"
#include "sim/fit/series.hpp"

namespace larder {

struct SubstituteShare {
  int out_item = 0;    ///< j, the item that was out
  int substitute = 0;  ///< i, the item bought instead
  double share = 0.0;  ///< alpha_ij (may be negative or above 1: noise)
  double se = 0.0;
  int store_days = 0;       ///< store-days with hours in state {j} and i in stock
  double lost_units = 0.0;  ///< j's expected demand over those hours
};

/// Every pair (j, i) of fitted items with at least `min_store_days` store-days in state {j};
/// empty without hourly sales and sell-out times.
std::vector<SubstituteShare> fit_substitution(const FitData& data, const Decomposition& fit,
                                              int min_store_days = 10);

}  // namespace larder
