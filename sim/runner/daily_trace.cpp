#include "sim/runner/daily_trace.hpp"

#include <algorithm>

#include "sim/engine/store_run.hpp"

namespace larder {

namespace {

TraceDay observe(const StoreRun& run, int policy, int item) {
  const Observation& o = run.observations(policy)[static_cast<size_t>(item)];
  TraceDay d;
  d.demand = run.demand_today(policy, item);
  d.delivered = o.delivered;
  d.sold = o.sold;
  d.leftover = o.leftover;
  d.wasted = o.wasted;
  d.salvaged = o.salvaged;
  d.donated = o.donated;
  d.open = o.open;
  return d;
}

}  // namespace

int traced_item(const Scenario& scenario) {
  int best = 0;
  for (size_t i = 1; i < scenario.items.size(); ++i) {
    if (scenario.items[i].demand.base > scenario.items[static_cast<size_t>(best)].demand.base) {
      best = static_cast<int>(i);
    }
  }
  return best;
}

DailyTrace daily_trace(const Scenario& scenario, std::span<const Policy> policies, int replication,
                       int max_days) {
  DailyTrace trace;
  trace.replication = replication;
  trace.warmup_days = scenario.horizon.warmup_days;
  if (scenario.stores.empty() || scenario.items.empty()) return trace;
  const int item = traced_item(scenario);
  trace.store = scenario.stores.front().id;
  trace.item = scenario.items[static_cast<size_t>(item)].id;

  std::vector<int> recorded;
  for (size_t p = 0; p < policies.size(); ++p) {
    if (policies[p].quantity->network() != nullptr) {
      trace.left_out.push_back(policies[p].name);
    } else {
      recorded.push_back(static_cast<int>(p));
      trace.traces.push_back({policies[p].name, {}});
    }
  }
  if (recorded.empty()) return trace;

  // Only store 0 is simulated, so its demand model is enough (a large network's tables would
  // cost time and memory for nothing). Draws depend on the store index, not on the store count.
  Scenario first_store = scenario;
  first_store.stores.resize(1);
  const DemandModel demand(first_store);
  const SimSetup setup{scenario, demand, policies, scenario.seed};
  StoreRun run(setup, replication, 0);
  const int days = std::min(max_days, scenario.horizon.days);
  for (int t = 0; t < days; ++t) {
    run.run_days(t, t + 1);
    for (size_t k = 0; k < recorded.size(); ++k) {
      trace.traces[k].days.push_back(observe(run, recorded[k], item));
    }
  }
  return trace;
}

}  // namespace larder
