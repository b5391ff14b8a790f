#include "policies/forecast/ses_weekday.hpp"

#include <cmath>

#include "policies/registry.hpp"
#include "sim/engine/demand_model.hpp"

namespace larder {

SesState ses_update(SesState s, double y, double alpha) {
  if (!s.started) return {y, y, true};  // first observation: level y, Poisson-like spread
  const double e = y - s.level;
  s.level += alpha * e;
  s.variance = (1.0 - alpha) * s.variance + alpha * e * e;
  return s;
}

SesWeekday::SesWeekday(const Scenario& scenario, double alpha,
                       std::vector<std::array<SesState, kDaysPerWeek>> prior)
    : scenario_(&scenario), alpha_(alpha), state_(std::move(prior)) {}

void SesWeekday::observe(int day, std::span<const double> demand) {
  const size_t w = static_cast<size_t>(scenario_->weekday_of(day));
  for (size_t i = 0; i < demand.size(); ++i) {
    if (!std::isnan(demand[i])) state_[i][w] = ses_update(state_[i][w], demand[i], alpha_);
  }
}

void SesWeekday::predict(int day, std::span<DemandForecast> out) const {
  const size_t w = static_cast<size_t>(scenario_->weekday_of(day));
  for (size_t i = 0; i < out.size(); ++i) {
    const SesState& s = state_[i][w];
    out[i] = {s.level > 0.0 ? s.level : 0.0, s.variance};
  }
}

SesWeekdayMethod::SesWeekdayMethod(double alpha, bool from_data)
    : alpha_(alpha), from_data_(from_data) {}

std::unique_ptr<Forecaster> SesWeekdayMethod::make(const StoreView& v) const {
  std::vector<std::array<SesState, kDaysPerWeek>> prior(static_cast<size_t>(v.item_count()));
  if (!from_data_) {
    // "A planner with a sensible prior": the true weekday mean and variance (policies.md).
    for (int i = 0; i < v.item_count(); ++i) {
      for (int w = 0; w < kDaysPerWeek; ++w) {
        const CountLaw law = v.truth.weekday_law(v.store, i, w);
        prior[static_cast<size_t>(i)][static_cast<size_t>(w)] = {law.mean, law.variance, true};
      }
    }
  }
  return std::make_unique<SesWeekday>(v.scenario, alpha_, std::move(prior));
}

void register_ses_weekday(PolicyRegistry& r) {
  r.forecasts.add(
      {"ses_weekday",
       "exponential smoothing per weekday (alpha [0.2]; initial: prior | first_week [prior])",
       [](PartContext& ctx) -> std::unique_ptr<ForecastMethod> {
         const double alpha = ctx.params.number("alpha", 0.2, {0.0, 1.0, true, false});
         const std::string initial = ctx.params.choice("initial", "prior", {"prior", "first_week"});
         return std::make_unique<SesWeekdayMethod>(alpha, initial == "first_week");
       }});
}

}  // namespace larder
