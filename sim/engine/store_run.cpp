#include "sim/engine/store_run.hpp"

#include <algorithm>
#include <cmath>

#include "sim/engine/demand_shocks.hpp"
#include "sim/random/stream.hpp"
#include "sim/stats/binomial.hpp"
#include "sim/stats/normal.hpp"

namespace larder {

/// The state of one policy at this store.
struct StoreRun::Lane {
  Lane(const Policy& p, const StoreView& view, std::span<const int> life, int items, int lead)
      : forecaster(p.forecast->make(view)),
        censoring(p.censoring->make(view)),
        rule(p.quantity->make(view)),
        shelf(life),
        pipeline(static_cast<size_t>(items * lead), 0),
        pipeline_view(static_cast<size_t>(items * lead), 0),
        observed(static_cast<size_t>(items)),
        tally(static_cast<size_t>(items)),
        goodwill(static_cast<size_t>(items), 1.0),
        demand(static_cast<size_t>(items), 0),
        predicted(static_cast<size_t>(items)),
        forecast(static_cast<size_t>(items)),
        day_forecast(static_cast<size_t>(items)),
        estimates(static_cast<size_t>(items)),
        inputs(static_cast<size_t>(items)),
        orders(static_cast<size_t>(items)) {
    for (const auto& a : p.adjustments) adjusters.push_back(a->make(view));
  }

  std::unique_ptr<Forecaster> forecaster;
  std::unique_ptr<CensoringState> censoring;
  std::unique_ptr<OrderRule> rule;
  std::vector<std::unique_ptr<Adjuster>> adjusters;
  Shelf shelf;
  std::vector<std::int32_t> pipeline;       ///< [item * lead + arrival_day % lead]
  std::vector<std::int32_t> pipeline_view;  ///< [item * lead + d]: arrives order_day + 1 + d
  std::vector<Observation> observed;        ///< today's observations
  std::vector<Tally> tally;                 ///< scored-day counts
  std::vector<double> goodwill;             ///< per item, 1 = no erosion (model.md, goodwill)
  std::vector<int> demand;  ///< per item, when goodwill makes demand policy-specific
  // Scratch buffers, reused every day.
  std::vector<DemandForecast> predicted;
  std::vector<DemandForecast> forecast;
  std::vector<DemandForecast> day_forecast;
  std::vector<double> estimates;
  std::vector<OrderInput> inputs;
  std::vector<int> orders;
};

StoreRun::StoreRun(const SimSetup& setup, int replication, int store)
    : setup_(setup),
      view_{setup.scenario, setup.demand, store},
      replication_(replication),
      store_(store),
      items_(static_cast<int>(setup.scenario.items.size())),
      lead_time_(setup.scenario.logistics.lead_time_days) {
  const Scenario& sc = setup.scenario;
  const double fifo = sc.fifo_share;
  for (int i = 0; i < items_; ++i) {
    const Item& item = sc.items[static_cast<size_t>(i)];
    shelf_life_.push_back(item.shelf_life_days);
    const auto key = [&](Purpose p) {
      return StreamKey{setup.seed, static_cast<std::uint32_t>(replication),
                       static_cast<std::uint32_t>(store), static_cast<std::uint32_t>(i), p};
    };
    demand_streams_.push_back(make_stream(key(Purpose::demand)));
    runtime_.push_back({item.shelf_life_days, item.leftovers, -1});
    // A picking split is random only when units of different ages can be on the shelf and
    // shoppers are mixed; otherwise it is deterministic and draws nothing.
    if (item.shelf_life_days > 1 && fifo > 0.0 && fifo < 1.0) {
      runtime_.back().picking = static_cast<int>(picking_streams_.size());
      picking_streams_.push_back(make_stream(key(Purpose::picking)));
    }
  }
  const int days = sc.horizon.days;
  for (int t = 0; t < days; ++t) {
    open_.push_back(sc.is_open(store, t) ? 1 : 0);
    const bool weekday_ok = sc.logistics.delivery_weekdays[static_cast<size_t>(sc.weekday_of(t))];
    delivery_.push_back(open_.back() != 0 && weekday_ok ? 1 : 0);
  }
  next_delivery_.assign(static_cast<size_t>(days), days);
  for (int t = days - 2; t >= 0; --t) {
    const size_t k = static_cast<size_t>(t);
    next_delivery_[k] = delivery_[k + 1] != 0 ? t + 1 : next_delivery_[k + 1];
  }
  // Demand dynamics: every day takes the general path when any is on.
  const DemandShocks& shocks = sc.shocks;
  goodwill_ = sc.goodwill.sensitivity > 0.0;
  dynamic_ = shocks.any() || goodwill_;
  demand_u_.assign(static_cast<size_t>(items_), 0.0);
  mean_.assign(static_cast<size_t>(items_), 0.0);
  if (shocks.store_traffic_cv > 0.0) {
    traffic_sigma_ = lognormal_sigma(shocks.store_traffic_cv);
    traffic_stream_ = make_stream({setup.seed, static_cast<std::uint32_t>(replication),
                                   static_cast<std::uint32_t>(store), kNoItem, Purpose::traffic});
  }
  if (shocks.persistence_lag > 0 && shocks.persistence_cv > 0.0) {
    persistence_sigma_ = lognormal_sigma(shocks.persistence_cv);
    for (int i = 0; i < items_; ++i) {
      persistence_streams_.push_back(make_stream(
          {setup.seed, static_cast<std::uint32_t>(replication), static_cast<std::uint32_t>(store),
           static_cast<std::uint32_t>(i), Purpose::persistence}));
    }
    persistence_log_.assign(static_cast<size_t>(items_ * shocks.persistence_lag), 0.0);
  }
  demand_.assign(static_cast<size_t>(items_), 0);
  picking_u_.assign(static_cast<size_t>(items_), 0.0);
  for (const Policy& p : setup.policies) {
    lanes_.push_back(std::make_unique<Lane>(p, view_, shelf_life_, items_, lead_time_));
  }
}

StoreRun::~StoreRun() = default;

std::span<const Tally> StoreRun::tallies(int policy) const {
  return lanes_[static_cast<size_t>(policy)]->tally;
}

std::size_t StoreRun::bytes_per_item_and_policy() const {
  int life = 0;
  for (int l : shelf_life_) life = std::max(life, l);
  std::size_t b = sizeof(std::int32_t) * static_cast<size_t>(life + lead_time_) +
                  sizeof(Observation) + sizeof(Tally) + sizeof(DemandForecast) * 2 +
                  sizeof(double) + sizeof(OrderInput) + sizeof(int);
  if (!lanes_.empty()) b += lanes_.front()->forecaster->bytes_per_item();
  return b;
}

void StoreRun::run_days(int begin, int end) {
  if (begin == 0) {
    // The store opens with the policy's own orders for the first lead-time days, placed on
    // the days before the horizon (no sales history yet, so forecasts use their prior).
    for (auto& lane : lanes_) {
      for (int d = -lead_time_; d < 0; ++d) place_orders(*lane, d);
    }
  }
  for (int t = begin; t < end; ++t) run_day(t);
}

void StoreRun::run_day(int day) {
  const Scenario& sc = setup_.scenario;
  const bool open = open_[static_cast<size_t>(day)] != 0;
  const bool scored = day >= sc.horizon.warmup_days;
  // One draw per store-item-day and purpose, open or not, so day t's draws never depend on
  // what happened before.
  const InversionTable* plain = dynamic_ ? nullptr : setup_.demand.plain_tables(store_, day);
  if (plain != nullptr) {
    for (size_t i = 0; i < demand_.size(); ++i)
      demand_[i] = plain[i](to_unit(demand_streams_[i]()));
  } else {
    draw_dynamic_demand(day, open);
  }
  for (size_t i = 0; i < runtime_.size(); ++i) {
    const int k = runtime_[i].picking;
    if (k >= 0) picking_u_[i] = to_unit(picking_streams_[static_cast<size_t>(k)]());
  }
  for (auto& lane : lanes_) run_lane(*lane, day, open, scored);
}

void StoreRun::draw_dynamic_demand(int day, bool open) {
  const DemandShocks& shocks = setup_.scenario.shocks;
  double traffic = 1.0;
  if (traffic_sigma_ > 0.0) {
    const double z = normal_quantile(to_unit(traffic_stream_()));
    traffic = mean_one_multiplier(traffic_sigma_ * z, traffic_sigma_);
  }
  const int lag = shocks.persistence_lag;
  for (int i = 0; i < items_; ++i) {
    const size_t ii = static_cast<size_t>(i);
    const double u = to_unit(demand_streams_[ii]());
    double persistence = 1.0;
    if (persistence_sigma_ > 0.0) {
      const double z = normal_quantile(to_unit(persistence_streams_[ii]()));
      double& x = persistence_log_[ii * static_cast<size_t>(lag) + static_cast<size_t>(day % lag)];
      x = log_ar1_step(x, z, shocks.persistence_coefficient, persistence_sigma_, day < lag);
      persistence = mean_one_multiplier(x, persistence_sigma_);
    }
    demand_u_[ii] = u;
    mean_[ii] = open ? setup_.demand.mean(store_, i, day) * traffic * persistence : 0.0;
    if (!goodwill_) {
      demand_[ii] = mean_[ii] > 0.0 ? setup_.demand.law_with_mean(i, mean_[ii]).quantile(u) : 0;
    }
  }
}

void StoreRun::run_lane(Lane& lane, int day, bool open, bool scored) {
  const size_t slot = static_cast<size_t>(day % lead_time_);
  const size_t lead = static_cast<size_t>(lead_time_);
  const double fifo = setup_.scenario.fifo_share;
  const int* demands = demand_.data();
  if (goodwill_) {
    // The same uniform as every other policy, the mean scaled by this policy's goodwill: the
    // count moves monotonically with goodwill, never with noise (common random numbers).
    for (int i = 0; i < items_; ++i) {
      const size_t ii = static_cast<size_t>(i);
      const double m = mean_[ii] * lane.goodwill[ii];
      lane.demand[ii] = m > 0.0 ? setup_.demand.law_with_mean(i, m).quantile(demand_u_[ii]) : 0;
    }
    demands = lane.demand.data();
  }
  for (size_t i = 0; i < demand_.size(); ++i) {
    const int item = static_cast<int>(i);
    const ItemRuntime& rt = runtime_[i];
    Observation o;
    o.open = open;
    // 1. Morning delivery.
    std::int32_t& due = lane.pipeline[i * lead + slot];
    o.delivered = due;
    due = 0;
    // 2-3. Demand (0 on closed days) and service.
    const int demand = demands[i];
    int stock = 0;
    int leaving = 0;
    if (rt.life == 1) {
      // Nothing survives a night: today's stock is today's delivery and all of it leaves.
      stock = o.delivered;
      o.sold = std::min(demand, stock);
      leaving = stock - o.sold;
    } else {
      lane.shelf.receive(item, o.delivered);
      stock = lane.shelf.total(item);
      o.sold = std::min(demand, stock);
      const int oldest = rt.picking >= 0 ? binomial_inverse(picking_u_[i], o.sold, fifo)
                                         : (fifo >= 1.0 ? o.sold : 0);
      lane.shelf.take(item, o.sold, oldest);
      leaving = lane.shelf.expire(item);  // 5. End of life.
      lane.shelf.age(item);
    }
    // 4. Close.
    o.leftover = stock - o.sold;
    o.sold_out = open && o.leftover == 0;
    switch (rt.leftovers) {
      case Leftovers::salvage:
        o.salvaged = leaving;
        break;
      case Leftovers::donate:
        o.donated = leaving;
        break;
      default:
        o.wasted = leaving;
        break;
    }
    lane.observed[i] = o;
    if (goodwill_) {
      // Erosion by the share of customers who met a stockout, then recovery toward 1 with
      // the half-life (model.md, Demand).
      const Goodwill& g = setup_.scenario.goodwill;
      double& gw = lane.goodwill[i];
      if (demand > 0) gw *= 1.0 - g.sensitivity * (demand - o.sold) / static_cast<double>(demand);
      gw = 1.0 - (1.0 - gw) * std::exp2(-1.0 / g.half_life_days);
    }
    if (scored) {
      Tally& t = lane.tally[i];
      t.demand += demand;
      t.sold += o.sold;
      t.lost += demand - o.sold;
      t.wasted += o.wasted;
      t.salvaged += o.salvaged;
      t.donated += o.donated;
      t.delivered += o.delivered;
      t.open_days += open;
      t.in_stock_days += o.leftover > 0 && open;
      t.no_stockout_days += demand <= stock && open;
      t.served_by_item += o.sold;
    }
  }
  learn(lane, day, open);
  place_orders(lane, day);
}

void StoreRun::forecast_window(Lane& lane, int arrival) {
  // A delivery serves its arrival day until the next delivery arrives or its units expire,
  // whichever comes first; its forecast is the demand summed over the open days in between.
  const int next = next_delivery_[static_cast<size_t>(arrival)];
  int last = arrival + 1;
  for (int life : shelf_life_) last = std::max(last, std::min(next, arrival + life));
  if (last == arrival + 1) {  // one day for every item: the usual daily delivery
    lane.forecaster->predict(arrival, lane.forecast);
    lane.censoring->refine(arrival, lane.forecast);
    for (auto& in : lane.inputs) in.cover_days = 1;
    return;
  }
  for (auto& f : lane.forecast) f = {};
  for (int d = arrival; d < last; ++d) {
    if (open_[static_cast<size_t>(d)] == 0) continue;
    lane.forecaster->predict(d, lane.day_forecast);
    lane.censoring->refine(d, lane.day_forecast);
    for (size_t i = 0; i < lane.forecast.size(); ++i) {
      if (d >= std::min(next, arrival + shelf_life_[i])) continue;
      lane.forecast[i].mean += lane.day_forecast[i].mean;
      lane.forecast[i].variance += lane.day_forecast[i].variance;
    }
  }
  for (size_t i = 0; i < lane.inputs.size(); ++i) {
    lane.inputs[i].cover_days = std::min(next, arrival + shelf_life_[i]) - arrival;
  }
}

void StoreRun::learn(Lane& lane, int day, bool open) {
  if (open) {
    if (lane.censoring->needs_forecast()) lane.forecaster->predict(day, lane.predicted);
    lane.censoring->treat(day, lane.observed, lane.predicted, lane.estimates);
    lane.forecaster->observe(day, lane.estimates);
  }
  lane.rule->observe(day, lane.observed);
  for (auto& a : lane.adjusters) a->observe(day, lane.observed);
}

void StoreRun::place_orders(Lane& lane, int day) {
  const Scenario& sc = setup_.scenario;
  const int arrival = day + lead_time_;
  if (arrival >= sc.horizon.days) return;
  // Orders arrive only on delivery days: open and a delivery weekday.
  if (delivery_[static_cast<size_t>(arrival)] == 0) return;
  forecast_window(lane, arrival);
  const int lead = lead_time_;
  const size_t ulead = static_cast<size_t>(lead);
  for (int i = 0; i < items_; ++i) {
    const size_t ii = static_cast<size_t>(i);
    OrderInput& in = lane.inputs[ii];
    in.forecast = lane.forecast[ii];
    // Units that will still be sellable on the arrival day, and units already on their way,
    // in arrival order.
    in.usable_stock = runtime_[ii].life == 1 ? 0 : lane.shelf.at_least(i, lead - 1);
    std::int32_t* view = &lane.pipeline_view[ii * ulead];
    int on_order = 0;
    for (int d = 0; d < lead; ++d) {
      const int slot = ((day + 1 + d) % lead + lead) % lead;
      view[d] = lane.pipeline[ii * ulead + static_cast<size_t>(slot)];
      // Count only units still sellable on the arrival day: a unit arriving d + 1 days from
      // now lives until d + life, so it reaches the arrival day when d >= lead - life.
      if (d >= lead - runtime_[ii].life) on_order += view[d];
    }
    in.on_order = on_order;
    in.pipeline = {view, ulead};
    in.stock_by_age = lane.shelf.by_age(i);
    in.sold_today = lane.observed[ii].sold;
  }
  const OrderContext ctx{view_, day, arrival, lane.forecaster.get()};
  lane.rule->decide(ctx, lane.inputs, lane.orders);
  for (auto& a : lane.adjusters) a->adjust(ctx, lane.inputs, lane.observed, lane.orders);
  const size_t slot = static_cast<size_t>(arrival % lead);
  for (int i = 0; i < items_; ++i) {
    const size_t ii = static_cast<size_t>(i);
    const int pack = sc.items[ii].pack_size;
    int q = std::max(lane.orders[ii], 0);
    if (pack > 1) q = (q + pack - 1) / pack * pack;  // round up to whole packs
    if (const auto& cap = sc.items[ii].shelf_capacity) {
      // Capped by the shelf: on hand and on order plus this order fit, in whole packs.
      const OrderInput& in = lane.inputs[ii];
      const int room = std::max(*cap - in.usable_stock - in.on_order, 0);
      if (q > room) q = room / pack * pack;
    }
    lane.pipeline[ii * ulead + slot] = q;
  }
}

}  // namespace larder
