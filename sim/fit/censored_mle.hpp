#pragma once
// The censored-likelihood fit of one demand law to a sample of days (checks.md 3(a)): days
// that did not sell out contribute log P(D = sales), sold-out days log P(D >= sales). The
// maximum-likelihood estimate is found by Newton's method on (log mean, log cv) and its
// standard errors come from the observed information. Tobin (1958) for the normal (Tobit);
// Agrawal and Smith (1996) for the negative binomial with unobserved lost sales.

#include <cstdint>
#include <span>

#include "sim/scenario/scenario.hpp"

namespace larder {

/// One censored-likelihood estimate of an i.i.d. sample.
struct CensoredFit {
  DemandFamily family = DemandFamily::poisson;
  double mean = 0.0;
  double cv = 0.0;  ///< 0 for poisson
  double mean_se = 0.0;
  double cv_se = 0.0;
  double neg_log_likelihood = 0.0;
  bool converged = false;
};

/// Fits `family` to days with these sales and sold-out flags (same length, at least one day
/// that did not sell out).
CensoredFit fit_censored(DemandFamily family, std::span<const int> sales,
                         std::span<const std::uint8_t> sold_out);

/// Mean, sd and negative log-likelihood of the continuous Tobit fit (checks.md 3(a)'s form).
struct TobitFit {
  double mean = 0.0;
  double sd = 0.0;
  double neg_log_likelihood = 0.0;
};
TobitFit fit_tobit(std::span<const double> values, std::span<const std::uint8_t> censored);

}  // namespace larder
