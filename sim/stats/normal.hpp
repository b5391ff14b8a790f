#pragma once
// The standard normal distribution: density, distribution function, upper tail, quantile and
// loss function. Own implementations (not std:: distributions or Boost) so that results are
// identical on every platform and the newsvendor formulas of checks.md 1.2 read directly.

namespace larder {

/// Standard normal density phi(z).
double normal_pdf(double z);

/// Standard normal distribution function Phi(z) = P(Z <= z), as 0.5 * erfc(-z / sqrt 2) so that
/// the lower tail keeps full relative precision.
double normal_cdf(double z);

/// Upper tail 1 - Phi(z), as 0.5 * erfc(z / sqrt 2): accurate for large z, where 1 - Phi(z)
/// would cancel to zero.
double normal_sf(double z);

/// Quantile z_p with Phi(z_p) = p, for p in (0, 1); returns -inf / +inf at p = 0 / 1 and NaN
/// outside [0, 1]. Wichura's algorithm AS 241 (PPND16, Applied Statistics 37, 1988), accurate
/// to about 1e-16 relative.
double normal_quantile(double p);

/// Standard normal loss function L(z) = E[(Z - z)+] = phi(z) - z * (1 - Phi(z)): expected
/// shortage per unit sd when stocking z sd above the mean (Nahmias' L(z), Silver-Pyke's G_u(k)).
double normal_loss(double z);

}  // namespace larder
