#pragma once
// What a run will cost before it starts: its size, an estimate of its time (timed on a pilot
// of one store over the first kPilotDays days of the horizon, scaled to the whole, plus, for
// network-planned policies and on request, the network plans timed on a pilot replication and
// scaled to every re-plan; pilots are timed in CPU time of their one thread, so a busy machine
// does not inflate them: the estimate is the wall time on cores that are free) and of its peak
// memory.

#include <cstddef>
#include <cstdint>
#include <vector>

#include "policies/policy.hpp"
#include "sim/engine/store_run.hpp"

namespace larder {

struct RunEstimate {
  std::int64_t open_store_item_days = 0;    ///< per replication, whole horizon
  std::int64_t scored_store_item_days = 0;  ///< per replication, after warm-up
  /// Open store-item-days whose negative binomial cannot reach its variance and so are Poisson
  /// (model.md, Demand), per replication.
  std::int64_t poisson_fallback_days = 0;
  double seconds = 0.0;          ///< estimated wall time of the whole run
  double plan_seconds = 0.0;     ///< of which network plans (add_network_plan_time)
  std::size_t memory_bytes = 0;  ///< estimated peak memory of the simulation
};

/// The most days the pilot simulates (104 weeks, so every weekday is sampled alike).
inline constexpr int kPilotDays = 728;

/// Most plans timed per network policy by the pilot (it stops earlier after 50 ms).
inline constexpr int kPilotPlans = 5;

/// What the network plans of a run cost on one thread, timed on a pilot replication: every
/// store set up and run for a week, then the plans of each network-planned policy timed.
struct NetworkPlanCost {
  double setup_seconds = 0.0;            ///< once per run
  double seconds_per_replication = 0.0;  ///< every plan of every network policy
};
NetworkPlanCost network_plan_cost(const SimSetup& setup);

/// Adds the time of the network plans (network_plan_cost, scaled to every re-plan of every
/// replication on `threads` threads) to `e.seconds` and sets `e.plan_seconds`; nothing without
/// network-planned policies. Only `larder check` asks: its pilot runs a week of every store,
/// which the memory check before `larder run` has no need of.
void add_network_plan_time(RunEstimate& e, const Scenario& scenario,
                           const std::vector<Policy>& policies, int threads);

/// Size, time and memory of running every policy for the scenario's replications.
RunEstimate estimate_run(const Scenario& scenario, const std::vector<Policy>& policies,
                         int threads);

}  // namespace larder
