#pragma once
// `holt_winters`: additive Holt-Winters with level, trend and a weekly season (Holt 1957,
// Winters 1960), in the error-correction form of Hyndman, Koehler, Ord and Snyder (2008) that
// statsmodels' ExponentialSmoothing uses (checks.md 7.1). With the one-step forecast
// f = l + b + s[w] of an observation y on weekday w:
//   l' = alpha (y - s[w]) + (1 - alpha) (l + b)
//   b' = beta (l' - l) + (1 - beta) b
//   s[w] = gamma (y - l - b) + (1 - gamma) s[w]      (ETS form; not the Winters/R form)
// and the forecast h days after the last observed day is l + h b + s[weekday].
//
// Time runs in calendar days. A day without an observation (the store is closed, or the
// censoring treatment gave NaN) moves the state by its transition only, as a state-space model
// treats a missing observation: the level grows by the trend, trend and season stay. So the
// trend is per calendar day and the seasonal index is the weekday, whichever days are open.
//
// The spread is the smoothed squared one-step error per weekday, with the same alpha as the
// level (as ses_weekday): v[w] = (1 - alpha) v[w] + alpha e^2, e = y - f. It is used for any
// target day (no widening with the horizon: lead times are a few days).

#include <array>
#include <cstdint>
#include <vector>

#include "policies/forecast.hpp"

namespace larder {

/// The smoothing constants of Holt-Winters, each in (0, 1].
struct HwSmoothing {
  double alpha = 0.2;  ///< level
  double beta = 0.05;  ///< trend
  double gamma = 0.1;  ///< season
};

/// The state of one item: level and trend as of the forecaster's last observed day, the
/// seasonal index and the one-step error variance of each weekday.
struct HwState {
  double level = 0.0;
  double trend = 0.0;
  std::array<double, kDaysPerWeek> season{};  ///< before start: the first week's raw values
  std::array<double, kDaysPerWeek> variance{};
  bool started = false;   ///< false while the first week of data is being collected
  int first_day = -1;     ///< first observed day (initial: first_week), -1 before any
  std::uint8_t seen = 0;  ///< weekdays recorded in the first week (bit w)
};

/// One Holt-Winters step (ETS form): observation `y` on weekday `w`, `gap` >= 1 calendar days
/// after the day the state refers to (the gap - 1 days between carry no observation).
void holt_winters_update(HwState& s, double y, int w, int gap, const HwSmoothing& p);

/// The forecast mean `h` days after the day the state refers to, for weekday `w`.
inline double holt_winters_mean(const HwState& s, int w, int h) {
  return s.level + h * s.trend + s.season[static_cast<size_t>(w)];
}

class HoltWinters : public Forecaster {
 public:
  /// `initial`: per item the starting state (started = true, as of the day before day 0), or
  /// unstarted states for `initial: first_week`: the first 7 calendar days from an item's first
  /// observation are collected, then level = their mean, trend = 0, season = value - level.
  HoltWinters(const Scenario& scenario, HwSmoothing smoothing, std::vector<HwState> initial);
  void observe(int day, std::span<const double> demand) override;
  void predict(int day, std::span<DemandForecast> out) const override;
  std::size_t bytes_per_item() const override { return sizeof(HwState); }

 private:
  const Scenario* scenario_;
  HwSmoothing p_;
  std::vector<HwState> state_;
  int last_day_ = -1;  ///< the day every item's level refers to
};

}  // namespace larder
