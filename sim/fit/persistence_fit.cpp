#include "sim/fit/persistence_fit.hpp"

#include <cmath>
#include <limits>
#include <vector>

#include "sim/fit/dense_newton.hpp"
#include "sim/stats/bivariate_normal.hpp"
#include "sim/stats/normal.hpp"

namespace larder {

namespace {

constexpr double kInf = std::numeric_limits<double>::infinity();
constexpr double kMaxRho = 0.95;

/// The normal scores (lo, hi] of one day's demand.
struct Band {
  double lo = -kInf, hi = kInf;
};

double score(double p) {
  if (p <= 0.0) return -kInf;
  if (p >= 1.0) return kInf;
  return normal_quantile(p);
}

struct Pair {
  Band earlier, later;
};

double pairs_nll(const std::vector<Pair>& pairs, double rho) {
  double nll = 0.0;
  for (const Pair& p : pairs) {
    const double pr =
        bivariate_normal_rectangle(p.earlier.lo, p.earlier.hi, p.later.lo, p.later.hi, rho);
    nll -= std::log(std::max(pr, 1e-300));
  }
  return nll;
}

}  // namespace

PersistenceFit fit_persistence(const FitData& data, const Decomposition& fit, int item, int lag,
                               std::span<const ExtraDemand> extra) {
  PersistenceFit out;
  out.lag = lag;
  out.correlation = std::numeric_limits<double>::quiet_NaN();
  const ItemEstimate& e = fit.items[static_cast<size_t>(item)];
  if (!e.fitted) return out;
  const auto band = [&](size_t r, Band& b) {
    const FitDay& d = data.rows[r];
    const ExtraDemand x = extra.empty() ? ExtraDemand{} : extra[r];
    if (std::isnan(x.mean)) return false;
    const double mu = fit.mean(d.store, item, data.weekday(d.day));
    if (mu <= 0.0) return false;
    b.lo = score(total_cdf(e.family, mu, e.cv, x, d.sold - 1));
    b.hi = d.sold_out ? kInf : score(total_cdf(e.family, mu, e.cv, x, d.sold));
    return b.lo < b.hi;
  };
  std::vector<Pair> pairs;
  const auto& rows = data.rows;
  size_t run_start = 0;
  for (size_t r = 0; r < rows.size(); ++r) {
    const FitDay& d = rows[r];
    if (r == 0 || rows[r - 1].item != d.item || rows[r - 1].store != d.store) run_start = r;
    if (d.item != item) continue;
    // The row `lag` days earlier, if any: at most `lag` rows back in a daily run.
    for (size_t b = r; b-- > run_start && rows[b].day >= d.day - lag;) {
      if (rows[b].day != d.day - lag) continue;
      Pair p;
      if (band(b, p.earlier) && band(r, p.later)) pairs.push_back(p);
      break;
    }
  }
  out.pairs = static_cast<int>(pairs.size());
  if (pairs.size() < 30) return out;
  // rho = tanh(y): unbounded for the search, |rho| <= 0.95 kept by the objective.
  const DenseValue f = [&](const Eigen::VectorXd& y) {
    const double rho = std::tanh(y[0]);
    return std::abs(rho) > kMaxRho ? kInf : pairs_nll(pairs, rho);
  };
  const DenseMinimum m = minimize_dense(f, Eigen::VectorXd::Zero(1), 1e-4);
  const double rho = std::tanh(m.x[0]);
  out.correlation = rho;
  const double h = m.hessian(0, 0);
  // d rho / d y = 1 - rho^2.
  out.se = h > 0 ? (1 - rho * rho) / std::sqrt(h) : kInf;
  // Profile ends: where the log-likelihood has dropped by 3.841 / 2, by bisection in rho.
  const double drop = m.value + 3.841459 / 2.0;
  const auto end = [&](double to) {
    double inside = rho, outside = to;
    if (pairs_nll(pairs, to) <= drop) return to;
    for (int it = 0; it < 30 && std::abs(outside - inside) > 1e-4; ++it) {
      const double mid = 0.5 * (inside + outside);
      (pairs_nll(pairs, mid) <= drop ? inside : outside) = mid;
    }
    return 0.5 * (inside + outside);
  };
  out.low = end(-kMaxRho);
  out.high = end(kMaxRho);
  return out;
}

}  // namespace larder
