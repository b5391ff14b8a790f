#include "sim/stats/binomial.hpp"

#include <cmath>

#include "sim/stats/log_gamma.hpp"

namespace larder {

int binomial_inverse(double u, int n, double p) {
  return binomial_inverse(u, n, p, p < 1.0 ? std::log1p(-p) : 0.0);
}

int binomial_inverse(double u, int n, double p, double log_q) {
  if (n <= 0 || p <= 0.0) return 0;
  if (p >= 1.0) return n;
  const double q = 1.0 - p;
  const double dn = static_cast<double>(n);
  const double ratio = p / q;
  // Small means (a day's sales split, an hour's share of the day's customers): walk up from
  // P(X = 0) = q^n, a few steps, no log-gamma.
  const double log_p0 = dn * log_q;
  if (dn * p <= 30.0 && log_p0 > -600.0) {
    double pmf = std::exp(log_p0);
    double cdf = pmf;
    int k = 0;
    while (cdf < u && k < n) {
      pmf *= (dn - k) / (k + 1.0) * ratio;
      ++k;
      cdf += pmf;
    }
    return k;
  }
  // Start at the mode, where the pmf is largest and cannot underflow.
  int k = static_cast<int>(std::floor((dn + 1.0) * p));
  if (k > n) k = n;
  const double log_pmf = log_gamma(dn + 1.0) - log_gamma(k + 1.0) - log_gamma(dn - k + 1.0) +
                         k * std::log(p) + (dn - k) * std::log(q);
  const double pmf_mode = std::exp(log_pmf);
  // cdf at the mode: sum the pmf downward until terms vanish.
  double cdf = pmf_mode;
  double term = pmf_mode;
  for (int j = k; j > 0 && term > 1e-18 * cdf; --j) {
    term *= static_cast<double>(j) / (dn - j + 1.0) / ratio;
    cdf += term;
  }
  if (cdf >= u) {  // search down: drop pmf(k) while F(k-1) >= u
    double pmf = pmf_mode;
    while (k > 0 && cdf - pmf >= u) {
      cdf -= pmf;
      pmf *= static_cast<double>(k) / (dn - k + 1.0) / ratio;
      --k;
    }
    return k;
  }
  double pmf = pmf_mode;  // search up
  while (cdf < u && k < n) {
    pmf *= (dn - k) / (k + 1.0) * ratio;
    ++k;
    cdf += pmf;
  }
  return k;
}

std::vector<double> binomial_pmf(int n, double p) {
  std::vector<double> row(static_cast<size_t>(n) + 1, 0.0);
  if (p <= 0.0 || p >= 1.0 || n == 0) {
    row[p >= 1.0 ? row.size() - 1 : 0] = 1.0;
    return row;
  }
  double sum = 0.0;
  for (int k = 0; k <= n; ++k) {
    const double l = log_gamma(n + 1.0) - log_gamma(k + 1.0) - log_gamma(n - k + 1.0) +
                     k * std::log(p) + (n - k) * std::log1p(-p);
    sum += row[static_cast<size_t>(k)] = std::exp(l);
  }
  for (double& x : row) x /= sum;
  return row;
}

}  // namespace larder
