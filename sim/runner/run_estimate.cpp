#include "sim/runner/run_estimate.hpp"

#include <tbb/task_arena.h>
#include <time.h>

#include <algorithm>

#include "sim/engine/demand_model.hpp"
#include "sim/engine/store_run.hpp"
#include "sim/runner/breakdown.hpp"
#include "sim/runner/network_phases.hpp"

namespace larder {

namespace {

/// CPU seconds of the calling thread: the pilots run on it alone, and CPU time does not grow
/// when other programs share the cores (a busy machine would inflate wall time).
double thread_seconds() {
  timespec t{};
  clock_gettime(CLOCK_THREAD_CPUTIME_ID, &t);
  return static_cast<double>(t.tv_sec) + 1e-9 * static_cast<double>(t.tv_nsec);
}

double since(double start) {
  return thread_seconds() - start;
}

}  // namespace

NetworkPlanCost network_plan_cost(const SimSetup& setup) {
  NetworkPlanCost cost;
  const std::vector<int> planned = network_policies(setup.policies);
  if (planned.empty()) return cost;
  const Scenario& sc = setup.scenario;
  tbb::task_arena arena(1);
  // Setting up the stores in step (and whatever a run measures once before its plans).
  double start = thread_seconds();
  PhasedRuns runs(setup, 0, 1, arena);
  cost.setup_seconds = since(start);
  // A week of days first, so learned forecasts have seen some sales.
  runs.run_until(std::min(sc.horizon.days - 1, kPlanDays));
  for (int k : planned) {
    const int every = setup.policies[static_cast<size_t>(k)].quantity->network()->replan_days;
    // Plans on days 0, every, 2 every, ... before the horizon ends.
    const int plans = (sc.horizon.days + every - 1) / every;
    int timed = 0;
    start = thread_seconds();
    do {
      (void)runs.plan(0, k, false);
      ++timed;
    } while (timed < kPilotPlans && since(start) < 0.05);
    cost.seconds_per_replication += since(start) / timed * plans;
  }
  return cost;
}

RunEstimate estimate_run(const Scenario& scenario, const std::vector<Policy>& policies,
                         int threads) {
  RunEstimate e;
  const DemandModel demand(scenario);
  const int stores = static_cast<int>(scenario.stores.size());
  const int items = static_cast<int>(scenario.items.size());
  for (int s = 0; s < stores; ++s) {
    for (int t = 0; t < scenario.horizon.days; ++t) {
      if (!scenario.is_open(s, t)) continue;
      e.open_store_item_days += items;
      if (t >= scenario.horizon.warmup_days) e.scored_store_item_days += items;
      for (int i = 0; i < items; ++i) {
        const DemandSpec& d = scenario.items[static_cast<size_t>(i)].demand;
        if (d.family != DemandFamily::negative_binomial || !d.cv) continue;
        const double m = demand.mean(s, i, t);
        if ((*d.cv * m) * (*d.cv * m) <= m) ++e.poisson_fallback_days;
      }
    }
  }
  // Pilot: one store, one replication, every policy, the first kPilotDays days at most (a
  // 100,000-day horizon is timed on two years and scaled, so `check` stays quick).
  const SimSetup setup{scenario, demand, policies, scenario.seed};
  const int sampled = std::min(scenario.horizon.days, kPilotDays);
  const double start = thread_seconds();
  StoreRun pilot(setup, 0, 0);
  pilot.run_days(0, sampled);
  const double per_store = since(start) * static_cast<double>(scenario.horizon.days) /
                           static_cast<double>(std::max(sampled, 1));
  const double tasks = static_cast<double>(stores) * scenario.replications;
  const int workers = std::max(1, threads);
  e.seconds = per_store * tasks / std::min<double>(workers, tasks);

  const std::size_t per_task = static_cast<size_t>(items) * policies.size() *
                                   (pilot.bytes_per_item_and_policy() + sizeof(Tally)) +
                               pilot.bytes_shared();
  const std::size_t model =
      static_cast<size_t>(stores) * static_cast<size_t>(items) * demand.bytes_per_store_item();
  // Results: the totals and the breakdown rows of every policy and replication.
  std::size_t rows = 0;
  for (const Policy& p : policies) {
    const NetworkTarget* net = p.quantity->network();
    rows +=
        1 + breakdown_keys(breakdown_dimensions(scenario, net ? &net->grouping : nullptr)).size();
  }
  const std::size_t results =
      static_cast<size_t>(scenario.replications) * rows * sizeof(MetricVector);
  // Store runs alive at once: a few per worker, or every store of a batch of replications when
  // a network_in_stock policy makes the stores run in step (monte_carlo.cpp sizes that batch to
  // at most 1 GiB, and at least one replication).
  std::size_t live = per_task * static_cast<size_t>(workers) * 2;
  if (!network_policies(policies).empty()) {
    live = std::max(
        live, std::min(per_task * static_cast<size_t>(stores) *
                           static_cast<size_t>(scenario.replications),
                       std::max(std::size_t{1} << 30, per_task * static_cast<size_t>(stores))));
  }
  e.memory_bytes = model + live + results +
                   (std::size_t{8} << 20);  // plus a fixed allowance for the program itself
  return e;
}

void add_network_plan_time(RunEstimate& e, const Scenario& scenario,
                           const std::vector<Policy>& policies, int threads) {
  if (network_policies(policies).empty()) return;
  const DemandModel demand(scenario);
  const SimSetup setup{scenario, demand, policies, scenario.seed};
  // Every replication re-plans every replan_days from every store's forecasts; the plans of a
  // batch run in parallel across its replications only.
  const NetworkPlanCost plans = network_plan_cost(setup);
  const int workers = std::max(1, threads);
  e.plan_seconds = plans.setup_seconds + plans.seconds_per_replication * scenario.replications /
                                             std::min<double>(workers, scenario.replications);
  e.seconds += e.plan_seconds;
}

}  // namespace larder
