#pragma once
// What hourly sales and sell-out times say about an item (checks.md 3(c)):
// - the intraday profile: each opening hour's share of the day's sales, pooled over the days
//   that did not sell out (on a sold-out day the late hours are cut off, so those days would
//   tilt the profile toward the morning);
// - the exposure estimate of the base: under a nonhomogeneous Poisson model with rate
//   base x size x weekday x g(t), a day that sold out at time tau with sales x contributes
//   Poisson(mean x G(tau)) sales, G the cumulative profile, so the MLE is
//   sum x / sum (size x weekday x G(tau)), with G = 1 on days that did not sell out (the
//   exposure-time MLE; Anupindi, Dada and Gupta 1998, section 4). It is an independent check of
//   the censored-likelihood base when the sell-out times are recorded.

#include <optional>
#include <span>
#include <vector>

#include "sim/fit/decomposition.hpp"
#include "sim/fit/series.hpp"

namespace larder {

struct IntradayFit {
  std::vector<double> shares;  ///< per opening hour, summing to 1; empty without hourly sales
  int profile_days = 0;        ///< days that did not sell out and sold something
  std::optional<double> exposure_base;  ///< needs hourly sales and sell-out times
  int timed_sellouts = 0;               ///< sold-out days with a time, used by the exposure MLE
};

/// The cumulative share G of a day's demand that arrives before `minute` (minutes after
/// midnight), with hourly `shares` starting at clock hour `first_hour` and spread evenly
/// within each hour; 0 before the first hour, 1 after the last.
double cumulative_share(std::span<const double> shares, int first_hour, double minute);

/// The item's profile and exposure estimate; `fit` gives each day's size and weekday factor.
IntradayFit fit_intraday(const FitData& data, const Decomposition& fit, int item);

}  // namespace larder
