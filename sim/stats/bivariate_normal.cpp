#include "sim/stats/bivariate_normal.hpp"

#include <algorithm>
#include <boost/math/special_functions/owens_t.hpp>
#include <cmath>

#include "sim/stats/normal.hpp"

namespace larder {

double bivariate_normal_cdf(double h, double k, double rho) {
  if (h == -INFINITY || k == -INFINITY) return 0.0;
  if (h == INFINITY) return k == INFINITY ? 1.0 : normal_cdf(k);
  if (k == INFINITY) return normal_cdf(h);
  // T(h, a) is continuous at h = 0 except through a_h; a nudge of 1e-12 changes Phi2 by
  // about 1e-13.
  if (h == 0.0) h = 1e-12;
  if (k == 0.0) k = 1e-12;
  const double s = std::sqrt(1.0 - rho * rho);
  const double ah = (k - rho * h) / (h * s);
  const double ak = (h - rho * k) / (k * s);
  const double beta = h * k < 0.0 ? 0.5 : 0.0;
  const double v = 0.5 * (normal_cdf(h) + normal_cdf(k)) - boost::math::owens_t(h, ah) -
                   boost::math::owens_t(k, ak) - beta;
  return std::clamp(v, 0.0, 1.0);
}

double bivariate_normal_rectangle(double a1, double b1, double a2, double b2, double rho) {
  const double p = bivariate_normal_cdf(b1, b2, rho) - bivariate_normal_cdf(a1, b2, rho) -
                   bivariate_normal_cdf(b1, a2, rho) + bivariate_normal_cdf(a1, a2, rho);
  return std::max(p, 0.0);
}

}  // namespace larder
