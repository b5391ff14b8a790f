#pragma once
// Substitute shares estimated jointly with the substitute's own demand, by censored likelihood.
//
// The model is the simulator's (model.md): a customer of item j who finds j out takes
// substitute i with probability alpha_ji if i is in stock, and is lost otherwise. Count as i's
// demand every customer who comes for i, served or not: on a store-day on which j sold out at a
// recorded time tau, i's demand is its own plus Binomial(L, alpha_ji), L the own demand of j
// that arrived after tau. i then sold out exactly when that demand reached its stock, whatever
// the order of the two sell-outs, so the censored likelihood holds as it does without
// substitution (keeping only the days on which i was still in stock at tau would select i's
// quiet days and read the share low). Given j's sales x by tau, L's conditional mean and
// variance follow from j's fitted law taken as a gamma-mixed Poisson process with j's intraday
// profile G (the negative binomial split over the hours multinomially is exactly that): the
// day's rate has a gamma posterior with shape r + x and rate r / mean + G(tau), so E[L] =
// (1 - G)(r + x) / (r / mean + G) (mean (1 - G) for Poisson), and the variance adds
// (1 - G)^2 (r + x) / (r / mean + G)^2. i's day is scored by the censored likelihood of own +
// substitute demand (`total_demand.hpp`): a day that sold out as demand >= sales, the others
// as demand = sales. Known bias: when customers of i go to j, j's sell-outs are partly caused
// by i's busy days, so the reverse share alpha_ji reads high (about up to 2 standard errors for
// a true 0 in tests/fit_independent.test.cpp); mutual pairs are not estimated reliably.
//
// The shares and the decomposition are fitted by alternation until the shares move less than
// 1e-3 (at most 10 rounds): the shares of each substitute by Newton's method together with
// one common factor on its weekday means (base and shares are strongly correlated; the factor
// lets each round move both), then the decomposition with every row's substitute demand held
// (each item keeping its family between rounds; the last round chooses again). Each item's
// base is therefore its own demand, measured on every day. Standard errors come from the joint
// observed information of the substitute's weekday means, cv and shares (store sizes and the
// other items held at their estimates; the cv held too when the item sits at its Poisson
// limit, where the cv is not determined). Only one level of substitution is modelled (a
// customer who substitutes does not substitute again), as in the simulator.

#include <cstdint>
#include <vector>

#include "sim/fit/decomposition.hpp"
#include "sim/fit/intraday_fit.hpp"
#include "sim/fit/series.hpp"

namespace larder {

struct SubstituteShare {
  int out_item = 0;    ///< j, the item that was out
  int substitute = 0;  ///< i, the item bought instead
  double share = 0.0;  ///< alpha_ji (may be negative: noise)
  double se = 0.0;
  int store_days = 0;       ///< store-days on which j sold out at a known time (i with a row)
  double lost_units = 0.0;  ///< j's expected demand after its sell-outs on those days
};

struct SubstitutionFit {
  std::vector<SubstituteShare> shares;  ///< every pair with at least min_store_days
  std::vector<ExtraDemand> extra;       ///< per row of data.rows at the fitted shares
  /// Per row: the minute the first of the item's sources sold out while it was in stock (from
  /// then on its sales include substitutes); -1 when none did.
  std::vector<std::int16_t> substitutes_from;
  int rounds = 0;
  bool converged = false;
};

/// Fits the shares of every ordered pair of fitted items with at least `min_store_days`
/// store-days of opportunity, refitting `fit` (the decomposition) with each row's substitute
/// demand; `intraday` gives each item's profile. Empty without hourly sales and sell-out times.
SubstitutionFit fit_substitution(const FitData& data, const FitOptions& options, Decomposition& fit,
                                 const std::vector<IntradayFit>& intraday, int min_store_days = 10);

}  // namespace larder
