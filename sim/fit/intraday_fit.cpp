#include "sim/fit/intraday_fit.hpp"

#include <algorithm>
#include <cmath>

#include "sim/fit/dense_newton.hpp"
#include "sim/stats/log_gamma.hpp"

namespace larder {

double cumulative_share(std::span<const double> shares, int first_hour, double minute) {
  const double hour = minute / 60.0 - first_hour;
  if (hour <= 0.0) return 0.0;
  double g = 0.0;
  for (size_t h = 0; h < shares.size(); ++h) {
    const double part = std::clamp(hour - static_cast<double>(h), 0.0, 1.0);
    g += part * shares[h];
    if (part < 1.0) break;
  }
  return std::min(g, 1.0);
}

namespace {

bool has_extra(std::span<const std::int16_t> from, size_t r) {
  return !from.empty() && from[r] >= 0;
}

/// One day of the exposure likelihood: x arrivals in the share G of the day.
struct ExposureDay {
  double scale = 0.0;  ///< size x weekday
  double g = 1.0;
  double sold = 0.0;
};

/// The mixed-Poisson exposure MLE of the base and its standard error (see the header).
std::pair<double, double> mixed_exposure(const std::vector<ExposureDay>& days, double cv,
                                         double start) {
  const DenseValue f = [&](const Eigen::VectorXd& x) {
    const double b = std::exp(x[0]);
    double nll = 0.0;
    for (const ExposureDay& d : days) {
      const double m = b * d.scale;
      const double excess = cv * cv * m - 1.0;
      if (excess <= 0.0) {
        nll -= d.sold * std::log(m * d.g) - m * d.g;  // Poisson
        continue;
      }
      const double r = m / excess;
      const double beta = r / m;
      nll -= r * std::log(beta) - (d.sold + r) * std::log(d.g + beta) + log_gamma(d.sold + r) -
             log_gamma(r);
    }
    return nll;
  };
  const DenseMinimum m = minimize_dense(f, Eigen::VectorXd::Constant(1, std::log(start)));
  const double b = std::exp(m.x[0]);
  const double h = m.hessian(0, 0);
  return {b, h > 0 ? b / std::sqrt(h) : std::numeric_limits<double>::infinity()};
}

}  // namespace

IntradayFit fit_intraday(const FitData& data, const Decomposition& fit, int item,
                         std::span<const std::int16_t> extra) {
  IntradayFit out;
  const int hours = data.columns.hours;
  if (hours == 0) return out;
  std::vector<double> sums(static_cast<size_t>(hours), 0.0);
  double total = 0.0;
  for (size_t r = 0; r < data.rows.size(); ++r) {
    const FitDay& d = data.rows[r];
    if (d.item != item || d.sold_out || d.sold == 0 || has_extra(extra, r)) continue;
    const std::int32_t* h = data.hours_of(r);
    for (int k = 0; k < hours; ++k) sums[k] += h[k], total += h[k];
    out.profile_days++;
  }
  if (total <= 0.0) return out;
  out.shares = sums;
  for (double& s : out.shares) s /= total;
  const ItemEstimate& e = fit.items[item];
  if (!data.columns.has_sold_out_time || !e.fitted) return out;
  std::vector<ExposureDay> days;
  double sold = 0.0, exposure = 0.0;
  for (size_t r = 0; r < data.rows.size(); ++r) {
    const FitDay& d = data.rows[r];
    if (d.item != item || !fit.stores[d.store].fitted) continue;
    const int wd = data.weekday(d.day);
    const double scale = fit.stores[d.store].size * e.weekday[wd];
    if (has_extra(extra, r)) {
      // Only the hours that ended before other items' customers came.
      const int whole = extra[r] / 60 - data.columns.first_hour;
      if (whole <= 0) continue;
      const double g = cumulative_share(out.shares, data.columns.first_hour,
                                        (data.columns.first_hour + whole) * 60.0);
      double part = 0.0;
      for (int h = 0; h < std::min(whole, hours); ++h) part += data.hours_of(r)[h];
      if (!(g > 0.0)) continue;
      sold += part;
      exposure += scale * g;
      days.push_back({scale, g, part});
      continue;
    }
    double g = 1.0;
    if (d.sold_out) {
      if (d.sold_out_minute < 0) continue;  // no time: the day cannot be weighed
      g = std::max(cumulative_share(out.shares, data.columns.first_hour, d.sold_out_minute), 1e-9);
      out.timed_sellouts++;
    }
    sold += d.sold;
    exposure += scale * g;
    days.push_back({scale, g, static_cast<double>(d.sold)});
  }
  if (!(exposure > 0.0 && sold > 0.0)) return out;
  out.exposure_base = sold / exposure;
  out.exposure_se = *out.exposure_base / std::sqrt(sold);
  if (e.family != DemandFamily::poisson && e.cv > 0.0) {
    const auto [b, se] = mixed_exposure(days, e.cv, *out.exposure_base);
    out.exposure_base = b;
    out.exposure_se = se;
  }
  return out;
}

}  // namespace larder
