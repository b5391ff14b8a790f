#pragma once
// `ses_weekday`: simple exponential smoothing per weekday (a Monday from Mondays) with
// smoothing `alpha`, and the spread from the smoothed squared one-step error per weekday with
// the same alpha (Brown 1959; Hyndman and Athanasopoulos, Forecasting: Principles and Practice,
// simple exponential smoothing): level += alpha * e, variance = (1 - alpha) * variance +
// alpha * e^2, with e = y - level before the update.

#include <array>
#include <vector>

#include "policies/forecast.hpp"

namespace larder {

/// The smoothing state of one item for one weekday.
struct SesState {
  double level = 0.0;
  double variance = 0.0;
  bool started = false;  ///< false until the first observation when starting from data
};

/// One exponential-smoothing step: the state after observing `y`.
SesState ses_update(SesState s, double y, double alpha);

class SesWeekday : public Forecaster {
 public:
  /// `prior`: per item and weekday starting state (started = true), or unstarted states for
  /// `initial: first_week` (level and variance then start at the first observation).
  SesWeekday(const Scenario& scenario, double alpha,
             std::vector<std::array<SesState, kDaysPerWeek>> prior);
  void observe(int day, std::span<const double> demand) override;
  void predict(int day, std::span<DemandForecast> out) const override;
  std::size_t bytes_per_item() const override { return sizeof(state_[0]); }

 private:
  const Scenario* scenario_;
  double alpha_;
  std::vector<std::array<SesState, kDaysPerWeek>> state_;
};

/// The configured method: weekday smoothing with `alpha`, started from the true weekday
/// distribution (the prior) or from the first observations (`from_data`). Shared by
/// `ses_weekday` and the behavioural `demand_chasing`.
class SesWeekdayMethod : public ForecastMethod {
 public:
  SesWeekdayMethod(double alpha, bool from_data);
  std::unique_ptr<Forecaster> make(const StoreView& v) const override;

 private:
  double alpha_;
  bool from_data_;
};

}  // namespace larder
