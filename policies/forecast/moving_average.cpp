// `moving_average`: the mean and variance of the last `weeks` observations of the same weekday
// (a Monday from the last `weeks` Mondays): the simple moving average of Brown (1959,
// Statistical Forecasting for Inventory Control) applied per weekday, with the sample variance
// (divisor n - 1) as the spread. Days without information (NaN) are skipped, so the window
// holds the last `weeks` observations, not the last `weeks` calendar weeks.
//
// Fewer than `weeks` observations (initial: prior): the prior (the true weekday mean and
// variance) counts as the missing observations. With n of W observations,
//   mean     = ((W - n) prior_mean + sum of observations) / W
//   variance = ((W - n) prior_variance + n s^2) / W   (s^2: sample variance, n >= 2)
// and with n < 2 the data say nothing about spread: variance = prior_variance.
// With `initial: first_week` there is no prior: n = 0 gives 0, n = 1 gives mean = variance =
// the observation (Poisson-like, as ses_weekday starts), n >= 2 the mean and s^2.

#include <algorithm>
#include <cmath>
#include <cstdint>

#include "policies/registry.hpp"
#include "sim/engine/demand_model.hpp"

namespace larder {

namespace {

class MovingAverage : public Forecaster {
 public:
  /// `prior`: per item and weekday, or empty for `initial: first_week`.
  MovingAverage(const Scenario& scenario, int weeks, std::vector<DemandForecast> prior)
      : scenario_(&scenario),
        weeks_(weeks),
        // The window never holds more observations than the horizon has weeks.
        capacity_(std::max(
            1, std::min(weeks, (scenario.horizon.days + kDaysPerWeek - 1) / kDaysPerWeek))),
        values_(scenario.items.size() * kDaysPerWeek * static_cast<size_t>(capacity_)),
        count_(scenario.items.size() * kDaysPerWeek, 0),
        prior_(std::move(prior)) {}

  void observe(int day, std::span<const double> demand) override {
    const size_t w = static_cast<size_t>(scenario_->weekday_of(day));
    const size_t cap = static_cast<size_t>(capacity_);
    for (size_t i = 0; i < demand.size(); ++i) {
      if (std::isnan(demand[i])) continue;
      const size_t k = i * kDaysPerWeek + w;
      values_[k * cap + count_[k] % cap] = demand[i];
      ++count_[k];
    }
  }

  void predict(int day, std::span<DemandForecast> out) const override {
    const size_t w = static_cast<size_t>(scenario_->weekday_of(day));
    const size_t cap = static_cast<size_t>(capacity_);
    for (size_t i = 0; i < out.size(); ++i) {
      const size_t k = i * kDaysPerWeek + w;
      const size_t n = std::min<size_t>(count_[k], cap);
      // The ring holds the last min(count, cap) observations (cap = weeks, or fewer when
      // the horizon has fewer weeks than that, so the ring never wraps).
      const double* v = &values_[k * cap];
      double sum = 0.0;
      for (size_t j = 0; j < n; ++j) sum += v[j];
      const double mean = n > 0 ? sum / static_cast<double>(n) : 0.0;
      double ss = 0.0;
      for (size_t j = 0; j < n; ++j) ss += (v[j] - mean) * (v[j] - mean);
      const double s2 = n >= 2 ? ss / static_cast<double>(n - 1) : 0.0;
      DemandForecast f;
      if (prior_.empty()) {
        f = n == 0 ? DemandForecast{} : DemandForecast{mean, n >= 2 ? s2 : mean};
      } else {
        const DemandForecast& p = prior_[k];
        const double wgt = static_cast<double>(weeks_);
        const double missing = wgt - static_cast<double>(n);
        f.mean = (missing * p.mean + sum) / wgt;
        f.variance =
            n >= 2 ? (missing * p.variance + static_cast<double>(n) * s2) / wgt : p.variance;
      }
      out[i] = {std::max(f.mean, 0.0), f.variance};
    }
  }

  std::size_t bytes_per_item() const override {
    return kDaysPerWeek * (static_cast<size_t>(capacity_) * sizeof(double) + sizeof(count_[0]) +
                           (prior_.empty() ? 0 : sizeof(DemandForecast)));
  }

 private:
  const Scenario* scenario_;
  int weeks_;
  int capacity_;
  std::vector<double> values_;         ///< [item][weekday][slot], a ring per item-weekday
  std::vector<std::uint32_t> count_;   ///< [item][weekday] observations so far
  std::vector<DemandForecast> prior_;  ///< [item][weekday]; empty for initial: first_week
};

class MovingAverageMethod : public ForecastMethod {
 public:
  MovingAverageMethod(int weeks, bool from_data) : weeks_(weeks), from_data_(from_data) {}

  std::unique_ptr<Forecaster> make(const StoreView& v) const override {
    std::vector<DemandForecast> prior;
    if (!from_data_) {
      // "A planner with a sensible prior": the true weekday mean and variance (policies.md).
      prior.resize(static_cast<size_t>(v.item_count()) * kDaysPerWeek);
      for (int i = 0; i < v.item_count(); ++i) {
        for (int w = 0; w < kDaysPerWeek; ++w) {
          const CountLaw law = v.truth.weekday_law(v.store, i, w);
          prior[static_cast<size_t>(i * kDaysPerWeek + w)] = {law.mean, law.variance};
        }
      }
    }
    return std::make_unique<MovingAverage>(v.scenario, weeks_, std::move(prior));
  }

 private:
  int weeks_;
  bool from_data_;
};

}  // namespace

void register_moving_average(PolicyRegistry& r) {
  r.forecasts.add(
      {"moving_average",
       "mean and variance of the last `weeks` same-weekday observations (weeks [4]; initial: "
       "prior | first_week [prior])",
       [](PartContext& ctx) -> std::unique_ptr<ForecastMethod> {
         const int weeks = ctx.params.integer("weeks", 4, Range::at_least(1));
         const std::string initial = ctx.params.choice("initial", "prior", {"prior", "first_week"});
         return std::make_unique<MovingAverageMethod>(weeks, initial == "first_week");
       }});
}

}  // namespace larder
