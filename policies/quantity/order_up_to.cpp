// `order_up_to`: a periodic-review order-up-to rule for perishables with an outdating
// correction, after the "estimated withdrawals and ageing" (EWA) heuristic of Broekmeulen and
// van Donselaar (2009), "A heuristic to manage perishable inventory with batch ordering,
// positive lead-times, and time-varying demand", Computers & Operations Research 36(11)
// (checks.md 5.3; the order-up-to base policy as in Nahmias 1982 and Silver, Pyke and Thomas
// 2017).
//
// An order placed after close on day t arrives on the morning of a = t + L (lead time L).
// It must cover the protection period: the L - 1 days before it arrives and the n days it
// serves, n = min(max(review_days, W), shelf life), where W is the engine's window (the days
// until the next delivery arrives or the units expire: 1 with daily deliveries), cut at the
// end of the horizon.
//   S = smallest integer with P(D <= S) >= level, D the demand of the period: the engine's
//       forecast of its window plus the forecaster's daily forecasts of the other days (means
//       and variances added; closed days and days outside the horizon count 0), under the
//       family of `assume`.
//   IP = stock on hand (every age) + units on order.
//   O(Q) = expected_outdating(): units expected to outdate before the period ends, from
//       running the daily mean demand through the stock by age, the pipeline and the order Q
//       itself (the freshest units), with the store's customers.fifo_share taking the oldest.
//   Q = max(0, S - IP + ceil(O(Q))), found by iterating from Q = max(0, S - IP) until Q
//       repeats (a larger order shields more old stock from the shoppers who take the
//       freshest unit, so Q rises round by round; at most 20 rounds, the last one is kept).
// With lead time 1 and n = 1 (shelf life 1, or review_days 1 with daily deliveries) the period
// is the arrival day, nothing outdates early, and Q is the plain quantile order S - usable
// stock - units on order (FractileRule with extra 0).

#include "policies/quantity/order_up_to.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>
#include <vector>

#include "policies/quantity/fractile_rule.hpp"
#include "policies/quantity/item_values.hpp"
#include "policies/registry.hpp"

namespace larder {

double expected_outdating(std::span<const std::int32_t> stock_by_age,
                          std::span<const std::int32_t> arrivals, int life,
                          std::span<const double> withdrawals, double fifo_share) {
  const size_t m = static_cast<size_t>(std::max(life, 1));
  std::vector<double> s(m, 0.0);  // s[k]: units that leave at the close of today + k
  for (size_t k = 0; k < stock_by_age.size() && k < m; ++k) s[k] = stock_by_age[k];
  const size_t n = withdrawals.size();
  double outdated = 0.0;
  for (size_t d = 0; d < n; ++d) {
    if (d < arrivals.size()) s[m - 1] += arrivals[d];
    const double total = std::accumulate(s.begin(), s.end(), 0.0);
    const double sold = std::clamp(withdrawals[d], 0.0, total);
    // The oldest-first share from the oldest end, the rest from the freshest end (sold <=
    // stock, so both ends can always give what is asked).
    double need = fifo_share * sold;
    for (size_t k = 0; k < m && need > 0.0; ++k) {
      const double t = std::min(need, s[k]);
      s[k] -= t;
      need -= t;
    }
    need = (1.0 - fifo_share) * sold;
    for (size_t k = m; k-- > 0 && need > 0.0;) {
      const double t = std::min(need, s[k]);
      s[k] -= t;
      need -= t;
    }
    if (d + 1 < n) outdated += s[0];
    for (size_t k = 0; k + 1 < m; ++k) s[k] = s[k + 1];
    s[m - 1] = 0.0;
  }
  return outdated;
}

namespace {

struct OrderUpToSetup {
  std::vector<double> level;
  std::vector<DemandFamily> family;
  int review_days = 1;
};

/// The rule's state at one store: scratch buffers for the forecasts of the period.
class OrderUpToRule : public OrderRule {
 public:
  OrderUpToRule(const OrderUpToSetup& setup, const StoreView& view)
      : setup_(&setup), fifo_share_(view.scenario.fifo_share) {}

  void decide(const OrderContext& ctx, std::span<const OrderInput> in,
              std::span<int> out) override {
    const Scenario& sc = ctx.store.scenario;
    const int lead = std::max(ctx.arrival_day - ctx.order_day, 1);
    const size_t items = in.size();
    // Days order_day + 1 ... order_day + days, cut at the end of the horizon.
    const int horizon_left = sc.horizon.days - 1 - ctx.order_day;
    const auto period_days = [&](size_t i) {
      return std::max(std::min(lead - 1 + serves(in[i], sc.items[i]), horizon_left), lead);
    };
    int period = lead;
    for (size_t i = 0; i < items; ++i) period = std::max(period, period_days(i));
    fill_forecasts(ctx, in, period);
    for (size_t i = 0; i < items; ++i) {
      const OrderInput& x = in[i];
      const int life = sc.items[i].shelf_life_days;
      const int days = period_days(i);
      const int window = std::max(x.cover_days, 1);  // the engine's forecast window
      // Demand of the period: the lead-time days, the engine's window (x.forecast), and the
      // days after it that the order must still cover.
      DemandForecast sum = x.forecast;
      withdrawals_.assign(static_cast<size_t>(days), 0.0);
      for (int d = 0; d < days; ++d) {
        const DemandForecast& f = forecasts_[static_cast<size_t>(d) * items + i];
        withdrawals_[static_cast<size_t>(d)] = std::max(f.mean, 0.0);
        if (d >= lead - 1 && d < lead - 1 + window) continue;
        sum.mean += std::max(f.mean, 0.0);
        sum.variance += std::max(f.variance, 0.0);
      }
      sum.mean = std::max(sum.mean, 0.0);
      const int target = forecast_quantile(sum, setup_->family[i], setup_->level[i]);
      // Stock by age and arrivals; without an age profile, usable stock counts as fresh and
      // units on order as arriving tomorrow.
      stock_.assign(x.stock_by_age.begin(), x.stock_by_age.end());
      if (stock_.empty()) {
        stock_.assign(static_cast<size_t>(life), 0);
        stock_.back() = x.usable_stock;
      }
      arrivals_.assign(static_cast<size_t>(days), 0);
      if (x.pipeline.empty()) {
        arrivals_[0] = x.on_order;
      } else {
        for (size_t d = 0; d < x.pipeline.size() && d < arrivals_.size(); ++d) {
          arrivals_[d] = x.pipeline[d];
        }
      }
      const long position = std::accumulate(stock_.begin(), stock_.end(), 0L) +
                            std::accumulate(arrivals_.begin(), arrivals_.end(), 0L);
      const long base = static_cast<long>(target) - position;
      const size_t arrival = static_cast<size_t>(lead - 1);
      const std::int32_t scheduled = arrivals_[arrival];
      long q = std::max(0L, base);
      for (int round = 0; round < 20; ++round) {
        arrivals_[arrival] = static_cast<std::int32_t>(scheduled + q);
        const double o = expected_outdating(stock_, arrivals_, life, withdrawals_, fifo_share_);
        const long next = std::max(0L, base + static_cast<long>(std::ceil(o - 1e-9)));
        if (next == q) break;
        q = next;
      }
      out[i] = static_cast<int>(std::min(q, 2000000000L));
    }
  }

 private:
  /// Days the delivery serves: review_days, at least the engine's window (until the next
  /// delivery), at most the shelf life.
  int serves(const OrderInput& x, const Item& item) const {
    return std::min(std::max(setup_->review_days, x.cover_days), item.shelf_life_days);
  }

  /// forecasts_[d * items + i]: item i's demand forecast for day order_day + 1 + d (0 on
  /// closed days and outside the horizon). A one-day window on the arrival day is the engine's
  /// forecast (after the censoring treatment's refinement); other days come from the
  /// forecaster, or, without one, from the engine's window spread evenly over its days.
  void fill_forecasts(const OrderContext& ctx, std::span<const OrderInput> in, int period) {
    const Scenario& sc = ctx.store.scenario;
    const size_t items = in.size();
    forecasts_.assign(static_cast<size_t>(period) * items, DemandForecast{});
    day_.resize(items);
    for (int d = 0; d < period; ++d) {
      const int day = ctx.order_day + 1 + d;
      DemandForecast* row = &forecasts_[static_cast<size_t>(d) * items];
      if (day < 0 || day >= sc.horizon.days || !sc.is_open(ctx.store.store, day)) continue;
      if (ctx.forecaster != nullptr) {
        ctx.forecaster->predict(day, day_);
        std::copy(day_.begin(), day_.end(), row);
      } else {
        for (size_t i = 0; i < items; ++i) {
          const double w = 1.0 / std::max(in[i].cover_days, 1);
          row[i] = {in[i].forecast.mean * w, in[i].forecast.variance * w};
        }
      }
      if (day == ctx.arrival_day) {
        for (size_t i = 0; i < items; ++i) {
          if (in[i].cover_days <= 1) row[i] = in[i].forecast;
        }
      }
    }
  }

  const OrderUpToSetup* setup_;
  double fifo_share_;
  std::vector<DemandForecast> forecasts_;
  std::vector<DemandForecast> day_;
  std::vector<double> withdrawals_;
  std::vector<std::int32_t> stock_;
  std::vector<std::int32_t> arrivals_;
};

class OrderUpTo : public QuantityMethod {
 public:
  explicit OrderUpTo(OrderUpToSetup setup) : setup_(std::move(setup)) {}
  std::unique_ptr<OrderRule> make(const StoreView& view) const override {
    return std::make_unique<OrderUpToRule>(setup_, view);
  }

 private:
  OrderUpToSetup setup_;
};

}  // namespace

void register_order_up_to(PolicyRegistry& r) {
  r.quantities.add(
      {"order_up_to",
       "perishables: order up to a quantile of the demand until the delivery is sold or "
       "replaced, plus the stock expected to outdate first (level: number or item map in "
       "(0, 1), default 0.8; review_days: days a delivery serves, default 1, capped at the "
       "shelf life; assume: family)",
       [](PartContext& ctx) -> std::unique_ptr<QuantityMethod> {
         OrderUpToSetup setup;
         if (ctx.params.has("level")) {
           auto level = read_item_values(ctx, "level", {0.0, 1.0, true, true}, true);
           if (!level) return nullptr;
           setup.level = std::move(*level);
         } else {
           setup.level.assign(ctx.scenario.items.size(), 0.8);
         }
         setup.review_days = ctx.params.integer("review_days", 1, Range::between(1, 364));
         setup.family = read_assume(ctx);
         return std::make_unique<OrderUpTo>(std::move(setup));
       }});
}

}  // namespace larder
