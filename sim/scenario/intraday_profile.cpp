#include "sim/scenario/intraday_profile.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>
#include <numeric>

namespace larder {

bool is_intraday_profile(std::string_view name) {
  return std::find(kIntradayProfiles.begin(), kIntradayProfiles.end(), name) !=
         kIntradayProfiles.end();
}

namespace {
/// Relative arrival rate in the hour starting at clock hour `h` for a named profile.
double profile_weight(std::string_view profile, int h) {
  double peak = 0.0;
  if (profile == "morning_peak") peak = 8.5;
  if (profile == "midday_peak") peak = 12.5;
  if (profile == "evening_peak") peak = 17.5;
  if (peak == 0.0) return 1.0;  // flat
  const double z = (h + 0.5 - peak) / 1.5;
  return 1.0 + 2.0 * std::exp(-0.5 * z * z);
}
}  // namespace

std::vector<double> intraday_shares(std::string_view profile, std::span<const double> weights,
                                    int open_hour, int close_hour) {
  assert(close_hour > open_hour);
  std::vector<double> w;
  if (!weights.empty()) {
    assert(static_cast<int>(weights.size()) == close_hour - open_hour);
    w.assign(weights.begin(), weights.end());
  } else {
    for (int h = open_hour; h < close_hour; ++h) w.push_back(profile_weight(profile, h));
  }
  const double total = std::accumulate(w.begin(), w.end(), 0.0);
  assert(total > 0.0);
  for (double& x : w) x /= total;
  return w;
}

std::vector<double> intraday_shares(const Item& item, const Calendar& calendar) {
  return intraday_shares(item.demand.intraday, item.demand.intraday_weights, calendar.open_hour,
                         calendar.close_hour);
}

double elapsed_share(std::span<const double> shares, double hours) {
  double done = 0.0;
  for (size_t h = 0; h < shares.size(); ++h) {
    const double left = hours - static_cast<double>(h);
    if (left <= 0.0) break;
    done += shares[h] * std::min(left, 1.0);
  }
  return std::min(done, 1.0);
}

}  // namespace larder
