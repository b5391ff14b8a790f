#include "sim/fit/substitution_fit.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <numeric>
#include <pcg_random.hpp>

namespace larder {

namespace {

constexpr double kNever = std::numeric_limits<double>::infinity();
constexpr int kBootstrap = 200;

/// One store-day whose sell-out times are all known, with the fitted items' rows.
struct StoreDay {
  int store = 0;
  int day = 0;
  std::vector<long> row;    ///< per item (-1 = no row)
  std::vector<double> tau;  ///< sell-out minute per item (+inf: not out)
};

/// The pooled estimator over store-days weighted by `w` (1 each for the estimate; Poisson(1)
/// weights for the bootstrap).
class Pooling {
 public:
  Pooling(const FitData& data, const Decomposition& fit, std::vector<StoreDay> days)
      : data_(data),
        fit_(fit),
        days_(std::move(days)),
        n_(static_cast<int>(data.items.size())),
        hours_(data.columns.hours) {}

  /// alpha per pair (j * n + i), NaN where there is no hour in state {j}; `store_days` and
  /// `lost` are filled when given.
  std::vector<double> estimate(const std::vector<double>& w, std::vector<int>* store_days = nullptr,
                               std::vector<double>* lost_units = nullptr) const {
    const auto n = static_cast<size_t>(n_);
    const auto H = static_cast<size_t>(hours_);
    // Profiles from store-days on which nothing sold out (other days hold substitute sales).
    std::vector<double> share(n * H, 0.0);
    for (size_t d = 0; d < days_.size(); ++d) {
      const StoreDay& sd = days_[d];
      if (std::any_of(sd.tau.begin(), sd.tau.end(), [](double t) { return t < kNever; })) continue;
      for (size_t k = 0; k < n; ++k) {
        if (sd.row[k] < 0) continue;
        const std::int32_t* h = data_.hours_of(static_cast<size_t>(sd.row[k]));
        for (size_t x = 0; x < H; ++x) share[k * H + x] += w[d] * h[x];
      }
    }
    for (size_t k = 0; k < n; ++k) {
      const double total = std::accumulate(share.begin() + k * H, share.begin() + (k + 1) * H, 0.0);
      for (size_t x = 0; x < H; ++x) share[k * H + x] = total > 0 ? share[k * H + x] / total : 0.0;
    }
    // Per item and hour of the day, sales per unit of fitted daily mean in state "none out".
    std::vector<double> none_sales(n * H, 0.0), none_mean(n * H, 0.0);
    std::vector<double> e(n * n, 0.0), l(n * n, 0.0);
    std::vector<int> used(n * n, 0);
    std::vector<double> pair_sales(n * n * H, 0.0), pair_mean(n * n * H, 0.0);
    for (size_t d = 0; d < days_.size(); ++d) {
      const StoreDay& sd = days_[d];
      const int wd = data_.weekday(sd.day);
      std::vector<char> touched(n * n, 0);
      for (size_t x = 0; x < H; ++x) {
        const double start = (data_.columns.first_hour + static_cast<double>(x)) * 60.0;
        const double end = start + 60.0;
        int out_count = 0;
        size_t out_item = 0;
        bool changes = false;
        for (size_t k = 0; k < n; ++k) {
          if (sd.row[k] < 0) continue;
          if (sd.tau[k] <= start) {
            ++out_count, out_item = k;
          } else if (sd.tau[k] < end) {
            changes = true;
          }
        }
        if (changes || out_count > 1) continue;
        for (size_t i = 0; i < n; ++i) {
          if (sd.row[i] < 0 || (out_count == 1 && i == out_item)) continue;
          const double sales = data_.hours_of(static_cast<size_t>(sd.row[i]))[x];
          const double mu = fit_.mean(sd.store, static_cast<int>(i), wd);
          if (out_count == 0) {
            none_sales[i * H + x] += w[d] * sales;
            none_mean[i * H + x] += w[d] * mu;
            continue;
          }
          const size_t p = out_item * n + i;
          pair_sales[p * H + x] += w[d] * sales;
          pair_mean[p * H + x] += w[d] * mu;
          l[p] +=
              w[d] * fit_.mean(sd.store, static_cast<int>(out_item), wd) * share[out_item * H + x];
          touched[p] = 1;
        }
      }
      for (size_t p = 0; p < n * n; ++p) used[p] += touched[p];
    }
    std::vector<double> alpha(n * n, std::numeric_limits<double>::quiet_NaN());
    for (size_t p = 0; p < n * n; ++p) {
      const size_t i = p % n;
      if (l[p] <= 0) continue;
      double excess = 0.0;
      bool ok = true;
      for (size_t x = 0; x < H; ++x) {
        if (pair_mean[p * H + x] <= 0) continue;
        if (none_mean[i * H + x] <= 0) {
          ok = false;  // no hour of this clock time without a sell-out: no baseline
          break;
        }
        excess += pair_sales[p * H + x] -
                  none_sales[i * H + x] / none_mean[i * H + x] * pair_mean[p * H + x];
      }
      if (ok) alpha[p] = excess / l[p];
    }
    if (store_days) *store_days = used;
    if (lost_units) *lost_units = l;
    return alpha;
  }

  size_t size() const { return days_.size(); }

 private:
  const FitData& data_;
  const Decomposition& fit_;
  std::vector<StoreDay> days_;
  int n_;
  int hours_;
};

}  // namespace

std::vector<SubstituteShare> fit_substitution(const FitData& data, const Decomposition& fit,
                                              int min_store_days) {
  std::vector<SubstituteShare> out;
  if (data.columns.hours == 0 || !data.columns.has_sold_out_time) return out;
  const int n = static_cast<int>(data.items.size());
  std::vector<size_t> order;
  for (size_t r = 0; r < data.rows.size(); ++r) {
    const FitDay& d = data.rows[r];
    if (fit.items[d.item].fitted && fit.stores[d.store].fitted) order.push_back(r);
  }
  std::sort(order.begin(), order.end(), [&](size_t a, size_t b) {
    const FitDay& x = data.rows[a];
    const FitDay& y = data.rows[b];
    return x.store != y.store ? x.store < y.store : x.day < y.day;
  });
  std::vector<StoreDay> days;
  for (const size_t r : order) {
    const FitDay& d = data.rows[r];
    if (days.empty() || days.back().store != d.store || days.back().day != d.day)
      days.push_back({d.store, d.day, std::vector<long>(static_cast<size_t>(n), -1),
                      std::vector<double>(static_cast<size_t>(n), kNever)});
    days.back().row[d.item] = static_cast<long>(r);
    if (d.sold_out) days.back().tau[d.item] = d.sold_out_minute < 0 ? -1.0 : d.sold_out_minute;
  }
  // A store-day with a sell-out of unknown time cannot be split into states.
  std::erase_if(days, [](const StoreDay& sd) {
    return std::any_of(sd.tau.begin(), sd.tau.end(), [](double t) { return t < 0; });
  });
  const Pooling pooling(data, fit, std::move(days));
  std::vector<int> store_days;
  std::vector<double> lost;
  const std::vector<double> alpha =
      pooling.estimate(std::vector<double>(pooling.size(), 1.0), &store_days, &lost);
  // Standard errors by the Poisson bootstrap over store-days (every store-day gets a Poisson(1)
  // weight; Hanley and MacGibbon 2006), profiles and baselines re-estimated each time. The
  // weights come from a fixed pcg32 stream, so the output is reproducible.
  const size_t pairs = alpha.size();
  std::vector<double> sum(pairs, 0.0), sum_sq(pairs, 0.0);
  std::vector<int> count(pairs, 0);
  pcg32 g(0x5eed5b57u, 2009u);
  std::vector<double> w(pooling.size());
  for (int b = 0; b < kBootstrap; ++b) {
    for (double& x : w) {
      // Poisson(1) by inversion of one uniform.
      const double u = (static_cast<double>(g()) + 0.5) * 0x1p-32;
      double p = std::exp(-1.0), cdf = p;
      int k = 0;
      while (u > cdf && k < 20) p /= ++k, cdf += p;
      x = k;
    }
    const std::vector<double> a = pooling.estimate(w);
    for (size_t p = 0; p < pairs; ++p) {
      if (std::isnan(a[p])) continue;
      sum[p] += a[p], sum_sq[p] += a[p] * a[p], count[p]++;
    }
  }
  for (int j = 0; j < n; ++j) {
    for (int i = 0; i < n; ++i) {
      const auto p = static_cast<size_t>(j * n + i);
      if (i == j || std::isnan(alpha[p]) || store_days[p] < min_store_days || count[p] < 2)
        continue;
      const double m = sum[p] / count[p];
      const double se =
          std::sqrt(std::max(sum_sq[p] / count[p] - m * m, 0.0) * count[p] / (count[p] - 1));
      out.push_back({j, i, alpha[p], se, store_days[p], lost[p]});
    }
  }
  return out;
}

}  // namespace larder
