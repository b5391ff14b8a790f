#pragma once
// The standard bivariate normal distribution function Phi2(h, k; rho) = P(X <= h, Y <= k) for
// X, Y standard normal with correlation rho, by Owen's T function (Owen 1956, "Tables for
// computing bivariate normal probabilities", Ann. Math. Statist. 27):
//   Phi2 = (Phi(h) + Phi(k)) / 2 - T(h, a_h) - T(k, a_k) - beta,
//   a_h = (k - rho h) / (h sqrt(1 - rho^2)), a_k = (h - rho k) / (k sqrt(1 - rho^2)),
//   beta = 1/2 when h k < 0 (or h k = 0 and h + k < 0), else 0.
// Infinite arguments are allowed (the margins). |rho| < 1.

namespace larder {

double bivariate_normal_cdf(double h, double k, double rho);

/// P(a1 < X <= b1, a2 < Y <= b2); bounds may be infinite.
double bivariate_normal_rectangle(double a1, double b1, double a2, double b2, double rho);

}  // namespace larder
