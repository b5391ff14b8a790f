#include "sim/engine/store_run.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "sim/engine/customer_split.hpp"
#include "sim/engine/demand_shocks.hpp"
#include "sim/engine/price_tiers.hpp"
#include "sim/random/stream.hpp"
#include "sim/scenario/intraday_profile.hpp"
#include "sim/stats/binomial.hpp"
#include "sim/stats/normal.hpp"

namespace larder {

namespace {
/// Heap bytes a vector holds.
template <class T>
std::size_t held(const std::vector<T>& v) {
  return v.capacity() * sizeof(T);
}
std::size_t held(const SplitPlan& plan) {
  return held(plan.p) + held(plan.log_q);
}
template <class T>
std::size_t held_each(const std::vector<T>& plans) {
  std::size_t b = held(plans);
  for (const T& x : plans) b += held(x);
  return b;
}

/// The stock of one item during a detailed day, by price tier.
struct Pools {
  int full = 0;      ///< full-price units on the shelf
  int pending = 0;   ///< full-price units sold but not yet taken from the shelf by age
  int markdown = 0;  ///< last-day units marked down
  int next_day = 0;  ///< yesterday's leftovers on their discounted extra day
  int sold_markdown = 0;
  int sold_next_day = 0;
  int primary = 0;     ///< primary customers served by the item
  int substitute = 0;  ///< units sold to substitute customers
  int bargain = 0;     ///< units sold to bargain-only customers
  int lost = 0;        ///< primary customers who left without buying
  int own_start = 0;   ///< this bucket: own units (full price and marked down) at its start
  int unserved = 0;    ///< this bucket: primary customers who found the item out
  int arrivals = 0;    ///< this bucket: customers of any kind
  float sellout = std::numeric_limits<float>::quiet_NaN();

  int discounted() const { return markdown + next_day; }
  int own() const { return full + markdown; }
  /// Takes `n` discounted units, next-day units first (the oldest, and the cheapest).
  void take_discounted(int n) {
    const int a = std::min(n, next_day);
    next_day -= a;
    sold_next_day += a;
    markdown -= n - a;
    sold_markdown += n - a;
  }
  /// Serves `prefer_discounted` and `prefer_full` customers; returns the units sold.
  int serve(int prefer_discounted, int prefer_full) {
    const TierTake t = take_tiers(prefer_discounted, prefer_full, full, discounted());
    full -= t.full;
    pending += t.full;
    take_discounted(t.discounted);
    return t.full + t.discounted;
  }
};

void dispose(Observation& o, int units, Leftovers how) {
  switch (how) {
    case Leftovers::salvage:
      o.salvaged += units;
      break;
    case Leftovers::donate:
      o.donated += units;
      break;
    default:
      o.wasted += units;
      break;
  }
}

/// How one policy handles an item's leftovers, as the day loop needs it.
struct LaneItem {
  Leftovers leftovers = Leftovers::discard;
  int markdown_bucket = -1;   ///< bucket from which last-day units are marked down, or -1
  bool surplus_only = false;  ///< mark down only the units expected to be left at close
  double rest_share = 0.0;    ///< share of the day's customers from the markdown bucket on
  double bargain_rate = 0.0;  ///< bargain-only customers per unit of the day's mean demand
};

/// The expected units of `last` last-day units that full-price customers still buy after the
/// markdown hour, when `rest` customers are expected until close and `fresher` units with more
/// days to live are beside them: a share `fifo` of the sales comes from the oldest end, the rest
/// from the freshest end (model.md, step 3), so last-day units also sell once the fresher ones
/// are gone.
int expected_last_day_sales(int last, int fresher, double rest, double fifo) {
  const double r = std::min(rest, static_cast<double>(last + fresher));
  const double from_last = fifo * r + (1.0 - fifo) * std::max(r - fresher, 0.0);
  return std::min(last, static_cast<int>(std::lround(from_last)));
}

}  // namespace

/// The state of one policy at this store.
struct StoreRun::Lane {
  Lane(const Policy& p, const StoreView& v, std::span<const int> life, int items, int lead,
       bool observes_intraday)
      : view(v),
        observe_intraday(observes_intraday),
        forecaster(p.forecast->make(view)),
        censoring(p.censoring->make(view)),
        rule(p.quantity->make(view)),
        shelf(life),
        pipeline(static_cast<size_t>(items * lead), 0),
        pipeline_view(static_cast<size_t>(items * lead), 0),
        observed(static_cast<size_t>(items)),
        tally(static_cast<size_t>(items)),
        closes(p.quantity->network() != nullptr ? static_cast<size_t>(items) : 0),
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

  StoreView view;         ///< the scenario as this policy sees it (its own leftover handling)
  bool observe_intraday;  ///< the policy sees sell-out times
  std::unique_ptr<Forecaster> forecaster;
  std::unique_ptr<CensoringState> censoring;
  std::unique_ptr<OrderRule> rule;
  std::vector<std::unique_ptr<Adjuster>> adjusters;
  Shelf shelf;
  std::vector<std::int32_t> pipeline;       ///< [item * lead + arrival_day % lead]
  std::vector<std::int32_t> pipeline_view;  ///< [item * lead + d]: arrives order_day + 1 + d
  std::vector<Observation> observed;        ///< today's observations
  std::vector<Tally> tally;                 ///< scored-day counts
  std::vector<CloseCount> closes;           ///< every day's, for network plans only
  std::vector<double> goodwill;             ///< per item, 1 = no erosion (model.md, goodwill)
  std::vector<int> demand;  ///< per item, when goodwill makes demand policy-specific
  // Detailed path only.
  std::vector<std::int32_t> next_day;     ///< per item: units on their discounted extra day
  std::vector<std::int64_t> substituted;  ///< per substitution pair: scored units sold
  std::vector<int> acceptors;             ///< [item * buckets + h] when goodwill is on
  std::vector<int> others;
  std::vector<Pools> pools;                ///< per item, today's stock by tier
  std::vector<std::int32_t> sold_by_hour;  ///< [item * buckets + h]: sales up to the end of h
  std::vector<LaneItem> handling;          ///< per item: this policy's leftover handling
  std::vector<SplitPlan> bargain_plans;    ///< per item: bargain-only customers over the buckets
  std::vector<int> bargain;                ///< [item * buckets + h]: today's bargain customers
  std::vector<DemandForecast> today;       ///< today's forecast, for a surplus-only markdown
  bool surplus_markdown = false;           ///< some item is marked down surplus-only
  // Scratch buffers, reused every day.
  std::vector<DemandForecast> predicted;
  std::vector<DemandForecast> forecast;
  std::vector<DemandForecast> day_forecast;
  std::vector<double> estimates;
  std::vector<OrderInput> inputs;
  std::vector<int> orders;

  /// Heap bytes of the lane's own buffers (not its policy parts').
  std::size_t bytes() const {
    return sizeof(Lane) + shelf.bytes() + held(pipeline) + held(pipeline_view) + held(observed) +
           held(tally) + held(closes) + held(goodwill) + held(demand) + held(next_day) +
           held(substituted) + held(acceptors) + held(others) + held(pools) + held(sold_by_hour) +
           held(handling) + held_each(bargain_plans) + held(bargain) + held(today) +
           held(predicted) + held(forecast) + held(day_forecast) + held(estimates) + held(inputs) +
           held(orders);
  }
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
    runtime_.push_back({item.shelf_life_days, -1});
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
  picking_u_.assign(static_cast<size_t>(items_) * 2, 0.0);
  setup_detail();
  for (size_t k = 0; k < setup.policies.size(); ++k) {
    const bool observe = k < sc.policies.size() && sc.policies[k].observe_intraday;
    const Scenario& seen = setup.policies[k].seen(sc);
    const StoreView lane_view{seen, setup.demand, store};
    lanes_.push_back(std::make_unique<Lane>(setup.policies[k], lane_view, shelf_life_, items_,
                                            lead_time_, observe && hourly_));
    Lane& lane = *lanes_.back();
    lane.handling.resize(static_cast<size_t>(items_));
    for (size_t i = 0; i < lane.handling.size(); ++i)
      lane.handling[i].leftovers = seen.items[i].leftovers;
    if (!detailed_) continue;
    setup_lane_detail(lane, seen.items);
    lane.next_day.assign(static_cast<size_t>(items_), 0);
    lane.pools.assign(static_cast<size_t>(items_), Pools{});
    lane.substituted.assign(pair_to_.size(), 0);
    if (hourly_) lane.sold_by_hour.assign(static_cast<size_t>(items_ * buckets_), 0);
    if (goodwill_) {
      lane.acceptors.assign(static_cast<size_t>(items_ * buckets_), 0);
      lane.others.assign(static_cast<size_t>(items_ * buckets_), 0);
    }
  }
}

namespace {
/// Bargain-only customers of an item by bucket, as a share of its day's customers: the next-day
/// tier's all day, the markdown's uplift in the markdown hours (-1: no markdown).
std::vector<double> bargain_weights(const Item& it, std::span<const double> shares,
                                    int markdown_bucket) {
  std::vector<double> w(shares.size(), 0.0);
  for (size_t h = 0; h < shares.size(); ++h) {
    double x = it.next_day ? it.next_day->bargain_demand : 0.0;
    if (markdown_bucket >= 0 && static_cast<int>(h) >= markdown_bucket) x += it.markdown->uplift;
    w[h] = shares[h] * x;
  }
  return w;
}
}  // namespace

void StoreRun::setup_detail() {
  const Scenario& sc = setup_.scenario;
  // Every policy's view of the items (they differ only in leftover handling).
  std::vector<const std::vector<Item>*> views;
  for (const Policy& p : setup_.policies) views.push_back(&p.seen(sc).items);
  if (views.empty()) views.push_back(&sc.items);
  bool needs_hours = setup_.detail == DayDetail::hourly;
  bool needs_tiers = setup_.detail == DayDetail::one_bucket;
  for (const std::vector<Item>* v : views) {
    for (const Item& it : *v) {
      needs_hours = needs_hours || !it.substitutes.empty() || it.markdown.has_value() ||
                    (it.next_day && it.next_day->bargain_demand > 0.0);
      needs_tiers = needs_tiers || it.next_day.has_value();
    }
  }
  for (const PolicySpec& p : sc.policies) needs_hours = needs_hours || p.observe_intraday;
  hourly_ = needs_hours;
  detailed_ = needs_hours || needs_tiers;
  if (!detailed_) return;
  const int h_count = hourly_ ? sc.hours() : 1;
  buckets_ = h_count;
  const size_t hb = static_cast<size_t>(h_count);
  for (int i = 0; i < items_; ++i) {
    const size_t ii = static_cast<size_t>(i);
    const Item& it = sc.items[ii];
    ItemRuntime& rt = runtime_[ii];
    std::vector<double> shares =
        hourly_ ? intraday_shares(it, sc.calendar) : std::vector<double>{1.0};
    hour_plans_.push_back(plan_split(shares, true));
    // The union of the policies' needs, so that every policy meets the same customers.
    for (const std::vector<Item>* v : views) {
      const Item& seen = (*v)[ii];
      rt.tiers = rt.tiers || seen.next_day.has_value() || seen.markdown.has_value();
      const int mb =
          seen.markdown && hourly_ ? seen.markdown->from_hour - sc.calendar.open_hour : -1;
      rt.two_picks = rt.two_picks || mb >= 0;
      double rate = 0.0;
      for (double w : bargain_weights(seen, shares, mb)) rate += w;
      rt.bargain = rt.bargain || rate > 0.0;
    }
    // Daily intraday uniforms: [split of acceptors] [split of the others] [bargain count]
    // [split of bargain customers]. The acceptor count has its own stream, so that it is the
    // same draw whatever the number of buckets.
    rt.intraday_u = static_cast<int>(intraday_u_.size());
    rt.intraday_n = (rt.tiers ? 2 : 1) * (h_count - 1) + (rt.bargain ? h_count : 0);
    intraday_u_.resize(intraday_u_.size() + static_cast<size_t>(rt.intraday_n), 0.0);
    const auto key = [&](Purpose p) {
      return StreamKey{setup_.seed, static_cast<std::uint32_t>(replication_),
                       static_cast<std::uint32_t>(store_), static_cast<std::uint32_t>(i), p};
    };
    intraday_streams_.push_back(make_stream(key(Purpose::intraday)));
    if (rt.tiers) {
      rt.choice = static_cast<int>(choice_streams_.size());
      choice_streams_.push_back(make_stream(key(Purpose::tier_choice)));
    }
    substitution_streams_.push_back(make_stream(key(Purpose::substitution)));
    rt.pairs_begin = static_cast<int>(pair_to_.size());
    std::vector<double> sub_shares;
    for (const Substitute& sub : it.substitutes) {
      pair_to_.push_back(sub.item);
      sub_shares.push_back(sub.share);
    }
    rt.pairs_end = static_cast<int>(pair_to_.size());
    substitute_plans_.push_back(plan_split(sub_shares, false));
    substitute_split_.resize(std::max(substitute_split_.size(), sub_shares.size()));
  }
  substitution_u_.assign(pair_to_.size() * hb, 0.0);
  choice_u_.assign(choice_streams_.size(), 0.0);
  acceptors_.assign(static_cast<size_t>(items_) * hb, 0);
  others_.assign(static_cast<size_t>(items_) * hb, 0);
  bargain_mean_.assign(static_cast<size_t>(items_), 0.0);
}

void StoreRun::setup_lane_detail(Lane& lane, std::span<const Item> items) {
  const Scenario& sc = setup_.scenario;
  const size_t hb = static_cast<size_t>(buckets_);
  for (size_t i = 0; i < items.size(); ++i) {
    const Item& it = items[i];
    LaneItem& li = lane.handling[i];
    const std::vector<double> shares =
        hourly_ ? intraday_shares(sc.items[i], sc.calendar) : std::vector<double>{1.0};
    if (it.markdown && hourly_) {
      li.markdown_bucket = it.markdown->from_hour - sc.calendar.open_hour;
      li.surplus_only = it.markdown->surplus_only;
      for (size_t h = static_cast<size_t>(li.markdown_bucket); h < shares.size(); ++h)
        li.rest_share += shares[h];
      lane.surplus_markdown = lane.surplus_markdown || li.surplus_only;
    }
    // Bargain-only customers arrive like the item's customers, in the hours a discount is shown.
    std::vector<double> bargain = bargain_weights(it, shares, li.markdown_bucket);
    for (double b : bargain) li.bargain_rate += b;
    const double n_buckets = static_cast<double>(hb);
    for (double& b : bargain) b = li.bargain_rate > 0.0 ? b / li.bargain_rate : 1.0 / n_buckets;
    lane.bargain_plans.push_back(plan_split(bargain, true));
  }
  lane.bargain.assign(items.size() * hb, 0);
  if (lane.surplus_markdown) lane.today.assign(items.size(), DemandForecast{});
}

StoreRun::~StoreRun() = default;

std::span<const Tally> StoreRun::tallies(int policy) const {
  return lanes_[static_cast<size_t>(policy)]->tally;
}

std::span<const CloseCount> StoreRun::close_counts(int policy) const {
  return lanes_[static_cast<size_t>(policy)]->closes;
}

std::span<const std::int64_t> StoreRun::substitutions(int policy) const {
  return lanes_[static_cast<size_t>(policy)]->substituted;
}

std::span<const Observation> StoreRun::observations(int policy) const {
  return lanes_[static_cast<size_t>(policy)]->observed;
}

void StoreRun::forecasts(int policy, std::span<const int> days,
                         std::span<DemandForecast> out) const {
  const Lane& lane = *lanes_[static_cast<size_t>(policy)];
  const size_t n = static_cast<size_t>(items_);
  for (size_t d = 0; d < days.size(); ++d) {
    const std::span<DemandForecast> day = out.subspan(d * n, n);
    lane.forecaster->predict(days[d], day);
    lane.censoring->refine(days[d], day);
  }
}

void StoreRun::set_levels(int policy, std::span<const double> level_per_item) {
  lanes_[static_cast<size_t>(policy)]->rule->set_levels(level_per_item);
}

int StoreRun::demand_today(int policy, int item) const {
  const size_t i = static_cast<size_t>(item);
  return goodwill_ ? lanes_[static_cast<size_t>(policy)]->demand[i] : demand_[i];
}

int StoreRun::units_on_hand(int policy, int item) const {
  const Lane& lane = *lanes_[static_cast<size_t>(policy)];
  const size_t i = static_cast<size_t>(item);
  return lane.shelf.total(item) + (lane.next_day.empty() ? 0 : lane.next_day[i]);
}

std::span<const std::int32_t> StoreRun::stock_by_age(int policy, int item) const {
  return lanes_[static_cast<size_t>(policy)]->shelf.by_age(item);
}

float StoreRun::sellout_hour(int policy, int item) const {
  const Lane& lane = *lanes_[static_cast<size_t>(policy)];
  const size_t i = static_cast<size_t>(item);
  if (!hourly_ || !lane.observed[i].sold_out) return std::numeric_limits<float>::quiet_NaN();
  return lane.pools[i].sellout;
}

void StoreRun::sales_by_hour(int policy, int item, std::span<int> out) const {
  if (!hourly_) return;
  const Lane& lane = *lanes_[static_cast<size_t>(policy)];
  const size_t hb = static_cast<size_t>(buckets_);
  const std::int32_t* cumulative = lane.sold_by_hour.data() + static_cast<size_t>(item) * hb;
  for (size_t h = 0; h < out.size() && h < hb; ++h) {
    out[h] = cumulative[h] - (h == 0 ? 0 : cumulative[h - 1]);
  }
}

std::size_t StoreRun::bytes_per_item_and_policy() const {
  // The mean over the policies, rounded up.
  const size_t items = static_cast<size_t>(std::max(items_, 1));
  std::size_t b = 0;
  for (const auto& lane : lanes_) b += lane->bytes() + items * lane->forecaster->bytes_per_item();
  const size_t per = items * std::max<size_t>(lanes_.size(), 1);
  return (b + per - 1) / per;
}

std::size_t StoreRun::bytes_shared() const {
  return sizeof(StoreRun) + held(shelf_life_) + held(open_) + held(delivery_) +
         held(next_delivery_) + held(demand_streams_) + held(picking_streams_) + held(runtime_) +
         held(demand_) + held(demand_u_) + held(mean_) + held(persistence_streams_) +
         held(persistence_log_) + held(picking_u_) + held_each(hour_plans_) +
         held_each(substitute_plans_) + held(substitute_split_) + held(pair_to_) +
         held(intraday_streams_) + held(substitution_streams_) + held(choice_streams_) +
         held(intraday_u_) + held(choice_u_) + held(substitution_u_) + held(acceptors_) +
         held(others_) + held(bargain_mean_) + held(lanes_);
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
    if (k < 0) continue;
    pcg32& g = picking_streams_[static_cast<size_t>(k)];
    picking_u_[2 * i] = to_unit(g());
    // A marked-down item splits its full-price sales before and after the markdown hour.
    if (runtime_[i].two_picks) picking_u_[2 * i + 1] = to_unit(g());
  }
  if (detailed_) draw_detail(day, open);
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
  if (detailed_) {
    run_lane_detailed(lane, day, open, scored, demands);
    learn(lane, day, open);
    place_orders(lane, day);
    return;
  }
  for (size_t i = 0; i < demand_.size(); ++i) {
    const int item = static_cast<int>(i);
    const ItemRuntime& rt = runtime_[i];
    const Leftovers how = lane.handling[i].leftovers;
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
      const int oldest = rt.picking >= 0 ? binomial_inverse(picking_u_[2 * i], o.sold, fifo)
                                         : (fifo >= 1.0 ? o.sold : 0);
      lane.shelf.take(item, o.sold, oldest);
      leaving = lane.shelf.expire(item);  // 5. End of life.
      lane.shelf.age(item);
    }
    // 4. Close.
    o.leftover = stock - o.sold;
    o.sold_out = open && o.leftover == 0;
    switch (how) {
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
      t.served_by_item += o.sold;
      t.lost += demand - o.sold;
      t.wasted += o.wasted;
      t.salvaged += o.salvaged;
      t.donated += o.donated;
      t.delivered += o.delivered;
      t.open_days += open;
      t.in_stock_days += o.leftover > 0 && open;
      t.no_stockout_days += demand <= stock && open;
    }
  }
  learn(lane, day, open);
  place_orders(lane, day);
}

void StoreRun::draw_detail(int day, bool open) {
  const size_t hb = static_cast<size_t>(buckets_);
  for (size_t i = 0; i < runtime_.size(); ++i) {
    const ItemRuntime& rt = runtime_[i];
    double* u = intraday_u_.data() + rt.intraday_u;
    for (int k = 0; k < rt.intraday_n; ++k) u[k] = to_unit(intraday_streams_[i]());
    if (rt.choice >= 0) {
      const size_t c = static_cast<size_t>(rt.choice);
      choice_u_[c] = to_unit(choice_streams_[c]());
    }
    double* us = substitution_u_.data() + static_cast<size_t>(rt.pairs_begin) * hb;
    const size_t n_us = static_cast<size_t>(rt.pairs_end - rt.pairs_begin) * hb;
    for (size_t k = 0; k < n_us; ++k) us[k] = to_unit(substitution_streams_[i]());
    if (!goodwill_)
      split_customers(static_cast<int>(i), demand_[i], &acceptors_[i * hb], &others_[i * hb]);
    if (rt.bargain) {
      // Bargain-only customers: Poisson with the day's mean (before goodwill) times each
      // policy's rate (draw_bargain), from the same uniforms.
      bargain_mean_[i] = !open      ? 0.0
                         : dynamic_ ? mean_[i]
                                    : setup_.demand.mean(store_, static_cast<int>(i), day);
    }
  }
}

void StoreRun::draw_bargain(Lane& lane) {
  const size_t hb = static_cast<size_t>(buckets_);
  for (size_t i = 0; i < runtime_.size(); ++i) {
    const double rate = lane.handling[i].bargain_rate;
    if (rate <= 0.0) continue;
    const ItemRuntime& rt = runtime_[i];
    const double* ub = intraday_u_.data() + rt.intraday_u + rt.intraday_n - buckets_;
    const double m = bargain_mean_[i];
    const int n = m > 0.0
                      ? CountLaw::make(DemandFamily::poisson, m * rate, std::nullopt, std::nullopt)
                            .quantile(ub[0])
                      : 0;
    split_count(n, lane.bargain_plans[i], {ub + 1, hb - 1}, {&lane.bargain[i * hb], hb});
  }
}

void StoreRun::split_customers(int item, int demand, int* acceptors, int* others) const {
  const ItemRuntime& rt = runtime_[static_cast<size_t>(item)];
  const size_t hb = static_cast<size_t>(buckets_);
  const SplitPlan& plan = hour_plans_[static_cast<size_t>(item)];
  const double* u = intraday_u_.data() + rt.intraday_u;
  if (!rt.tiers) {
    std::fill(acceptors, acceptors + hb, 0);
    split_count(demand, plan, {u, hb - 1}, {others, hb});
    return;
  }
  // Each customer would take a discounted unit with probability take_rate: split the day's
  // customers into acceptors and others, then each group over the hours.
  const int a = binomial_inverse(choice_u_[static_cast<size_t>(rt.choice)], demand,
                                 setup_.scenario.discount_take_rate);
  split_count(a, plan, {u, hb - 1}, {acceptors, hb});
  split_count(demand - a, plan, {u + (hb - 1), hb - 1}, {others, hb});
}

void StoreRun::run_lane_detailed(Lane& lane, int day, bool open, bool scored, const int* demands) {
  const Scenario& sc = setup_.scenario;
  const size_t hb = static_cast<size_t>(buckets_);
  const size_t n_items = static_cast<size_t>(items_);
  const size_t slot = static_cast<size_t>(day % lead_time_);
  const size_t lead = static_cast<size_t>(lead_time_);
  const double fifo = sc.fifo_share;
  const int* acceptors = acceptors_.data();
  const int* others = others_.data();
  if (goodwill_) {
    for (int i = 0; i < items_; ++i) {
      const size_t off = static_cast<size_t>(i) * hb;
      split_customers(i, demands[i], &lane.acceptors[off], &lane.others[off]);
    }
    acceptors = lane.acceptors.data();
    others = lane.others.data();
  }
  // Full-price sales are taken from the shelf by age in one Binomial split per period in which
  // the full-price units do not change (exact: the two ends only meet when the shelf runs out).
  const auto settle = [&](int item, Pools& p, int u_index) {
    const size_t ii = static_cast<size_t>(item);
    const int oldest =
        runtime_[ii].picking >= 0
            ? binomial_inverse(picking_u_[2 * ii + static_cast<size_t>(u_index)], p.pending, fifo)
            : (fifo >= 1.0 ? p.pending : 0);
    lane.shelf.take(item, p.pending, oldest);
    p.pending = 0;
  };
  std::vector<Pools>& pools = lane.pools;
  std::vector<Observation>& obs = lane.observed;
  draw_bargain(lane);
  if (lane.surplus_markdown && open) {
    // What the store expects of today (a surplus-only markdown sizes itself on it).
    lane.forecaster->predict(day, lane.today);
    lane.censoring->refine(day, lane.today);
  }
  // 1. Morning delivery.
  for (size_t i = 0; i < n_items; ++i) {
    Observation& o = obs[i];
    o = Observation{};
    o.open = open;
    std::int32_t& due = lane.pipeline[i * lead + slot];
    o.delivered = due;
    due = 0;
    lane.shelf.receive(static_cast<int>(i), o.delivered);
    pools[i] = Pools{};
    pools[i].full = lane.shelf.total(static_cast<int>(i));
    pools[i].next_day = lane.next_day[i];
  }
  // 2-3. Customers, bucket by bucket: primary customers, then substitute customers, then
  // bargain-only customers.
  for (size_t h = 0; h < hb; ++h) {
    for (size_t i = 0; i < n_items; ++i) {
      Pools& p = pools[i];
      const LaneItem& li = lane.handling[i];
      if (li.markdown_bucket == static_cast<int>(h)) {
        const int item = static_cast<int>(i);
        settle(item, p, 0);
        p.markdown = lane.shelf.expire(item);  // units on their last day
        if (li.surplus_only && p.markdown > 0) {
          // Only the units expected to be left at close: the forecast of the customers still
          // to come, by the intraday profile, against the stock by age.
          const double rest = open ? lane.today[i].mean * li.rest_share : 0.0;
          const int keep = expected_last_day_sales(p.markdown, lane.shelf.total(item), rest, fifo);
          lane.shelf.restore_last_day(item, keep);
          p.markdown -= keep;
        }
        p.full = lane.shelf.total(item);
      }
      p.own_start = p.own();
      if (h == 0 && p.own_start == 0) p.sellout = 0.0f;  // nothing to sell at opening
      const int a = acceptors[i * hb + h];
      const int b = others[i * hb + h];
      const int sold = p.serve(a, b);
      p.primary += sold;
      p.unserved = a + b - sold;
      p.arrivals = a + b;
    }
    for (size_t i = 0; i < n_items; ++i) {
      const ItemRuntime& rt = runtime_[i];
      Pools& p = pools[i];
      if (rt.pairs_begin == rt.pairs_end) {
        p.lost += p.unserved;
        continue;
      }
      const size_t n_pairs = static_cast<size_t>(rt.pairs_end - rt.pairs_begin);
      const double* u =
          substitution_u_.data() + static_cast<size_t>(rt.pairs_begin) * hb + h * n_pairs;
      const std::span<int> went{substitute_split_.data(), n_pairs};
      const int left = split_count(p.unserved, substitute_plans_[i], {u, n_pairs}, went);
      for (size_t j = 0; j < n_pairs; ++j) {
        const size_t k = static_cast<size_t>(rt.pairs_begin) + j;
        const int x = went[j];
        // Substitute customers take a full-price unit when there is one.
        Pools& to = pools[static_cast<size_t>(pair_to_[k])];
        const int served = to.serve(0, x);
        to.substitute += served;
        to.arrivals += x;
        p.lost += x - served;
        if (scored) lane.substituted[k] += served;
      }
      p.lost += left;
    }
    for (size_t i = 0; i < n_items; ++i) {
      if (lane.handling[i].bargain_rate <= 0.0) continue;
      Pools& p = pools[i];
      const int want = lane.bargain[i * hb + h];
      const int got = std::min(want, p.discounted());
      p.take_discounted(got);
      p.bargain += got;
      p.arrivals += want;
    }
    if (hourly_) {
      // The sell-out time: the k-th of n customers arriving at a constant rate within the hour
      // comes on average k / (n + 1) of the way through it. Recorded whether or not the policy
      // observes it (the store's history has it; the Observation only with observe: intraday).
      for (size_t i = 0; i < n_items; ++i) {
        Pools& p = pools[i];
        lane.sold_by_hour[i * hb + h] = p.primary + p.substitute + p.bargain;
        if (p.own() > 0 || !std::isnan(p.sellout)) continue;
        p.sellout = static_cast<float>(static_cast<double>(h) + p.own_start / (p.arrivals + 1.0));
      }
    }
  }
  // 4-5. Close and end of life.
  const Goodwill& g = sc.goodwill;
  for (size_t i = 0; i < n_items; ++i) {
    const int item = static_cast<int>(i);
    Pools& p = pools[i];
    Observation& o = obs[i];
    settle(item, p, lane.handling[i].markdown_bucket >= 0 ? 1 : 0);
    const int own_left = lane.shelf.total(item) + p.markdown;
    const int leaving = lane.shelf.expire(item) + p.markdown;
    lane.shelf.age(item);
    o.sold = p.primary + p.substitute + p.bargain;
    o.sold_discounted = p.sold_next_day + p.sold_markdown;
    o.leftover = own_left;
    o.sold_out = open && own_left == 0;
    if (o.sold_out && lane.observe_intraday) o.sellout_hour = p.sellout;
    const Item& it = lane.view.scenario.items[i];
    if (it.next_day) {
      dispose(o, p.next_day, it.next_day->fallback);  // the extra day is over
      lane.next_day[i] = leaving;
    } else {
      dispose(o, leaving, lane.handling[i].leftovers);
    }
    const int demand = demands[i];
    if (goodwill_) {
      double& gw = lane.goodwill[i];
      if (demand > 0)
        gw *= 1.0 - g.sensitivity * (demand - p.primary) / static_cast<double>(demand);
      gw = 1.0 - (1.0 - gw) * std::exp2(-1.0 / g.half_life_days);
    }
    if (scored) {
      Tally& t = lane.tally[i];
      t.demand += demand;
      t.served_by_item += p.primary;
      t.substitute += p.substitute;
      t.bargain += p.bargain;
      t.sold_next_day += p.sold_next_day;
      t.sold_markdown += p.sold_markdown;
      t.lost += p.lost;
      t.wasted += o.wasted;
      t.salvaged += o.salvaged;
      t.donated += o.donated;
      t.delivered += o.delivered;
      t.open_days += open;
      t.in_stock_days += own_left > 0 && open;
      t.no_stockout_days += p.primary == demand && open;
    }
  }
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
    for (size_t i = 0; i < lane.closes.size(); ++i) {
      lane.closes[i].open_days += 1;
      lane.closes[i].in_stock_days += lane.observed[i].leftover > 0 ? 1 : 0;
    }
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
    in.discounted = lane.next_day.empty() ? 0 : lane.next_day[ii];
  }
  const OrderContext ctx{lane.view, day, arrival, lane.forecaster.get()};
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
