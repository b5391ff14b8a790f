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
  void draw_dynamic_demand(int day, bool open);
  /// Sets each item's demand forecast over the days a delivery arriving on `arrival` serves.
  void forecast_window(Lane& lane, int arrival);
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
  std::vector<unsigned char> open_;      ///< per day: the store is open
  std::vector<unsigned char> delivery_;  ///< per day: open and a delivery weekday
  std::vector<int> next_delivery_;       ///< per day: the next delivery day after it (or days)
  std::vector<pcg32> demand_streams_;    ///< one per item
  std::vector<pcg32> picking_streams_;   ///< one per item that needs a picking split
  /// What the day loop needs of an item, packed.
  struct ItemRuntime {
    int life;
    Leftovers leftovers;
    int picking;  ///< index into picking_streams_, or -1 when the split is deterministic
  };
  std::vector<ItemRuntime> runtime_;
  std::vector<int> demand_;       ///< today's demand per item (shared unless goodwill is on)
  std::vector<double> demand_u_;  ///< today's demand uniform per item
  std::vector<double> mean_;      ///< today's mean per item with shocks (dynamic days only)
  // Demand dynamics (model.md): a traffic shock per store-day, AR(1) persistence per item.
  bool dynamic_ = false;   ///< shocks or goodwill: every day takes the general path
  bool goodwill_ = false;  ///< demand differs by policy (each lane draws its own count)
  double traffic_sigma_ = 0.0;
  double persistence_sigma_ = 0.0;
  pcg32 traffic_stream_;
  std::vector<pcg32> persistence_streams_;  ///< one per item when persistence is on
  std::vector<double> persistence_log_;     ///< [item * lag + day % lag]: the AR(1) state
  std::vector<double> picking_u_;           ///< today's picking uniform per item
  std::vector<std::unique_ptr<Lane>> lanes_;
};

}  // namespace larder
