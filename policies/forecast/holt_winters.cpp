// `holt_winters`: additive level, trend and weekly season (Holt 1957; Winters 1960), seasonal
// update in the ETS error-correction form used by statsmodels (Hyndman, Koehler, Ord and
// Snyder 2008; checks.md 7.1). See holt_winters.hpp for the recursion and the closed days.

#include "policies/forecast/holt_winters.hpp"

#include <algorithm>
#include <cmath>

#include "policies/registry.hpp"
#include "sim/engine/demand_model.hpp"

namespace larder {

void holt_winters_update(HwState& s, double y, int w, int gap, const HwSmoothing& p) {
  const size_t k = static_cast<size_t>(w);
  // Days without observations: the level follows the trend.
  const double level = s.level + (gap - 1) * s.trend;
  const double base = level + s.trend;  // l_{t-1} + b_{t-1}
  const double e = y - (base + s.season[k]);
  s.level = p.alpha * (y - s.season[k]) + (1.0 - p.alpha) * base;
  s.trend = p.beta * (s.level - level) + (1.0 - p.beta) * s.trend;
  s.season[k] = p.gamma * (y - base) + (1.0 - p.gamma) * s.season[k];
  s.variance[k] = (1.0 - p.alpha) * s.variance[k] + p.alpha * e * e;
}

namespace {

/// Starts an item from its first week: level = mean of the values seen, trend 0, season =
/// value - level (0 for weekdays without one), variance = the value (Poisson-like, as
/// ses_weekday starts) or the level.
void start_from_first_week(HwState& s) {
  double sum = 0.0;
  int n = 0;
  for (int w = 0; w < kDaysPerWeek; ++w) {
    if ((s.seen >> w) & 1U) {
      sum += s.season[static_cast<size_t>(w)];
      ++n;
    }
  }
  s.level = sum / n;
  s.trend = 0.0;
  for (int w = 0; w < kDaysPerWeek; ++w) {
    const size_t k = static_cast<size_t>(w);
    const bool seen = (s.seen >> w) & 1U;
    s.variance[k] = seen ? s.season[k] : s.level;
    s.season[k] = seen ? s.season[k] - s.level : 0.0;
  }
  s.started = true;
}

/// The forecast of an item still collecting its first week: the weekday's value if seen, else
/// the mean of the values seen, with a Poisson-like variance; nothing seen: 0.
DemandForecast first_week_forecast(const HwState& s, int w) {
  if (s.seen == 0) return {};
  if ((s.seen >> w) & 1U) {
    const double v = s.season[static_cast<size_t>(w)];
    return {v, v};
  }
  double sum = 0.0;
  int n = 0;
  for (int d = 0; d < kDaysPerWeek; ++d) {
    if ((s.seen >> d) & 1U) {
      sum += s.season[static_cast<size_t>(d)];
      ++n;
    }
  }
  return {sum / n, sum / n};
}

}  // namespace

HoltWinters::HoltWinters(const Scenario& scenario, HwSmoothing smoothing,
                         std::vector<HwState> initial)
    : scenario_(&scenario), p_(smoothing), state_(std::move(initial)) {}

void HoltWinters::observe(int day, std::span<const double> demand) {
  const int w = scenario_->weekday_of(day);
  const int gap = std::max(day - last_day_, 1);
  for (size_t i = 0; i < demand.size(); ++i) {
    HwState& s = state_[i];
    const double y = demand[i];
    if (!s.started) {
      if (std::isnan(y)) continue;
      if (s.first_day < 0) s.first_day = day;
      if (day < s.first_day + kDaysPerWeek) {
        s.season[static_cast<size_t>(w)] = y;
        s.seen = static_cast<std::uint8_t>(s.seen | (1U << w));
        continue;
      }
      start_from_first_week(s);  // as of the previous day; the trend is 0, so any day
      holt_winters_update(s, y, w, 1, p_);
    } else if (std::isnan(y)) {
      s.level += gap * s.trend;  // no information: the state follows its transition
    } else {
      holt_winters_update(s, y, w, gap, p_);
    }
  }
  last_day_ = std::max(day, last_day_);
}

void HoltWinters::predict(int day, std::span<DemandForecast> out) const {
  const int w = scenario_->weekday_of(day);
  const int h = std::max(day - last_day_, 1);
  for (size_t i = 0; i < out.size(); ++i) {
    const HwState& s = state_[i];
    if (!s.started) {
      out[i] = first_week_forecast(s, w);
      continue;
    }
    const double mean = holt_winters_mean(s, w, h);
    out[i] = {mean > 0.0 ? mean : 0.0, s.variance[static_cast<size_t>(w)]};
  }
}

namespace {

class HoltWintersMethod : public ForecastMethod {
 public:
  HoltWintersMethod(HwSmoothing p, bool from_data) : p_(p), from_data_(from_data) {}

  std::unique_ptr<Forecaster> make(const StoreView& v) const override {
    std::vector<HwState> initial(static_cast<size_t>(v.item_count()));
    if (!from_data_) {
      // The planner's prior (policies.md): level = mean of the true means of the weekdays the
      // store opens, trend 0, season = weekday mean - level, variance = true weekday variance.
      const WeekdaySet& open = v.scenario.stores[static_cast<size_t>(v.store)].open_weekdays;
      const bool any_open = std::find(open.begin(), open.end(), true) != open.end();
      for (int i = 0; i < v.item_count(); ++i) {
        HwState& s = initial[static_cast<size_t>(i)];
        std::array<double, kDaysPerWeek> mean{};
        double sum = 0.0;
        int n = 0;
        for (int w = 0; w < kDaysPerWeek; ++w) {
          const size_t k = static_cast<size_t>(w);
          const CountLaw law = v.truth.weekday_law(v.store, i, w);
          mean[k] = law.mean;
          s.variance[k] = law.variance;
          if (open[k] || !any_open) {
            sum += law.mean;
            ++n;
          }
        }
        s.level = sum / n;
        for (size_t k = 0; k < mean.size(); ++k) s.season[k] = mean[k] - s.level;
        s.started = true;
      }
    }
    return std::make_unique<HoltWinters>(v.scenario, p_, std::move(initial));
  }

 private:
  HwSmoothing p_;
  bool from_data_;
};

}  // namespace

void register_holt_winters(PolicyRegistry& r) {
  r.forecasts.add(
      {"holt_winters",
       "additive level, trend and weekly season, ETS form (alpha [0.2], beta [0.05], gamma "
       "[0.1]; initial: prior | first_week [prior])",
       [](PartContext& ctx) -> std::unique_ptr<ForecastMethod> {
         const Range unit{0.0, 1.0, true, false};  // (0, 1]
         HwSmoothing p;
         p.alpha = ctx.params.number("alpha", p.alpha, unit);
         p.beta = ctx.params.number("beta", p.beta, unit);
         p.gamma = ctx.params.number("gamma", p.gamma, unit);
         const std::string initial = ctx.params.choice("initial", "prior", {"prior", "first_week"});
         return std::make_unique<HoltWintersMethod>(p, initial == "first_week");
       }});
}

}  // namespace larder
