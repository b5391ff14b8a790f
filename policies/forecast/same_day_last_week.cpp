// `same_day_last_week`: the naive seasonal forecast, y_hat(t) = y(t - 7) (Hyndman and
// Athanasopoulos, Forecasting: Principles and Practice, "simple forecasting methods", the
// seasonal naive method): a Monday is forecast by the last Monday observed. A Monday without
// information (NaN) is skipped, so the forecast is the latest observed Monday; a target two or
// more weeks ahead gets the same value.
//
// Spread: the smoothed squared error of that naive forecast per weekday, with smoothing
// `alpha` (as ses_weekday smooths its one-step error, Brown 1959): v = (1 - alpha) v +
// alpha e^2 with e = y - (previous same-weekday value). For independent days this tends to
// twice the demand variance, the true error variance of the naive forecast.
//
// Initial state (policies.md): value and variance start at the true weekday mean and variance;
// with `initial: first_week` the first observation of a weekday sets value = variance = y
// (Poisson-like, as ses_weekday starts), and an unseen weekday forecasts 0.

#include <array>
#include <cmath>

#include "policies/registry.hpp"
#include "sim/engine/demand_model.hpp"

namespace larder {

namespace {

/// The naive forecast of one item for one weekday.
struct NaiveState {
  double value = 0.0;     ///< the last observation (or the prior mean)
  double variance = 0.0;  ///< smoothed squared error of the naive forecast
  bool started = false;
};

class SameDayLastWeek : public Forecaster {
 public:
  SameDayLastWeek(const Scenario& scenario, double alpha,
                  std::vector<std::array<NaiveState, kDaysPerWeek>> initial)
      : scenario_(&scenario), alpha_(alpha), state_(std::move(initial)) {}

  void observe(int day, std::span<const double> demand) override {
    const size_t w = static_cast<size_t>(scenario_->weekday_of(day));
    for (size_t i = 0; i < demand.size(); ++i) {
      const double y = demand[i];
      if (std::isnan(y)) continue;
      NaiveState& s = state_[i][w];
      if (!s.started) {
        s = {y, y, true};
        continue;
      }
      const double e = y - s.value;
      s.variance = (1.0 - alpha_) * s.variance + alpha_ * e * e;
      s.value = y;
    }
  }

  void predict(int day, std::span<DemandForecast> out) const override {
    const size_t w = static_cast<size_t>(scenario_->weekday_of(day));
    for (size_t i = 0; i < out.size(); ++i) {
      const NaiveState& s = state_[i][w];
      out[i] = {s.value > 0.0 ? s.value : 0.0, s.variance};
    }
  }

  std::size_t bytes_per_item() const override { return sizeof(state_[0]); }

 private:
  const Scenario* scenario_;
  double alpha_;
  std::vector<std::array<NaiveState, kDaysPerWeek>> state_;
};

class SameDayLastWeekMethod : public ForecastMethod {
 public:
  SameDayLastWeekMethod(double alpha, bool from_data) : alpha_(alpha), from_data_(from_data) {}

  std::unique_ptr<Forecaster> make(const StoreView& v) const override {
    std::vector<std::array<NaiveState, kDaysPerWeek>> initial(static_cast<size_t>(v.item_count()));
    if (!from_data_) {
      // "A planner with a sensible prior": the true weekday mean and variance (policies.md).
      for (int i = 0; i < v.item_count(); ++i) {
        for (int w = 0; w < kDaysPerWeek; ++w) {
          const CountLaw law = v.truth.weekday_law(v.store, i, w);
          initial[static_cast<size_t>(i)][static_cast<size_t>(w)] = {law.mean, law.variance, true};
        }
      }
    }
    return std::make_unique<SameDayLastWeek>(v.scenario, alpha_, std::move(initial));
  }

 private:
  double alpha_;
  bool from_data_;
};

}  // namespace

void register_same_day_last_week(PolicyRegistry& r) {
  r.forecasts.add(
      {"same_day_last_week",
       "last observed value of the same weekday, a naive seasonal forecast (alpha [0.2] smooths "
       "its squared error; initial: prior | first_week [prior])",
       [](PartContext& ctx) -> std::unique_ptr<ForecastMethod> {
         const double alpha = ctx.params.number("alpha", 0.2, {0.0, 1.0, true, false});
         const std::string initial = ctx.params.choice("initial", "prior", {"prior", "first_week"});
         return std::make_unique<SameDayLastWeekMethod>(alpha, initial == "first_week");
       }});
}

}  // namespace larder
