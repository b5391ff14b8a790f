#include "policies/quantity/chain_ratio.hpp"

#include <algorithm>
#include <cmath>
#include <numeric>
#include <vector>

#include "policies/quantity/protection_period.hpp"
#include "sim/engine/demand_model.hpp"
#include "sim/stats/count_law.hpp"

namespace larder {

namespace {

/// What one unit brings when it leaves by `how` at the end of its life.
double leaving_value(const Item& item, Leftovers how) {
  switch (how) {
    case Leftovers::salvage:
      return item.salvage_value;
    case Leftovers::donate:
      return 0.0;
    default:
      return -item.disposal_cost;
  }
}

bool daily_deliveries(const Scenario& sc) {
  for (bool d : sc.logistics.delivery_weekdays) {
    if (!d) return false;
  }
  return true;
}

}  // namespace

bool plain_newsvendor(const Scenario& scenario, const Item& item) {
  return item.shelf_life_days == 1 && scenario.logistics.lead_time_days == 1 &&
         !item.next_day.has_value();
}

std::optional<ChainSpec> typical_chain(const Scenario& sc, int item_index, double penalty,
                                       DemandFamily family) {
  const Item& item = sc.items[static_cast<size_t>(item_index)];
  if (item.markdown || !daily_deliveries(sc) || sc.stores.empty()) return std::nullopt;
  double size = 0.0;
  for (const Store& s : sc.stores) size += s.size;
  size /= static_cast<double>(sc.stores.size());
  const double weekday =
      std::accumulate(item.demand.weekday.begin(), item.demand.weekday.end(), 0.0) / kDaysPerWeek;
  const double mean = item.demand.base * size * weekday;
  if (!(mean > 0.0)) return std::nullopt;
  const CountLaw law =
      CountLaw::make(item.demand.family, mean, item.demand.cv, item.demand.dispersion);
  ChainSpec c;
  c.life = item.shelf_life_days;
  c.lead = sc.logistics.lead_time_days;
  c.fifo_share = sc.fifo_share;
  c.demand_pmf = truncated_pmf(family, mean, family == DemandFamily::poisson ? mean : law.variance);
  c.price = item.price;
  c.unit_cost = item.unit_cost;
  c.stockout_penalty = penalty;
  c.leaving_value = leaving_value(item, item.next_day ? item.next_day->fallback : item.leftovers);
  if (item.next_day) {
    c.discount_tier = true;
    c.discount_price = item.next_day->price;
    c.take_rate = sc.discount_take_rate;
  }
  c.cap = CountLaw::from_moments(family, mean, law.variance).quantile(0.9999) + 2;
  if (!ItemChain::fits(c)) return std::nullopt;
  return c;
}

double best_chain_ratio(const Scenario& sc, int item_index, const ChainSpec& spec,
                        DemandFamily family, int extra) {
  const ItemChain chain(spec);
  // The rule as it runs, on a one-store, one-item copy of the scenario open every day, with
  // the typical day's forecast (its mean and variance from the chain's pmf).
  Scenario one;
  one.horizon.days = 1000;
  one.horizon.warmup_days = 0;
  one.stores.push_back(Store{});
  one.calendar.open_weekdays = kAllWeekdays;
  one.items.push_back(sc.items[static_cast<size_t>(item_index)]);
  one.fifo_share = sc.fifo_share;
  one.discount_take_rate = sc.discount_take_rate;
  one.logistics = sc.logistics;
  double mean = 0.0;
  double second = 0.0;
  for (size_t k = 0; k < spec.demand_pmf.size(); ++k) {
    mean += spec.demand_pmf[k] * static_cast<double>(k);
    second += spec.demand_pmf[k] * static_cast<double>(k * k);
  }
  const DemandForecast forecast{mean, second - mean * mean};
  const DemandModel truth(one);
  const StoreView view{one, truth, 0};
  const OrderContext ctx{view, 0, spec.lead, nullptr};
  ProtectionPeriod period(one);
  const int life = spec.life;
  const int lead = spec.lead;
  std::vector<std::int32_t> stock(static_cast<size_t>(life), 0);
  std::vector<std::int32_t> pipeline(static_cast<size_t>(lead), 0);
  std::vector<OrderInput> in(1);
  const auto rule = [&](double p) {
    return [&, p](std::span<const int> slots) {
      int k = 0;
      for (int a = 0; a + 1 < life; ++a)
        stock[static_cast<size_t>(a)] = slots[static_cast<size_t>(k++)];
      const int discounted = spec.discount_tier ? slots[static_cast<size_t>(k++)] : 0;
      for (int d = 0; d + 1 < lead; ++d)
        pipeline[static_cast<size_t>(d)] = slots[static_cast<size_t>(k++)];
      OrderInput& x = in[0];
      x = OrderInput{};
      x.forecast = forecast;
      x.stock_by_age = stock;
      x.pipeline = pipeline;
      x.discounted = discounted;
      int usable = 0;
      for (int a = lead - 1; a < life; ++a) usable += stock[static_cast<size_t>(a)];
      x.usable_stock = life == 1 ? 0 : usable;
      for (int d = 0; d + 1 < lead; ++d) {
        if (d >= lead - life) x.on_order += pipeline[static_cast<size_t>(d)];
      }
      period.prepare(ctx, in, 1);
      return period.quantile_order(0, family, p, extra);
    };
  };
  double best_p = 0.5;
  double best = -1e300;
  const auto consider = [&](double p) {
    const double g = chain.evaluate(rule(p), 1e-6);
    if (g > best + 1e-9) {
      best = g;
      best_p = p;
    }
  };
  for (int k = 1; k < 20; ++k) consider(0.05 * k);
  consider(0.975);
  consider(0.99);
  const double centre = best_p;
  for (int k = -4; k <= 4; ++k) {
    const double p = centre + 0.01 * k;
    if (k != 0 && p > 0.0 && p < 1.0) consider(p);
  }
  return best_p;
}

double approximate_recovery(const Scenario& sc, const Item& item, double penalty) {
  const double p = item.price;
  const double c = item.unit_cost;
  if (item.next_day) {
    const double fallback =
        item.next_day->fallback == Leftovers::salvage ? item.salvage_value : 0.0;
    const double q = item.next_day->price;
    const double take = sc.discount_take_rate;
    // Fixed point of ratio = (p - c + g) / (p - s + g), s = take * (q - p * ratio) + (1 - take)
    // * fallback.
    double ratio = 0.5;
    double s = 0.0;
    for (int k = 0; k < 50; ++k) {
      s = take * (q - p * ratio) + (1.0 - take) * fallback;
      const double den = p - s + penalty;
      ratio = den > 0.0 ? std::clamp((p - c + penalty) / den, 0.0, 1.0) : 1.0;
    }
    return s;
  }
  double s = item.leftovers == Leftovers::salvage ? item.salvage_value : 0.0;
  if (item.shelf_life_days > 1) {
    s = std::max(s, sc.fifo_share * c * (1.0 - 1.0 / item.shelf_life_days));
  }
  return s;
}

}  // namespace larder
