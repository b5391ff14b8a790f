#include "sim/runner/run_estimate.hpp"

#include <algorithm>
#include <chrono>

#include "sim/engine/demand_model.hpp"
#include "sim/engine/store_run.hpp"
#include "sim/runner/breakdown.hpp"
#include "sim/runner/network_phases.hpp"

namespace larder {

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
  const auto start = std::chrono::steady_clock::now();
  StoreRun pilot(setup, 0, 0);
  pilot.run_days(0, sampled);
  const double per_store =
      std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count() *
      static_cast<double>(scenario.horizon.days) / static_cast<double>(std::max(sampled, 1));
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

}  // namespace larder
