#include "sim/fit/censored_mle.hpp"

#include <cmath>
#include <numeric>

#include "sim/fit/block_newton.hpp"
#include "sim/fit/count_likelihood.hpp"

namespace larder {

namespace {

/// Mean and cv of the sample as if sales were demand: the starting point.
std::pair<double, double> naive_moments(std::span<const int> sales) {
  const double n = static_cast<double>(sales.size());
  double s = 0.0, ss = 0.0;
  for (const int x : sales) s += x, ss += double(x) * x;
  const double mean = s / n;
  const double var = n > 1 ? (ss - s * mean) / (n - 1) : 0.0;
  return {std::max(mean, 0.5), mean > 0 ? std::sqrt(std::max(var, 0.0)) / mean : 0.5};
}

}  // namespace

CensoredFit fit_censored(DemandFamily family, std::span<const int> sales,
                         std::span<const std::uint8_t> sold_out) {
  const bool spread = family != DemandFamily::poisson;
  BlockProblem p;
  p.blocks = 1;
  p.shared = spread;
  p.value = [&](int, double a, double c) {
    const double mean = std::exp(a);
    const double cv = std::exp(c);
    double nll = 0.0;
    for (size_t j = 0; j < sales.size(); ++j)
      nll -= count_log_likelihood(family, mean, cv, sales[j], sold_out[j] != 0);
    return nll;
  };
  const auto [mean0, cv0] = naive_moments(sales);
  double c0 = std::log(std::max(cv0, 0.05));
  if (family == DemandFamily::negative_binomial)
    c0 = std::log(std::max(cv0, 1.2 / std::sqrt(mean0)));  // start above the Poisson boundary
  const BlockMinimum m = minimize_blocks(p, Eigen::VectorXd::Constant(1, std::log(mean0)), c0);
  const Eigen::MatrixXd cov = covariance_from(m.hessian);
  CensoredFit f;
  f.family = family;
  f.mean = std::exp(m.a[0]);
  f.mean_se = f.mean * std::sqrt(cov(0, 0));  // delta method: d mean / d log mean = mean
  if (spread) {
    f.cv = std::exp(m.c);
    f.cv_se = f.cv * std::sqrt(cov(1, 1));
  }
  f.neg_log_likelihood = m.value;
  f.converged = m.converged;
  return f;
}

TobitFit fit_tobit(std::span<const double> values, std::span<const std::uint8_t> censored) {
  BlockProblem p;
  p.blocks = 1;
  p.shared = true;
  p.value = [&](int, double mean, double log_sd) {
    double nll = 0.0;
    for (size_t j = 0; j < values.size(); ++j)
      nll -= tobit_log_likelihood(mean, std::exp(log_sd), values[j], censored[j] != 0);
    return nll;
  };
  const double n = static_cast<double>(values.size());
  const double mean0 = std::accumulate(values.begin(), values.end(), 0.0) / n;
  double ss = 0.0;
  for (const double v : values) ss += (v - mean0) * (v - mean0);
  const double sd0 = std::sqrt(std::max(ss / n, 1e-6));
  const BlockMinimum m = minimize_blocks(p, Eigen::VectorXd::Constant(1, mean0), std::log(sd0));
  return {m.a[0], std::exp(m.c), m.value};
}

}  // namespace larder
