#pragma once
// `product_limit`: the demand distribution of each weekday estimated nonparametrically by the
// Kaplan-Meier product-limit estimator (Kaplan and Meier 1958) over the last `weeks`
// observations of that weekday, used in place of the parametric forecast (the Kaplan-Meier
// approach to censored newsvendor demand of Huh, Levi, Rusmevichientong and Orlin 2011;
// checks.md 3(b)). A day that did not sell out is an event at its sales; a sold-out day is
// right-censored, recorded at sales - 0.5 because "sold out" means D >= sales and Kaplan-Meier
// reads a censored value c as D > c (the discrete-demand trap of checks.md 3(b)).
//
// The quantity rules take a mean and a variance, so `refine` replaces the forecast's with the
// moments of the estimated distribution. When the largest observation is censored, the data
// leave a mass S(last event) unplaced above it; `tail` says where it goes (see below).

#include <span>

#include "policies/censoring/kaplan_meier.hpp"
#include "policies/forecast.hpp"

namespace larder {

/// Where the Kaplan-Meier mass left above the largest (censored) observation goes.
enum class ProductLimitTail {
  /// The count tail D >= s (s the largest censored sales; continuity-corrected, as in
  /// `normal_tail`) of the normal whose mean and variance are those of the completed
  /// distribution itself: a self-consistent completion, the EM fixed point of a normal fitted
  /// to the Kaplan-Meier masses and the censored remainder (Dempster, Laird and Rubin 1977),
  /// started from the parametric forecast. The data decide up to s, the normal shape only
  /// beyond. With no event in the window (every day sold out) there is nothing to fit, and the
  /// tail of the parametric forecast's normal is used.
  normal,
  /// All of it at s: the restricted mean of checks.md 3(b). With a steady order Q this is the
  /// distribution of min(D, Q), i.e. the naive sales again, so it spirals down like `ignore`.
  restricted,
};

/// Mean and variance of the demand distribution estimated by `km` from `n` observations
/// (censored ones at sales - 0.5), with the unplaced mass as `tail` says (`parametric` starts
/// the normal tail's iteration). The variance is the plug-in variance times (n + 1) / (n - 1):
/// Bessel's n / (n - 1) and the 1 + 1/n of predicting a new day around a mean estimated from n days
/// (the normal predictive variance), so that a short window does not understate the spread.
/// With n = 1 the variance is the parametric forecast's: one day says nothing about the spread.
DemandForecast product_limit_moments(const KaplanMeier& km, int n, const DemandForecast& parametric,
                                     ProductLimitTail tail);

}  // namespace larder
