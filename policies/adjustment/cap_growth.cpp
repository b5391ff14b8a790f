// `cap_growth`: a sanity cap against runaway orders. Once 4 open days of the arrival day's
// weekday have been observed, the order is at most `factor` (x) times the mean sales of the
// last 4 of them, rounded down to a whole unit (the engine may still round it up to a pack).
// A practice guard, not a published method; its reference is the seasonal moving average of
// the same weekday (policies.md `moving_average`; Hyndman and Athanasopoulos, Forecasting:
// Principles and Practice, simple forecasting methods). Sales are censored by stock, so four
// weeks of zero sales lock that weekday at 0: list `min_display` after it to keep a floor.

#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <cmath>

#include "policies/registry.hpp"

namespace larder {

namespace {
constexpr int kWeeks = 4;

class CapGrowth : public Adjuster {
 public:
  CapGrowth(double factor, const Scenario& scenario)
      : factor_(factor), scenario_(&scenario), history_(scenario.items.size()) {}
  void observe(int day, std::span<const Observation> observed) override {
    if (day < 0) return;
    const size_t wd = static_cast<size_t>(scenario_->weekday_of(day));
    for (size_t i = 0; i < observed.size() && i < history_.size(); ++i) {
      if (!observed[i].open) continue;
      Weekday& h = history_[i][wd];
      h.sold[static_cast<size_t>(h.count % kWeeks)] = observed[i].sold;
      ++h.count;
    }
  }
  void adjust(const OrderContext& ctx, std::span<const OrderInput>, std::span<const Observation>,
              std::span<int> orders) override {
    if (ctx.arrival_day < 0) return;
    const size_t wd = static_cast<size_t>(scenario_->weekday_of(ctx.arrival_day));
    for (size_t i = 0; i < orders.size(); ++i) {
      const Weekday& h = history_[i][wd];
      if (h.count < kWeeks) continue;
      double mean = 0.0;
      for (int s : h.sold) mean += s;
      mean /= kWeeks;
      const double cap = std::floor(factor_ * mean + 1e-9);
      orders[i] = std::min(orders[i], static_cast<int>(std::min(cap, 2e9)));
    }
  }

 private:
  struct Weekday {
    std::array<int, kWeeks> sold{};  ///< ring of the last sales of this weekday
    int count = 0;                   ///< open days of this weekday seen so far
  };
  double factor_;
  const Scenario* scenario_;
  std::vector<std::array<Weekday, kDaysPerWeek>> history_;
};

class CapGrowthMethod : public AdjustmentMethod {
 public:
  explicit CapGrowthMethod(double factor) : factor_(factor) {}
  std::unique_ptr<Adjuster> make(const StoreView& view) const override {
    return std::make_unique<CapGrowth>(factor_, view.scenario);
  }

 private:
  double factor_;
};
}  // namespace

void register_cap_growth(PolicyRegistry& r) {
  r.adjustments.add({"cap_growth",
                     "at most factor x the mean sales of the last 4 same-weekday open days, "
                     "once 4 exist (factor > 0, required)",
                     [](PartContext& ctx) -> std::unique_ptr<AdjustmentMethod> {
                       const auto factor = ctx.params.optional_number("factor", Range::above(0.0));
                       if (!factor) {
                         if (!ctx.params.has("factor")) {
                           ctx.params.error(
                               {}, fmt::format("{} needs 'factor'", ctx.params.path()),
                               "the largest order as a multiple of the mean of the last 4 "
                               "same-weekday sales, e.g. factor: 1.5");
                         }
                         return nullptr;
                       }
                       return std::make_unique<CapGrowthMethod>(*factor);
                     }});
}

}  // namespace larder
