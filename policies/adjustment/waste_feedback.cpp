// `waste_feedback`: the planner's reaction to waste. The order is cut by `share` x the units
// that left the shelf unsold at the close of the last open day (wasted, salvaged or donated),
// rounded to the nearest unit (halves up), never below 0. A practice heuristic, not a published
// method: a one-step feedback correction like the demand-chasing adjustment
// Q_t = Q_{t-1} + theta (D_{t-1} - Q_{t-1}) of Schweitzer and Cachon (2000) (checks.md 7.2,
// rule iii), with yesterday's waste as the signal.

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "policies/registry.hpp"

namespace larder {

namespace {
class WasteFeedback : public Adjuster {
 public:
  WasteFeedback(double share, int items) : share_(share), last_(static_cast<size_t>(items), 0) {}
  void observe(int, std::span<const Observation> observed) override {
    for (size_t i = 0; i < observed.size() && i < last_.size(); ++i) {
      const Observation& o = observed[i];
      if (o.open) last_[i] = o.wasted + o.salvaged + o.donated;
    }
  }
  void adjust(const OrderContext&, std::span<const OrderInput>, std::span<const Observation>,
              std::span<int> orders) override {
    for (size_t i = 0; i < orders.size(); ++i) {
      const int cut = static_cast<int>(std::floor(share_ * last_[i] + 0.5));
      orders[i] = std::max(0, orders[i] - cut);
    }
  }

 private:
  double share_;
  std::vector<int> last_;  ///< unsold units that left at the last open day's close
};

class WasteFeedbackMethod : public AdjustmentMethod {
 public:
  explicit WasteFeedbackMethod(double share) : share_(share) {}
  std::unique_ptr<Adjuster> make(const StoreView& view) const override {
    return std::make_unique<WasteFeedback>(share_, view.item_count());
  }

 private:
  double share_;
};
}  // namespace

void register_waste_feedback(PolicyRegistry& r) {
  r.adjustments.add({"waste_feedback",
                     "cut the order by share x the units left unsold at the last open day's "
                     "close (share in [0, 1], required)",
                     [](PartContext& ctx) -> std::unique_ptr<AdjustmentMethod> {
                       const auto share = ctx.params.optional_number("share", Range::probability());
                       if (!share) {
                         if (!ctx.params.has("share")) {
                           ctx.params.error({}, fmt::format("{} needs 'share'", ctx.params.path()),
                                            "the share of the last open day's waste to cut "
                                            "from the order, in [0, 1]");
                         }
                         return nullptr;
                       }
                       return std::make_unique<WasteFeedbackMethod>(*share);
                     }});
}

}  // namespace larder
