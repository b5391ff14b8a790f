#pragma once
// Replications x stores in parallel (TBB). Each (replication, store) is an independent task
// whose random draws depend only on (seed, replication, store, item, day, purpose); results
// are reduced in a fixed order (store, then item), so a run is bit-identical at any thread
// count, and every policy sees the same demand (common random numbers).

#include <atomic>
#include <cstdint>
#include <functional>
#include <vector>

#include "policies/policy.hpp"
#include "sim/engine/store_run.hpp"
#include "sim/runner/run_result.hpp"

namespace larder {

struct RunOptions {
  int replications = 0;                     ///< 0 = the scenario's
  int first_replication = 0;                ///< replication ids run are first, first + 1, ...
  int threads = 0;                          ///< 0 = all cores
  DayDetail detail = DayDetail::automatic;  ///< force a finer day (tests, benchmarks)
  /// Called from the calling thread after each batch of replications (done, total).
  std::function<void(int, int)> progress;
  /// Set to true (e.g. by a signal handler) to stop after the current batch.
  const std::atomic<bool>* stop = nullptr;
};

/// The metrics that apply to a scenario (waste_kg only when items have weights, ...).
std::vector<Metric> applicable_metrics(const Scenario& scenario);

/// Simulates every policy; `values` holds one row per finished replication (all of them unless
/// stopped early).
RunResult run_policies(const Scenario& scenario, const std::vector<Policy>& policies,
                       const RunOptions& options);

}  // namespace larder
