#include "sim/drill/drill_game.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "sim/engine/store_run.hpp"
#include "sim/engine/tally.hpp"

namespace larder {

namespace {

Tally minus(const Tally& a, const Tally& b) {
  Tally d;
  d.demand = a.demand - b.demand;
  d.served_by_item = a.served_by_item - b.served_by_item;
  d.substitute = a.substitute - b.substitute;
  d.bargain = a.bargain - b.bargain;
  d.sold_next_day = a.sold_next_day - b.sold_next_day;
  d.sold_markdown = a.sold_markdown - b.sold_markdown;
  d.lost = a.lost - b.lost;
  d.wasted = a.wasted - b.wasted;
  d.salvaged = a.salvaged - b.salvaged;
  d.donated = a.donated - b.donated;
  d.delivered = a.delivered - b.delivered;
  d.open_days = a.open_days - b.open_days;
  d.in_stock_days = a.in_stock_days - b.in_stock_days;
  d.no_stockout_days = a.no_stockout_days - b.no_stockout_days;
  return d;
}

int pack_round(int units, int pack) {
  return pack > 1 ? (units + pack - 1) / pack * pack : units;
}

int units(std::span<const std::int32_t> slots) {
  int n = 0;
  for (const auto u : slots) n += u;
  return n;
}

}  // namespace

DrillGame::~DrillGame() = default;
DrillGame::DrillGame(DrillGame&&) noexcept = default;

DrillGame::DrillGame(const Scenario& original) {
  Diagnostics diag;
  if (!original.drill) {
    diag.error({original.file, 0, 0}, "the scenario has no drill: section",
               "add e.g. drill: { store: quay, items: [rye, croissant], days: 28 } (README, "
               "Training drills)");
    throw InputError(diag);
  }
  const DrillSpec& spec = *original.drill;
  const int warmup = original.horizon.warmup_days;
  auto sc = std::make_unique<Scenario>(original);
  sc->horizon.days = warmup + spec.days;
  sc->replications = 1;
  sc->stores.resize(static_cast<size_t>(spec.store) + 1);  // draws depend on the index only
  scenario_events_ = sc->calendar.events.size();
  const std::string store_id = sc->stores[static_cast<size_t>(spec.store)].id;
  for (const DrillEvent& e : spec.events) {
    sc->calendar.events.push_back({warmup + e.day - 1, e.demand, false, {store_id}});
  }
  std::vector<PolicySpec> specs;
  for (const int k : spec.compare) specs.push_back(original.policies[static_cast<size_t>(k)]);
  PolicySpec trainee = specs.front();  // the house rule's forecast runs, unused, beside it
  trainee.name = "trainee";
  trainee.adjustments.clear();
  trainee.observe_intraday = true;  // the trainee sees sell-out times
  specs.push_back(trainee);
  sc->policies = std::move(specs);
  sc->baseline = 0;
  for (size_t k = 0; k < sc->drill->compare.size(); ++k) {
    sc->drill->compare[k] = static_cast<int>(k);
  }
  scenario_ = std::move(sc);
  const Scenario& s = *scenario_;

  policies_ = build_policies(s, diag);
  if (!diag.ok()) throw InputError(diag);
  for (size_t k = 0; k + 1 < policies_.size(); ++k) {
    if (policies_[k].quantity->network() != nullptr) {
      diag.error(spec.where,
                 fmt::format("drill: policy '{}' plans its levels across every store "
                             "(network_in_stock), so it cannot run at the drill's one store",
                             policies_[k].name),
                 "list other policies in drill.compare");
    }
  }
  if (!diag.ok()) throw InputError(diag);

  const int lead = s.logistics.lead_time_days;
  const int days = s.horizon.days;
  const int items = static_cast<int>(s.items.size());
  demand_ = std::make_unique<DemandModel>(s);
  table_ = std::make_unique<OrderTable>(lead, days, items);
  policies_.back().quantity = order_table_method(*table_);
  policies_.back().adjustments.clear();
  turns_ = drill_turns(s);

  // The house rule's deliveries: its orders, after its adjustments, packs and capacity.
  house_delivered_.assign(static_cast<size_t>(days * items), 0);
  const SimSetup setup{s, *demand_, comparisons(), s.seed};
  StoreRun run(setup, 0, spec.store);
  for (int t = 0; t < days; ++t) {
    run.run_days(t, t + 1);
    const auto seen = run.observations(0);
    for (int i = 0; i < items; ++i) {
      house_delivered_[static_cast<size_t>(t * items + i)] = seen[static_cast<size_t>(i)].delivered;
    }
  }
}

std::span<const Policy> DrillGame::comparisons() const {
  return std::span<const Policy>(policies_).first(policies_.size() - 1);
}

int DrillGame::house_order(int order_day, int item) const {
  const int arrival = order_day + scenario_->logistics.lead_time_days;
  if (arrival < 0 || arrival >= scenario_->horizon.days) return 0;
  const int items = static_cast<int>(scenario_->items.size());
  return house_delivered_[static_cast<size_t>(arrival * items + item)];
}

void DrillGame::fill_table(const DrillDecisions& decided, int turns_known) {
  const Scenario& s = *scenario_;
  const int lead = s.logistics.lead_time_days;
  const int warmup = s.horizon.warmup_days;
  const std::vector<int>& drilled = spec().items;
  for (int d = -lead; d < s.horizon.days; ++d) {
    for (int i = 0; i < table_->items(); ++i) {
      const bool trainee =
          d + lead >= warmup && std::find(drilled.begin(), drilled.end(), i) != drilled.end();
      table_->set(d, i, trainee ? 0 : house_order(d, i));
    }
  }
  for (int j = 0; j < turns_known && j < static_cast<int>(decided.size()); ++j) {
    const DrillTurn& t = turns_[static_cast<size_t>(j)];
    for (size_t k = 0; k < drilled.size() && k < decided[static_cast<size_t>(j)].size(); ++k) {
      table_->set(t.order_day, drilled[k], decided[static_cast<size_t>(j)][k]);
    }
  }
}

DrillView DrillGame::view(int turn, const DrillDecisions& decided) {
  const Scenario& s = *scenario_;
  const DrillSpec& sp = spec();
  fill_table(decided, turn);
  DrillView v;
  v.turn = turns_[static_cast<size_t>(turn)];
  v.turn_index = turn;
  v.turns = static_cast<int>(turns_.size());
  const int lead = s.logistics.lead_time_days;
  const int d = v.turn.order_day;
  const int trainee = static_cast<int>(policies_.size()) - 1;
  constexpr size_t kRecent = 7;
  v.items.resize(sp.items.size());

  const SimSetup setup{s, *demand_, policies_, s.seed};
  StoreRun run(setup, 0, sp.store);
  for (int t = 0; t <= d; ++t) {
    run.run_days(t, t + 1);
    const auto seen = run.observations(trainee);
    for (size_t k = 0; k < sp.items.size(); ++k) {
      const Observation& o = seen[static_cast<size_t>(sp.items[k])];
      SeenDay day{t,          o.open,         o.delivered, o.sold,
                  o.sold_out, o.sellout_hour, o.leftover,  o.wasted + o.salvaged + o.donated};
      auto& recent = v.items[k].recent;
      recent.push_back(day);
      if (recent.size() > kRecent) recent.erase(recent.begin());
    }
  }
  for (size_t k = 0; k < sp.items.size(); ++k) {
    const int item = sp.items[k];
    const Item& it = s.items[static_cast<size_t>(item)];
    ItemView& iv = v.items[k];
    if (d >= 0) {
      const auto by_age = run.stock_by_age(trainee, item);
      iv.stock_by_age.assign(by_age.begin(), by_age.end());
    } else {
      iv.stock_by_age.assign(static_cast<size_t>(it.shelf_life_days), 0);
    }
    for (int o = d - lead + 1; o < d; ++o)
      iv.on_order += pack_round(table_->get(o, item), it.pack_size);
    for (int o = d - 1; o >= -lead; --o) {
      const int a = o + lead;
      if (a >= 0 && s.is_open(sp.store, a) &&
          s.logistics.delivery_weekdays[static_cast<size_t>(s.weekday_of(a))]) {
        iv.last_order = table_->get(o, item);
        break;
      }
    }
  }
  for (size_t e = 0; e < scenario_events_; ++e) {
    const CalendarEvent& ev = s.calendar.events[e];
    const bool here = ev.stores.empty() ||
                      std::find(ev.stores.begin(), ev.stores.end(),
                                s.stores[static_cast<size_t>(sp.store)].id) != ev.stores.end();
    if (ev.day == v.turn.arrival_day && here) v.announced *= ev.demand;
  }
  for (const DrillEvent& e : sp.events) {
    if (e.announced && s.horizon.warmup_days + e.day - 1 == v.turn.arrival_day) {
      v.announced *= e.demand;
    }
  }
  return v;
}

DrillOutcome DrillGame::play(const DrillDecisions& decided) {
  const Scenario& s = *scenario_;
  const DrillSpec& sp = spec();
  fill_table(decided, static_cast<int>(turns_.size()));
  const int warmup = s.horizon.warmup_days;
  const size_t n_pol = policies_.size();
  const size_t n_items = s.items.size();
  const int trainee = static_cast<int>(n_pol) - 1;

  DrillOutcome out;
  for (const Policy& p : comparisons()) out.policies.push_back(p.name);
  out.policies.push_back("trainee");
  out.daily.resize(n_pol);
  out.items.resize(sp.items.size());
  std::vector<std::vector<Tally>> before(n_pol, std::vector<Tally>(n_items));
  std::vector<int> carried(sp.items.size(), 0);

  const SimSetup setup{s, *demand_, policies_, s.seed};
  StoreRun run(setup, 0, sp.store);
  for (int t = 0; t < s.horizon.days; ++t) {
    run.run_days(t, t + 1);
    if (t >= warmup) {
      for (size_t p = 0; p < n_pol; ++p) {
        const auto now = run.tallies(static_cast<int>(p));
        std::vector<Tally> day(n_items);
        for (const int i : sp.items) {
          day[static_cast<size_t>(i)] =
              minus(now[static_cast<size_t>(i)], before[p][static_cast<size_t>(i)]);
          before[p][static_cast<size_t>(i)] = now[static_cast<size_t>(i)];
        }
        out.daily[p].push_back(compute_metrics(day, policies_[p].seen(s).items));
      }
    }
    const auto seen = run.observations(trainee);
    for (size_t k = 0; k < sp.items.size(); ++k) {
      const int item = sp.items[k];
      const Observation& o = seen[static_cast<size_t>(item)];
      if (t >= warmup) {
        ItemDay day;
        day.day = t;
        day.open = o.open;
        day.open_stock = carried[k] + o.delivered;
        day.delivered = o.delivered;
        day.sold = o.sold;
        day.sold_out = o.sold_out;
        day.demand = run.demand_today(trainee, item);
        day.unsold_out = o.wasted + o.salvaged + o.donated;
        for (size_t j = 0; j < turns_.size(); ++j) {
          if (turns_[j].arrival_day == t && j < decided.size()) day.ordered = decided[j][k];
        }
        out.items[k].push_back(day);
      }
      carried[k] = units(run.stock_by_age(trainee, item));
    }
  }
  for (size_t p = 0; p < n_pol; ++p) {
    std::vector<Tally> total(n_items);
    for (const int i : sp.items) total[static_cast<size_t>(i)] = before[p][static_cast<size_t>(i)];
    out.totals.push_back(compute_metrics(total, policies_[p].seen(s).items));
  }
  return out;
}

}  // namespace larder
