#pragma once
// The Kaplan-Meier product-limit estimator of a survival function from right-censored data
// (Kaplan and Meier 1958): S(t) = prod over event times t_i <= t of (1 - d_i / n_i), with d_i
// events at t_i and n_i observations >= t_i. An observation censored at t_i stays in the risk
// set at t_i (the standard convention, checks.md 3(b); statsmodels SurvfuncRight agrees). For
// demand, an event is a day that did not sell out (demand seen) and a censored value is a
// sold-out day (demand at least the sales); Huh et al. (2011) use it for inventory control.

#include <limits>
#include <span>
#include <vector>

namespace larder {

/// One observation: a time (here a demand value) and whether it is right-censored.
struct SurvivalObservation {
  double time = 0.0;
  bool censored = false;
};

/// The estimated step function: at each distinct event time, the number at risk, the events
/// and S just after it (S = 1 before the first event time).
struct KaplanMeier {
  std::vector<double> times;
  std::vector<int> at_risk;
  std::vector<int> events;
  std::vector<double> survival;
  /// The largest censored time (-inf when nothing is censored).
  double largest_censored = -std::numeric_limits<double>::infinity();

  /// S(t) = P(T > t): right-continuous, flat after the last event time.
  double survival_at(double t) const;
  /// S after the last event time: the mass the data leave unplaced (0 unless the largest
  /// observation is censored).
  double remaining() const { return survival.empty() ? 1.0 : survival.back(); }
  /// Restricted mean: the integral of S from 0 to tau (for a count, sum of S(k), k < tau).
  double restricted_mean(double tau) const;
};

/// The estimate from observations in any order; `data` is sorted in place. `out`'s vectors are
/// reused (no allocation once they have grown), so this can run per store-item-day.
void kaplan_meier(std::span<SurvivalObservation> data, KaplanMeier& out);

/// Convenience form for tests and one-off use.
KaplanMeier kaplan_meier(std::vector<SurvivalObservation> data);

}  // namespace larder
