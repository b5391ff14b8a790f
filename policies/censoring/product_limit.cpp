// `product_limit` (Kaplan and Meier 1958; Huh et al. 2011): per store, a ring of the last
// `weeks` observations of each item and weekday; `refine` replaces the parametric forecast with
// the moments of their Kaplan-Meier distribution, completed above the largest sold-out value
// by a normal tail (product_limit.hpp).

#include "policies/censoring/product_limit.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <limits>

#include "policies/censoring/normal_tail_moments.hpp"
#include "policies/registry.hpp"

namespace larder {

namespace {

/// Stop the fixed-point iteration when the mean and variance move less than this (relative).
constexpr double kTolerance = 1e-9;
constexpr int kMaxIterations = 100;

/// The count tail D >= s of the normal whose mean and variance equal those of the completed
/// distribution (body moments `m1`, `m2` of mass 1 - r, plus mass r in that tail), by
/// fixed-point iteration from `start`: the EM algorithm for a normal fitted to weighted exact
/// values and one censored group (Dempster, Laird and Rubin 1977).
TailMoments self_consistent_tail(double m1, double m2, double r, double s,
                                 const DemandForecast& start) {
  double mean = start.mean;
  double variance = start.variance;
  TailMoments t = count_upper_tail(mean, variance, s);
  for (int k = 0; k < kMaxIterations; ++k) {
    const double next_mean = m1 + r * t.mean;
    const double next_variance =
        std::max(m2 + r * (t.variance + t.mean * t.mean) - next_mean * next_mean, 0.0);
    const bool settled = std::abs(next_mean - mean) <= kTolerance * (1.0 + std::abs(mean)) &&
                         std::abs(next_variance - variance) <= kTolerance * (1.0 + variance);
    mean = next_mean;
    variance = next_variance;
    t = count_upper_tail(mean, variance, s);
    if (settled) break;
  }
  return t;
}

}  // namespace

DemandForecast product_limit_moments(const KaplanMeier& km, int n, const DemandForecast& parametric,
                                     ProductLimitTail tail) {
  double m1 = 0.0;  // E[D; D in the body]
  double m2 = 0.0;  // E[D^2; D in the body]
  double before = 1.0;
  for (size_t i = 0; i < km.times.size(); ++i) {
    const double p = before - km.survival[i];
    m1 += p * km.times[i];
    m2 += p * km.times[i] * km.times[i];
    before = km.survival[i];
  }
  const double r = km.remaining();
  if (r > 0.0) {
    const double s = km.largest_censored + 0.5;  // the sales of the largest sold-out day
    TailMoments t{s, 0.0};
    if (tail == ProductLimitTail::normal) {
      // With no event there is no body to fit a shape to: the parametric forecast's tail.
      t = km.times.empty() ? count_upper_tail(parametric.mean, parametric.variance, s)
                           : self_consistent_tail(m1, m2, r, s, parametric);
    }
    m1 += r * t.mean;
    m2 += r * (t.variance + t.mean * t.mean);
  }
  if (n < 2) return {m1, parametric.variance};  // one day says nothing about the spread
  const double nd = static_cast<double>(n);
  const double variance = std::max(m2 - m1 * m1, 0.0) * (nd + 1.0) / (nd - 1.0);
  return {m1, variance};
}

namespace {

/// Per store: a ring of the last `weeks` observations of each item and weekday.
class ProductLimitState : public CensoringState {
 public:
  ProductLimitState(const Scenario& scenario, int items, int weeks, ProductLimitTail tail)
      : scenario_(&scenario),
        weeks_(weeks),
        tail_(tail),
        ring_(static_cast<size_t>(items) * kDaysPerWeek * static_cast<size_t>(weeks)),
        count_(static_cast<size_t>(items) * kDaysPerWeek, 0),
        next_(static_cast<size_t>(items) * kDaysPerWeek, 0) {
    scratch_.reserve(static_cast<size_t>(weeks));
  }

  void treat(int day, std::span<const Observation> observed, std::span<const DemandForecast>,
             std::span<double> out) override {
    const int w = scenario_->weekday_of(day);
    for (size_t i = 0; i < out.size(); ++i) {
      const Observation& o = observed[i];
      if (!o.open) {
        out[i] = std::numeric_limits<double>::quiet_NaN();
        continue;
      }
      out[i] = static_cast<double>(o.sold);     // the parametric forecast learns as `ignore`
      if (o.sold_out && o.sold == 0) continue;  // an empty shelf says nothing about demand
      const size_t cell = i * kDaysPerWeek + static_cast<size_t>(w);
      ring_[cell * static_cast<size_t>(weeks_) + static_cast<size_t>(next_[cell])] = {o.sold,
                                                                                      o.sold_out};
      next_[cell] = (next_[cell] + 1) % weeks_;
      count_[cell] = std::min(count_[cell] + 1, weeks_);
    }
  }

  void refine(int day, std::span<DemandForecast> forecast) const override {
    const int w = scenario_->weekday_of(day);
    for (size_t i = 0; i < forecast.size(); ++i) {
      const size_t cell = i * kDaysPerWeek + static_cast<size_t>(w);
      const int n = count_[cell];
      if (n == 0) continue;  // no data yet: keep the parametric forecast
      scratch_.clear();
      for (int k = 0; k < n; ++k) {
        const Entry& e = ring_[cell * static_cast<size_t>(weeks_) + static_cast<size_t>(k)];
        scratch_.push_back({e.censored ? e.sales - 0.5 : static_cast<double>(e.sales), e.censored});
      }
      kaplan_meier(scratch_, km_);
      forecast[i] = product_limit_moments(km_, n, forecast[i], tail_);
    }
  }

 private:
  struct Entry {
    std::int32_t sales = 0;
    bool censored = false;  ///< sold out: demand >= sales
  };
  const Scenario* scenario_;
  int weeks_;
  ProductLimitTail tail_;
  std::vector<Entry> ring_;  ///< [(item * 7 + weekday) * weeks + k]
  std::vector<int> count_;   ///< observations held, per item and weekday
  std::vector<int> next_;    ///< ring slot written next, per item and weekday
  // Scratch for `refine` (one store runs on one thread).
  mutable std::vector<SurvivalObservation> scratch_;
  mutable KaplanMeier km_;
};

class ProductLimit : public CensoringMethod {
 public:
  ProductLimit(int weeks, ProductLimitTail tail) : weeks_(weeks), tail_(tail) {}
  std::unique_ptr<CensoringState> make(const StoreView& v) const override {
    return std::make_unique<ProductLimitState>(v.scenario, v.item_count(), weeks_, tail_);
  }

 private:
  int weeks_;
  ProductLimitTail tail_;
};

/// More weeks than this is a typo, not a window (the ring is allocated per item and weekday).
constexpr int kMaxWeeks = 520;

}  // namespace

void register_product_limit(PolicyRegistry& r) {
  r.censorings.add(
      {"product_limit",
       "Kaplan-Meier estimate of each weekday's demand over the last `weeks` [8] of that "
       "weekday, in place of the parametric forecast (tail: normal | restricted [normal])",
       [](PartContext& ctx) -> std::unique_ptr<CensoringMethod> {
         const bool given = ctx.params.has("weeks");
         const auto weeks = ctx.params.optional_integer("weeks", Range::at_least(1));
         const std::string tail = ctx.params.choice("tail", "normal", {"normal", "restricted"});
         if (given && !weeks) return nullptr;  // already reported
         if (weeks && *weeks > kMaxWeeks) {
           ctx.params.error("weeks", fmt::format("{} must be at most {} (got {})",
                                                 ctx.params.path_of("weeks"), kMaxWeeks, *weeks));
           return nullptr;
         }
         return std::make_unique<ProductLimit>(weeks.value_or(8), tail == "restricted"
                                                                      ? ProductLimitTail::restricted
                                                                      : ProductLimitTail::normal);
       }});
}

}  // namespace larder
