#pragma once
// The random demand multipliers of model.md as small pure functions: a lognormal with mean 1
// and a given cv, and a lognormal AR(1) (the log follows a Gaussian AR(1) whose stationary
// variance is that of the lognormal), so both have mean 1 whatever their spread.

#include <cmath>

namespace larder {

/// sigma of log X for a lognormal X with mean 1 and coefficient of variation `cv`:
/// cv^2 = exp(sigma^2) - 1.
inline double lognormal_sigma(double cv) {
  return std::sqrt(std::log1p(cv * cv));
}

/// exp(x - sigma^2 / 2): mean 1 when x ~ N(0, sigma^2).
inline double mean_one_multiplier(double x, double sigma) {
  return std::exp(x - 0.5 * sigma * sigma);
}

/// One step of the log-AR(1): x_t = phi x_{t-lag} + sqrt(1 - phi^2) sigma z_t, or sigma z_t
/// while no earlier value exists (`first`), so the series is stationary from its first day.
inline double log_ar1_step(double previous, double z, double phi, double sigma, bool first) {
  return first ? sigma * z : phi * previous + std::sqrt(1.0 - phi * phi) * sigma * z;
}

}  // namespace larder
