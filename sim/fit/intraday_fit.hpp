#pragma once
// What hourly sales and sell-out times say about an item (checks.md 3(c)):
// - the intraday profile: each opening hour's share of the day's sales, pooled over the days
//   that did not sell out (on a sold-out day the late hours are cut off, so those days would
//   tilt the profile toward the morning);
// - the exposure estimate of the base: customers arrive as a Poisson process with rate
//   lambda x g(t) within the day, so a day that sold out at time tau with sales x had x arrivals
//   in the share G(tau) of the day (G the cumulative profile, 1 on days that did not sell out;
//   the exposure-time MLE of Anupindi, Dada and Gupta 1998, section 4). For a poisson item
//   lambda is the fitted mean base x size x weekday and the MLE is
//   sum x / sum (size x weekday x G(tau)). For a negative binomial item lambda is gamma
//   distributed across days (shape r = mean / (cv^2 mean - 1), mean the day's mean: the
//   negative binomial split over the hours multinomially is exactly this mixed process), and a
//   day contributes r log(beta) - (x + r) log(G + beta) + log Gamma(x + r) - log Gamma(r),
//   beta = r / mean, maximised over the base by Newton's method with the cv held at its fitted
//   value. A normal item is scored as the negative binomial with its cv (the normal is not a
//   mixed Poisson process: an approximation). It is an independent check of the
//   censored-likelihood base when the sell-out times are recorded: it uses when the day sold
//   out, the censored likelihood only that it did.

#include <cstdint>
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
  double exposure_se = 0.0;             ///< from the observed information
  int timed_sellouts = 0;               ///< sold-out days with a time, used by the exposure MLE
};

/// The cumulative share G of a day's demand that arrives before `minute` (minutes after
/// midnight), with hourly `shares` starting at clock hour `first_hour` and spread evenly
/// within each hour; 0 before the first hour, 1 after the last.
double cumulative_share(std::span<const double> shares, int first_hour, double minute);

/// The item's profile and exposure estimate; `fit` gives each day's size and weekday factor and
/// the cv. `substitutes_from` (per row; empty = none) is the minute from which a row's sales
/// include other items' customers (-1: never): such a day is left out of the profile (a day
/// that did not sell out, left out for what other items did, which does not depend on this
/// item's demand), and the exposure estimate counts only its sales in the hours before that
/// minute, over the share of the day those hours hold (a Poisson-process count in a window
/// chosen by other items' events).
IntradayFit fit_intraday(const FitData& data, const Decomposition& fit, int item,
                         std::span<const std::int16_t> substitutes_from = {});

}  // namespace larder
