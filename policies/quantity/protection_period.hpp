#pragma once
// Ordering from the perishable inventory position (policies.md, quantity rules): the shared core
// of every quantile rule (critical_fractile, in_stock_target, leftover_aversion,
// network_in_stock, order_up_to).
//
// An order placed after close on day t arrives on the morning of a = t + L (lead time L). It
// must cover the protection period: the L - 1 days before it arrives and the n days it serves
// (n = the engine's window, the days until the next delivery arrives or the units expire, or
// more for order_up_to's review_days, at most the shelf life), cut at the end of the horizon.
// The rule chooses a stock target S for the period's demand (a quantile); then
//   IP = stock on hand (every age) + units on order,
//   O(Q) = expected_outdating(): units expected to outdate before the period ends, from running
//          the daily mean demand through the stock by age, the pipeline and the order Q itself
//          (the freshest units), with the scenario's fifo_share taking the oldest,
//   Q = max(0, S - IP + ceil(O(Q))), iterated from Q = max(0, S - IP) until Q repeats (at most
//       20 rounds).
// With lead time 1 and a one-day window nothing outdates early and Q = S - IP exactly, which
// is the plain newsvendor order S - usable stock - units on order.
//
// A discounted tier (next-day discount) beside the delivery takes full-price customers: with x
// discounted units shown on the arrival day, the full-price demand of that day is
// D - min(x, A), A ~ Binomial(D, take_rate) the customers who take a discounted unit (model.md,
// step 3), so the arrival day's mean is lowered by E[min(x, A)] (`discount_netting`). x is the
// stock on its discounted extra day tomorrow with lead time 1; with a longer lead time, the
// units expected to reach the end of their life the day before the arrival.

#include <cstdint>
#include <span>
#include <vector>

#include "policies/quantity_rule.hpp"
#include "sim/scenario/scenario.hpp"

namespace larder {

/// Estimated outdating (EWA, Broekmeulen and van Donselaar 2009): runs expected withdrawals
/// through the stock by age, day by day.
///
/// Day 0 is the day after the order is placed. `stock_by_age[k]` units can be sold on days
/// 0..k; `arrivals[d]` units arrive on the morning of day d as the freshest and can be sold
/// for `life` days. On each day d, withdrawals[d] (the mean demand) take
/// sold = min(withdrawals[d], stock) units: a share `fifo_share` of them from the oldest end,
/// the rest from the freshest end (as the engine's picking does on average); then the units
/// on their last day leave and the rest age by a day. Returns the units that leave at the
/// closes of days 0..n-2 (n = withdrawals.size()): units leaving at the close of the last
/// day have served the whole period and do not count. When `leaving` is not empty it receives
/// the units leaving at each day's close (size n). Amounts are expectations (not rounded).
double expected_outdating(std::span<const std::int32_t> stock_by_age,
                          std::span<const std::int32_t> arrivals, int life,
                          std::span<const double> withdrawals, double fifo_share,
                          std::span<double> leaving = {});

/// E[min(x, A)] for A ~ Binomial(D, take_rate) and D with the forecast's mean and variance
/// under `family`: the full-price sales that x discounted units shown beside full-price stock
/// take on average (model.md, step 3). For Poisson D, A is Poisson(take_rate * mean) exactly
/// (thinning); for the other families A is taken with the same family and moments
/// mean_A = take_rate * mean, var_A = take_rate^2 * var + take_rate (1 - take_rate) * mean.
double discount_netting(const DemandForecast& day, DemandFamily family, double take_rate, double x);

/// Per-store scratch of the rules that order from the perishable inventory position.
class ProtectionPeriod {
 public:
  explicit ProtectionPeriod(const Scenario& scenario);

  /// Prepares one decision: the daily forecasts of every item over its protection period, with
  /// `review_days` the days a delivery serves at least (1 for the quantile rules).
  void prepare(const OrderContext& ctx, std::span<const OrderInput> in, int review_days);
  /// The demand of item i's protection period (after prepare), its arrival day netted of the
  /// full-price sales the discounted tier takes.
  DemandForecast demand(size_t i) const;
  /// Whether item i's order is the plain newsvendor order: lead time 1, a one-day period, no
  /// discounted tier (then order = target - usable stock - units on order).
  bool plain(size_t i) const;
  /// The order that lifts item i's position to `target` plus its expected outdating.
  int order_to(size_t i, long target);
  /// The smallest order Q with P(D_w <= X + Q - extra) >= p, where D_w is the demand of the
  /// engine's window under `family` and X the stock carried into the arrival day: exact over
  /// the demand of the day before the arrival with lead time 2 (X, and the units reaching
  /// their discounted day, for each count and picking split), the expectation (EWA) with
  /// longer lead times, and today's stock with lead time 1. Each outcome's discounted units
  /// raise the full-price stock that covers D_w by what they take (discount_netting). A window
  /// of several days adds the stock expected to outdate within it (EWA). Plain orders
  /// (`plain`) are the quantile target minus usable stock and units on order.
  int quantile_order(size_t i, DemandFamily family, double p, int extra);

 private:
  const Scenario& scenario_;
  double fifo_share_;
  double take_rate_;
  int lead_ = 1;
  int items_ = 0;
  std::span<const OrderInput> in_;
  std::vector<int> days_;                  ///< per item: days of its protection period
  std::vector<DemandForecast> forecasts_;  ///< [d * items + i]: day order_day + 1 + d
  std::vector<DemandForecast> day_;
  std::vector<double> withdrawals_;
  std::vector<double> leaving_;
  std::vector<std::int32_t> stock_;
  std::vector<std::int32_t> arrivals_;
  /// Outcomes of the stock carried into the arrival day: (units, discounted units, probability).
  struct Carried {
    double units;
    double discounted;
    double probability;
  };
  std::vector<Carried> carried_;
  void carry(size_t i);
  /// Item i's forecast of day order_day + 1 + d.
  const DemandForecast& day_forecast(size_t i, int d) const;
  /// Units expected to outdate within the window of item i when `q` arrives (EWA).
  double window_outdating(size_t i, long q);
};

}  // namespace larder
