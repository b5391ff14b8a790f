// `demand_chasing` (behavioural rule): a planner who overreacts to the last observation,
// written as weekday exponential smoothing with a high smoothing constant `alpha` [0.8]. Kremer,
// Moritz and Siemsen (2011, "Demand forecasting behavior: system neglect and change detection",
// Management Science 57(10)) find that forecasters overreact to forecast errors in stable
// settings: their behavioural alpha exceeds the optimal one (checks.md 7.2; the optimal alpha
// of a random walk plus noise is the steady-state Kalman gain of checks.md 7.1). The recursion
// is ses_weekday's (SesWeekday, reused as is: the same level and spread updates); only the
// default and the purpose differ: this part shows and measures the bias, ses_weekday forecasts.

#include "policies/forecast/ses_weekday.hpp"
#include "policies/registry.hpp"

namespace larder {

void register_demand_chasing(PolicyRegistry& r) {
  r.forecasts.add(
      {"demand_chasing",
       "behavioural: weekday smoothing with a high alpha, overreacting to the last observation "
       "(Kremer, Moritz and Siemsen 2011) (alpha [0.8]; initial: prior | first_week [prior])",
       [](PartContext& ctx) -> std::unique_ptr<ForecastMethod> {
         const double alpha = ctx.params.number("alpha", 0.8, {0.0, 1.0, true, false});
         const std::string initial = ctx.params.choice("initial", "prior", {"prior", "first_week"});
         return std::make_unique<SesWeekdayMethod>(alpha, initial == "first_week");
       }});
}

}  // namespace larder
