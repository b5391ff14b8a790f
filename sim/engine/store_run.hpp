#pragma once
// One store over the horizon in one replication, every policy side by side on the same
// demand draws (common random numbers). This is the engine's unit of parallel work: it owns
// all its state and reads only immutable shared data, so any thread may run it.

#include <memory>
#include <span>
#include <vector>

#include "policies/policy.hpp"
#include "sim/engine/customer_split.hpp"
#include "sim/engine/demand_model.hpp"
#include "sim/engine/shelf.hpp"
#include "sim/engine/tally.hpp"
#include "sim/random/stream.hpp"

namespace larder {

/// How finely a day is simulated (model.md, step 2). `automatic` takes hourly buckets only when
/// a feature depends on the time of day (substitution, evening markdown, bargain-only customers,
/// `observe: intraday`), one bucket when an item has a discounted tier, and the plain daily loop
/// otherwise. The other values force a finer path (tests and benchmarks use them to show the
/// paths agree); a scenario that needs hours always gets them.
enum class DayDetail : unsigned char { automatic, one_bucket, hourly };

/// Immutable inputs shared by every store run of a simulation.
/// What a store sees of one item at its closes: open days, and open days with a unit left at
/// close (every day from day 0, warm-up included).
struct CloseCount {
  std::int64_t open_days = 0;
  std::int64_t in_stock_days = 0;
};

struct SimSetup {
  const Scenario& scenario;
  const DemandModel& demand;
  std::span<const Policy> policies;
  std::uint64_t seed = 0;
  DayDetail detail = DayDetail::automatic;
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
  /// Scored-day units sold to substitute customers of one policy, one per substitution pair in
  /// the order of `substitution_pairs`.
  std::span<const std::int64_t> substitutions(int policy) const;
  /// One network-planned policy's close counts so far, one per item (empty for other policies):
  /// what a network plan learns its calibration from.
  std::span<const CloseCount> close_counts(int policy) const;
  /// Today's observations of one policy, one per item (after the day has run).
  std::span<const Observation> observations(int policy) const;
  /// Units of an item on hand after the close under one policy: the shelf and the next-day tier.
  int units_on_hand(int policy, int item) const;
  /// Units of an item on the shelf after the close under one policy, by remaining life: slot a
  /// can be sold from tomorrow on for a + 1 more days (the last slot is empty after ageing).
  std::span<const std::int32_t> stock_by_age(int policy, int item) const;
  /// Today's demand (primary customers) of an item under one policy, after the day has run:
  /// the lane's own count when goodwill makes demand policy-specific, else the shared count.
  int demand_today(int policy, int item) const;
  /// Whether the store is open on `day`.
  bool is_open(int day) const { return open_[static_cast<size_t>(day)] != 0; }
  /// One policy's forecasts for `days` (after its censoring refinement), [d * items + item]:
  /// what a network plan reads.
  void forecasts(int policy, std::span<const int> days, std::span<DemandForecast> out) const;
  /// Hands one policy's rule the in-stock level of every item (network_in_stock).
  void set_levels(int policy, std::span<const double> level_per_item);
  /// Hourly buckets per day (1 on the one-bucket and plain paths).
  int buckets() const { return buckets_; }
  /// Whether days run hour by hour (then the sell-out time and the sales per hour are known).
  bool hourly() const { return hourly_; }
  /// After the day has run: the hours after opening at which the last unit of an item sold
  /// under one policy, when it sold out and the day ran hourly; NaN otherwise. What the store
  /// records whether or not the policy looks at it (`Observation::sellout_hour` is the policy's
  /// view, filled only with `observe: intraday`).
  float sellout_hour(int policy, int item) const;
  /// After the day has run hourly: an item's units sold in each opening hour under one policy
  /// (`out` has buckets() entries; they add up to the day's sales).
  void sales_by_hour(int policy, int item, std::span<int> out) const;
  /// Bytes of state per store-item and policy, as this run holds them (shelf, pipeline,
  /// observations, tallies, the detailed path's tiers and hour buckets, the forecaster's state).
  std::size_t bytes_per_item_and_policy() const;
  /// Bytes of the state every policy of the store shares (calendar, random streams, the
  /// detailed path's split plans and uniforms), as this run holds them.
  std::size_t bytes_shared() const;

 private:
  struct Lane;
  void run_day(int day);
  void draw_dynamic_demand(int day, bool open);
  /// Chooses the day's detail (DayDetail) and prepares the detailed path's tables and streams.
  void setup_detail();
  /// Sets each item's demand forecast over the days a delivery arriving on `arrival` serves.
  void forecast_window(Lane& lane, int arrival);
  void run_lane(Lane& lane, int day, bool open, bool scored);
  /// Draws the day's intraday, substitution and bargain uniforms (shared by every lane).
  void draw_detail(int day, bool open);
  /// Splits an item's customers over buckets and tiers: acceptors of a discounted unit and the
  /// others, `buckets_` each.
  void split_customers(int item, int demand, int* acceptors, int* others) const;
  /// The bucketed day of one lane: tiers, substitution, markdown, bargain customers.
  void run_lane_detailed(Lane& lane, int day, bool open, bool scored, const int* demands);
  /// One lane's bargain-only customers of the day by bucket (its own rate, the shared uniforms).
  void draw_bargain(Lane& lane);
  /// Prepares one lane's view of the items' leftover handling (its markdown hours, bargain
  /// customers) on the detailed path.
  void setup_lane_detail(Lane& lane, std::span<const Item> items);
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
  /// What the day loop needs of an item, packed: what every policy shares. Leftover handling
  /// can differ by policy (`leftovers:` on a policy), so the draws are laid out for the union of
  /// the policies' needs (a tier, a markdown, bargain-only customers in any policy), and every
  /// policy meets the same customers whatever its own handling.
  struct ItemRuntime {
    int life;
    int picking;  ///< index into picking_streams_, or -1 when the split is deterministic
    // Detailed path only.
    bool tiers = false;      ///< a discounted tier can be on the shelf under some policy
    bool two_picks = false;  ///< some policy marks down: two picking uniforms a day
    bool bargain = false;    ///< some policy has bargain-only customers for the item
    int intraday_u = 0;      ///< offset of the item's daily uniforms in intraday_u_
    int intraday_n = 0;      ///< intraday uniforms per day
    int choice = -1;         ///< index into choice_streams_ and choice_u_, -1 without tiers
    int pairs_begin = 0;     ///< the item's substitutes in pair_to_
    int pairs_end = 0;
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
  std::vector<double> picking_u_;           ///< today's picking uniforms, two per item
  // The detailed path (model.md, steps 2-3 by time bucket).
  bool detailed_ = false;
  bool hourly_ = false;                      ///< buckets are the opening hours
  int buckets_ = 1;                          ///< time buckets per day
  std::vector<SplitPlan> hour_plans_;        ///< per item: its customers over the buckets
  std::vector<SplitPlan> substitute_plans_;  ///< per item: its lost customers over substitutes
  std::vector<int> substitute_split_;        ///< scratch: one bucket's split over substitutes
  /// Every substitution pair's substitute item, by origin item (runtime_[i].pairs_begin..end);
  /// the shares live in substitute_plans_.
  std::vector<int> pair_to_;
  std::vector<pcg32> intraday_streams_;      ///< one per item
  std::vector<pcg32> substitution_streams_;  ///< one per item
  std::vector<pcg32> choice_streams_;        ///< one per item with a discounted tier
  std::vector<double> intraday_u_;           ///< today's intraday uniforms, all items
  std::vector<double> choice_u_;             ///< today's tier-choice uniform per tiered item
  /// The item's pairs by bucket: [pairs_begin * buckets + h * pairs + j].
  std::vector<double> substitution_u_;
  std::vector<int> acceptors_;        ///< [item * buckets + h], shared unless goodwill
  std::vector<int> others_;           ///< [item * buckets + h]
  std::vector<double> bargain_mean_;  ///< per item: today's mean before goodwill (0 closed)
  std::vector<std::unique_ptr<Lane>> lanes_;
};

}  // namespace larder
