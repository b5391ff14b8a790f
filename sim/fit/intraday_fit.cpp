#include "sim/fit/intraday_fit.hpp"

#include <algorithm>

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

IntradayFit fit_intraday(const FitData& data, const Decomposition& fit, int item) {
  IntradayFit out;
  const int hours = data.columns.hours;
  if (hours == 0) return out;
  std::vector<double> sums(static_cast<size_t>(hours), 0.0);
  double total = 0.0;
  for (size_t r = 0; r < data.rows.size(); ++r) {
    const FitDay& d = data.rows[r];
    if (d.item != item || d.sold_out || d.sold == 0) continue;
    const std::int32_t* h = data.hours_of(r);
    for (int k = 0; k < hours; ++k) sums[k] += h[k], total += h[k];
    out.profile_days++;
  }
  if (total <= 0.0) return out;
  out.shares = sums;
  for (double& s : out.shares) s /= total;
  if (!data.columns.has_sold_out_time || !fit.items[item].fitted) return out;
  double sold = 0.0, exposure = 0.0;
  for (const FitDay& d : data.rows) {
    if (d.item != item || !fit.stores[d.store].fitted) continue;
    double g = 1.0;
    if (d.sold_out) {
      if (d.sold_out_minute < 0) continue;  // no time: the day cannot be weighed
      g = cumulative_share(out.shares, data.columns.first_hour, d.sold_out_minute);
      out.timed_sellouts++;
    }
    const int wd = data.weekday(d.day);
    sold += d.sold;
    exposure += fit.stores[d.store].size * fit.items[item].weekday[wd] * g;
  }
  if (exposure > 0.0) out.exposure_base = sold / exposure;
  return out;
}

}  // namespace larder
