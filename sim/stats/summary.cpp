#include "sim/stats/summary.hpp"

#include <boost/math/distributions/students_t.hpp>
#include <cassert>
#include <cmath>
#include <vector>

namespace larder {

double student_t_quantile(double p, int dof) {
  return boost::math::quantile(boost::math::students_t_distribution<double>(dof), p);
}

Estimate estimate_mean(std::span<const double> values, double level) {
  Estimate e;
  e.n = static_cast<int>(values.size());
  if (e.n == 0) return e;
  double sum = 0.0;
  for (double v : values) sum += v;
  e.mean = sum / e.n;
  e.ci_low = e.ci_high = e.mean;
  if (e.n < 2) return e;
  double ss = 0.0;
  for (double v : values) ss += (v - e.mean) * (v - e.mean);
  e.stderr_ = std::sqrt(ss / (e.n - 1) / e.n);
  const double half = student_t_quantile(0.5 + level / 2.0, e.n - 1) * e.stderr_;
  e.ci_low = e.mean - half;
  e.ci_high = e.mean + half;
  return e;
}

Estimate estimate_paired_difference(std::span<const double> a, std::span<const double> b,
                                    double level) {
  assert(a.size() == b.size());
  std::vector<double> d(a.size());
  for (size_t j = 0; j < a.size(); ++j) d[j] = a[j] - b[j];
  return estimate_mean(d, level);
}

}  // namespace larder
