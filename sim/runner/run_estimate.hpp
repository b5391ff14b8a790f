#pragma once
// What a run will cost before it starts: its size, an estimate of its time (timed on a pilot
// of one store over the first kPilotDays days of the horizon, scaled to the whole) and of its
// peak memory.

#include <cstddef>
#include <cstdint>
#include <vector>

#include "policies/policy.hpp"

namespace larder {

struct RunEstimate {
  std::int64_t open_store_item_days = 0;    ///< per replication, whole horizon
  std::int64_t scored_store_item_days = 0;  ///< per replication, after warm-up
  /// Open store-item-days whose negative binomial cannot reach its variance and so are Poisson
  /// (model.md, Demand), per replication.
  std::int64_t poisson_fallback_days = 0;
  double seconds = 0.0;          ///< estimated wall time of the whole run
  std::size_t memory_bytes = 0;  ///< estimated peak memory of the simulation
};

/// The most days the pilot simulates (104 weeks, so every weekday is sampled alike).
inline constexpr int kPilotDays = 728;

/// Size, time and memory of running every policy for the scenario's replications.
RunEstimate estimate_run(const Scenario& scenario, const std::vector<Policy>& policies,
                         int threads);

}  // namespace larder
