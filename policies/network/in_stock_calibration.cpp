#include "policies/network/in_stock_calibration.hpp"

#include <algorithm>
#include <cmath>
#include <numbers>

#include "sim/stats/normal.hpp"

namespace larder {

namespace {

constexpr double kEdge = 1e-6;  ///< probabilities are kept within (kEdge, 1 - kEdge)

double clamp_probability(double p) {
  return std::clamp(p, kEdge, 1.0 - kEdge);
}

double normal_density(double z) {
  return std::exp(-0.5 * z * z) / std::sqrt(2.0 * std::numbers::pi);
}

}  // namespace

double InStockCalibration::apply(double p) const {
  if (identity() || !(p > 0.0) || !(p < 1.0)) return p;
  return normal_cdf(shift + slope * normal_quantile(clamp_probability(p)));
}

CloseRecord::CloseRecord() : expected_sum_(kBins, 0.0), open_(kBins, 0.0), in_stock_(kBins, 0.0) {}

void CloseRecord::add(double expected, std::int64_t open_days, std::int64_t in_stock_days) {
  if (open_days <= 0 || !std::isfinite(expected)) return;
  const double p = clamp_probability(expected);
  const auto bin = static_cast<size_t>(std::min(static_cast<int>(p * kBins), kBins - 1));
  const auto n = static_cast<double>(open_days);
  expected_sum_[bin] += p * n;
  open_[bin] += n;
  in_stock_[bin] += static_cast<double>(std::clamp(in_stock_days, std::int64_t{0}, open_days));
  total_ += open_days;
}

void CloseRecord::decay(double keep) {
  for (size_t k = 0; k < open_.size(); ++k) {
    expected_sum_[k] *= keep;
    open_[k] *= keep;
    in_stock_[k] *= keep;
  }
}

InStockCalibration CloseRecord::fit(double slope_sd) const {
  InStockCalibration c;
  if (total_ == 0) return c;
  const double prior = slope_sd > 0.0 ? 1.0 / (slope_sd * slope_sd) : 0.0;
  // Newton's method on (shift, slope) with the observed information; step halving keeps the
  // log-likelihood rising.
  const auto objective = [&](double a, double b, double* g, double* h) {
    double ll = -0.5 * prior * (b - 1.0) * (b - 1.0);
    double ga = 0.0;
    double gb = -prior * (b - 1.0);
    double haa = 0.0;
    double hab = 0.0;
    double hbb = -prior;
    for (size_t k = 0; k < open_.size(); ++k) {
      if (open_[k] <= 0.0) continue;
      const double z = normal_quantile(expected_sum_[k] / open_[k]);
      const double eta = a + b * z;
      const double p = clamp_probability(normal_cdf(eta));
      const double y = in_stock_[k];
      const double n = open_[k];
      ll += y * std::log(p) + (n - y) * std::log1p(-p);
      if (g != nullptr) {
        const double f = normal_density(eta);
        // d ll / d eta and the expected information (Fisher scoring) per bin.
        const double score = f * (y - n * p) / (p * (1.0 - p));
        const double info = n * f * f / (p * (1.0 - p));
        ga += score;
        gb += score * z;
        haa -= info;
        hab -= info * z;
        hbb -= info * z * z;
      }
    }
    if (g != nullptr) {
      g[0] = ga;
      g[1] = gb;
      h[0] = haa;
      h[1] = hab;
      h[2] = hbb;
    }
    return ll;
  };
  double a = 0.0;
  double b = 1.0;
  double g[2];
  double h[3];
  double ll = objective(a, b, g, h);
  for (int it = 0; it < 100; ++it) {
    // Solve (-H) step = g.
    const double det = h[0] * h[2] - h[1] * h[1];
    if (!(std::abs(det) > 0.0)) break;
    const double da = -(h[2] * g[0] - h[1] * g[1]) / det;
    const double db = -(-h[1] * g[0] + h[0] * g[1]) / det;
    double t = 1.0;
    double next = -INFINITY;
    for (int half = 0; half < 30; ++half, t *= 0.5) {
      next = objective(a + t * da, b + t * db, nullptr, nullptr);
      if (next >= ll) break;
    }
    if (!(next >= ll)) break;
    a += t * da;
    b += t * db;
    const bool done = std::abs(t * da) < 1e-10 && std::abs(t * db) < 1e-10;
    ll = objective(a, b, g, h);
    if (done) break;
  }
  c.shift = a;
  c.slope = b;
  return c;
}

}  // namespace larder
