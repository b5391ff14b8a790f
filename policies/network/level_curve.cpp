#include "policies/network/level_curve.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>

#include "policies/forecast.hpp"
#include "policies/quantity/fractile_rule.hpp"

namespace larder {

namespace {

/// The normal rule's count quantile at `level`: the one `in_stock_target` adds a unit to.
int normal_rule_quantile(const CountLaw& law, double level) {
  return forecast_quantile(DemandForecast{law.mean, law.variance}, DemandFamily::normal, level);
}

/// Cdf values and their running sums on stack memory when they are few.
constexpr std::size_t kLocal = 512;

}  // namespace

void level_curve(const CountLaw& law, const Economics& e, std::span<const double> levels,
                 std::span<LevelPoint> out) {
  if (out.size() != levels.size()) {
    throw std::invalid_argument("level_curve: one output point per level");
  }
  double previous = 0.0;
  for (double level : levels) {
    if (!(level > 0.0 && level < 1.0 && level >= previous)) {
      throw std::invalid_argument("level_curve: levels must be ascending and in (0, 1)");
    }
    previous = level;
  }
  if (levels.empty()) return;

  const bool normal = law.family == DemandFamily::normal;
  const double sd = normal ? std::sqrt(std::max(law.variance, 0.0)) : 0.0;
  // A normal law with mean 0 is the count 0 (CountLaw), and one with sd 0 has a step cdf: the
  // rule's formula gives every quantity there.
  const bool by_formula = normal && !(law.mean > 0.0 && sd > 0.0);
  const CountSampler sampler(law);
  const int top = normal ? normal_rule_quantile(law, levels.back()) : sampler(levels.back());
  // Normal counts below mean - 0.5 - 10 sd have cdf values under 8e-24 (z < -10): they are left
  // out of the sums, as CountLaw::expected_leftover does, and never decide a quantity (below).
  int first = 0;
  if (normal && !by_formula) {
    first = static_cast<int>(
        std::clamp(std::ceil(law.mean - 0.5 - 10.0 * sd), 0.0, static_cast<double>(top)));
  }

  // cdf[j] = P(D <= first + j) for first + j <= top, bit-identical to CountLaw::cdf; cum[j] is
  // the sum of cdf[0 .. j - 1], so E[(Q - D)+] = cum[Q - first] for Q > first.
  const std::size_t n = static_cast<std::size_t>(top - first) + 1;
  double local[kLocal];
  std::vector<double> heap;
  double* cdf = local;
  if (2 * n + 1 > kLocal) {
    heap.resize(2 * n + 1);
    cdf = heap.data();
  }
  double* cum = cdf + n;
  sampler.cdf_run(first, std::span<double>(cdf, n));
  cum[0] = 0.0;
  for (std::size_t j = 0; j < n; ++j) cum[j + 1] = cum[j] + cdf[j];

  // E[D] once; E[(D - Q)+] = E[D] - E[min(D, Q)] (for the normal count E[D] is not the mean).
  const double demand = law.expected_shortage(0);
  const auto put = [&](LevelPoint& p, int k) {
    // The point for quantity k + 1: in stock at close iff D <= k.
    double f = 0.0;
    double left = 0.0;
    if (k >= first && k <= top) {
      const auto j = static_cast<std::size_t>(k - first);
      f = cdf[j];
      left = cum[j + 1];
    } else {  // only when the normal formula lands outside the run (rounding): sum directly
      f = sampler.cdf(k);
      for (int i = 0; i <= k; ++i) left += sampler.cdf(i);
    }
    const double q = static_cast<double>(k) + 1.0;
    const double sales = q - left;
    const double shortage = std::max(0.0, demand - sales);
    p.quantity = k + 1;
    p.in_stock = f;
    p.leftover = left;
    p.profit = e.price * sales + e.recovery * left - e.unit_cost * q - e.penalty * shortage;
  };

  // The normal rule compares mean + sd z_L - 0.5 with k, the walk compares Phi((k + 0.5 - mean)
  // / sd) with L. They agree unless the cdf is within rounding of L at the walk's answer or just
  // below it: `tol` bounds that rounding (the arguments' ulps over sd, the cdf's and the
  // quantile function's relative errors, Phi's slope at most 0.4), with a wide margin.
  const double tol = normal && !by_formula
                         ? 1e-12 + 16.0 * 0x1p-52 * (law.mean + static_cast<double>(top) + 2.0) / sd
                         : 0.0;
  int k = first;
  for (std::size_t i = 0; i < levels.size(); ++i) {
    const double level = levels[i];
    while (k < top && cdf[k - first] < level) ++k;
    int quantile = k;
    if (by_formula) {
      quantile = normal_rule_quantile(law, level);
    } else if (normal) {
      // An upper bound of P(D <= k - 1): below the run each value is under 8e-24.
      const double below = k > first ? cdf[k - first - 1] : (k == 0 ? -1.0 : 1e-23);
      if (!(cdf[k - first] >= level + tol && below <= level - tol)) {
        quantile = normal_rule_quantile(law, level);
      }
    }
    put(out[i], quantile);
  }
}

std::vector<double> default_levels() {
  std::vector<double> out;
  for (int i = 1; i <= 99; ++i) out.push_back(i / 100.0);
  return out;
}

}  // namespace larder
