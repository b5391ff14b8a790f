#include "sim/drill/habits.hpp"

#include <cmath>
#include <limits>
#include <vector>

namespace larder {

SlopeFit slope_through_origin(std::span<const double> x, std::span<const double> y,
                              double min_spread) {
  constexpr double nan = std::numeric_limits<double>::quiet_NaN();
  SlopeFit f{nan, nan, static_cast<int>(x.size())};
  double sxx = 0.0;
  double sxy = 0.0;
  for (size_t k = 0; k < x.size(); ++k) {
    sxx += x[k] * x[k];
    sxy += x[k] * y[k];
  }
  if (x.size() < 3 || sxx <= min_spread) return f;
  f.value = sxy / sxx;
  double rss = 0.0;
  for (size_t k = 0; k < x.size(); ++k) {
    const double r = y[k] - f.value * x[k];
    rss += r * r;
  }
  f.std_error = std::sqrt(rss / static_cast<double>(x.size() - 1) / sxx);
  return f;
}

SlopeFit chasing_weight(std::span<const double> q_prev, std::span<const double> s_prev,
                        std::span<const double> q, std::span<const double> mu_prev,
                        std::span<const double> mu) {
  constexpr double nan = std::numeric_limits<double>::quiet_NaN();
  const size_t n = q.size();
  std::vector<double> x(n);
  std::vector<double> y(n);
  std::vector<double> z(n);
  double sxx = 0.0, sxz = 0.0, szz = 0.0, sxy = 0.0, szy = 0.0;
  for (size_t t = 0; t < n; ++t) {
    x[t] = s_prev[t] - q_prev[t];
    y[t] = q[t] - q_prev[t];
    z[t] = mu[t] - mu_prev[t];
    sxx += x[t] * x[t];
    sxz += x[t] * z[t];
    szz += z[t] * z[t];
    sxy += x[t] * y[t];
    szy += z[t] * y[t];
  }
  const double det = sxx * szz - sxz * sxz;
  if (n < 4 || szz <= 0.0 || det <= 1e-9 * sxx * szz) return slope_through_origin(x, y);
  SlopeFit f{nan, nan, static_cast<int>(n)};
  f.value = (szz * sxy - sxz * szy) / det;
  const double beta = (sxx * szy - sxz * sxy) / det;
  double rss = 0.0;
  for (size_t t = 0; t < n; ++t) {
    const double r = y[t] - f.value * x[t] - beta * z[t];
    rss += r * r;
  }
  f.std_error = std::sqrt(rss / static_cast<double>(n - 2) * szz / det);
  return f;
}

SlopeFit pull_to_center_weight(std::span<const double> mu, std::span<const double> q_star,
                               std::span<const double> q) {
  std::vector<double> x(q.size());
  std::vector<double> y(q.size());
  for (size_t t = 0; t < q.size(); ++t) {
    x[t] = mu[t] - q_star[t];
    y[t] = q[t] - q_star[t];
  }
  return slope_through_origin(x, y);
}

}  // namespace larder
