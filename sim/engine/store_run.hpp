#pragma once
// One store over the horizon in one replication, every policy side by side on the same
// demand draws (common random numbers). This is the engine's unit of parallel work: it owns
// all its state and reads only immutable shared data, so any thread may run it.

#include <memory>
#include <span>
#include <vector>

#include "policies/policy.hpp"
#include "sim/engine/demand_model.hpp"
#include "sim/engine/shelf.hpp"
#include "sim/engine/tally.hpp"
#include "sim/random/stream.hpp"

namespace larder {

/// Immutable inputs shared by every store run of a simulation.
struct SimSetup {
  const Scenario& scenario;
  const DemandModel& demand;
  std::span<const Policy> policies;
  std::uint64_t seed = 0;
};

class StoreRun {
 public:
  StoreRun(const SimSetup& setup, int replication, int store);
  ~StoreRun();
  StoreRun(const StoreRun&) = delete;
  StoreRun& operator=(const StoreRun&) = delete;

  /// Simulates days [begin, end) (days must be run in order, from 0).
  void run_days(int begin, int end);
  /// Scored-day counts of one policy, one per item.
  std::span<const Tally> tallies(int policy) const;
  /// Bytes of state per store-item and policy (shelf, pipeline, observation, tally, parts).
  std::size_t bytes_per_item_and_policy() const;

 private:
  struct Lane;
  void run_day(int day);
  void run_lane(Lane& lane, int day, bool open, bool scored);
  void learn(Lane& lane, int day, bool open);
  void place_orders(Lane& lane, int day);

  const SimSetup& setup_;
  StoreView view_;
  int replication_;
  int store_;
  int items_;
  int lead_time_;
  std::vector<int> shelf_life_;
  std::vector<unsigned char> open_;     ///< per day: the store is open
  std::vector<pcg32> demand_streams_;   ///< one per item
  std::vector<pcg32> picking_streams_;  ///< one per item that needs a picking split
  /// What the day loop needs of an item, packed.
  struct ItemRuntime {
    int life;
    Leftovers leftovers;
    int picking;  ///< index into picking_streams_, or -1 when the split is deterministic
  };
  std::vector<ItemRuntime> runtime_;
  std::vector<int> demand_;        ///< today's demand per item
  std::vector<double> picking_u_;  ///< today's picking uniform per item
  std::vector<std::unique_ptr<Lane>> lanes_;
};

}  // namespace larder
