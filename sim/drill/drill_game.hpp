#pragma once
// One drill (README "Training drills"): the drill store of a scenario simulated for one
// replication, the comparison policies and the trainee's store side by side on identical demand
// (common random numbers). The warm-up and the items that are not drilled are ordered by the
// house rule (the first comparison policy); the drill items are ordered by the trainee from the
// first drill day on. Interactive and scripted play share this class: `view` shows what the
// store knows before a turn's order (the days so far are simulated again with the decisions
// made), `play` runs the whole drill with every decision.

#include <memory>
#include <optional>
#include <span>
#include <string>
#include <vector>

#include "policies/policy.hpp"
#include "sim/drill/drill_turns.hpp"
#include "sim/drill/order_table.hpp"
#include "sim/engine/demand_model.hpp"
#include "sim/engine/metric.hpp"

namespace larder {

/// One day of one item at the trainee's store, as the store recorded it.
struct SeenDay {
  int day = 0;
  bool open = false;
  int delivered = 0;
  int sold = 0;
  bool sold_out = false;
  float sellout_hour = 0.0f;  ///< hours after opening (NaN when not sold out)
  int leftover = 0;           ///< sellable units at close
  int unsold_out = 0;         ///< units leaving at close: wasted, salvaged or donated
};

/// What the store knows about one drill item when it orders.
struct ItemView {
  std::vector<SeenDay> recent;             ///< the last days up to the order day, oldest first
  std::vector<std::int32_t> stock_by_age;  ///< after close: slot a sells for a + 1 more days
  int on_order = 0;                        ///< ordered earlier, arriving before the arrival day
  std::optional<int> last_order;           ///< the trainee's previous order of the item
};

/// The screen of one turn: the order day's close and what is announced for the arrival day.
struct DrillView {
  DrillTurn turn;
  int turn_index = 0;
  int turns = 0;
  std::vector<ItemView> items;  ///< per drill item
  double announced = 1.0;       ///< demand multiplier announced for the arrival day (1 = none)
};

/// One drill day of one item at the trainee's store (scored days only).
struct ItemDay {
  int day = 0;
  bool open = false;
  int ordered = -1;    ///< the trainee's order delivered this day (-1: none placed)
  int open_stock = 0;  ///< units on the shelf at opening: carried over + delivered
  int delivered = 0;
  int sold = 0;
  bool sold_out = false;
  int demand = 0;  ///< true demand (never shown during play)
  int unsold_out = 0;
};

/// The drill played to the end.
struct DrillOutcome {
  std::vector<std::string> policies;             ///< the comparison policies, then the trainee
  std::vector<MetricVector> totals;              ///< per policy, drill items over the drill days
  std::vector<std::vector<MetricVector>> daily;  ///< [policy][drill day - 1]
  std::vector<std::vector<ItemDay>> items;       ///< the trainee's [drill item][drill day - 1]
};

class DrillGame {
 public:
  /// `scenario` must have a `drill:` section. Throws InputError when a comparison policy
  /// cannot run at one store (network_in_stock) or a policy cannot be built.
  explicit DrillGame(const Scenario& scenario);
  ~DrillGame();
  DrillGame(DrillGame&&) noexcept;

  /// The drill's own scenario: the store's demand with the drill's events, the horizon cut to
  /// the warm-up plus the drill days, the comparison policies then the trainee.
  const Scenario& scenario() const { return *scenario_; }
  const DrillSpec& spec() const { return *scenario_->drill; }
  const DemandModel& demand() const { return *demand_; }
  /// The turns: one per drill day on which a delivery arrives.
  std::span<const DrillTurn> turns() const { return turns_; }
  /// First drill day (the end of the warm-up).
  int first_day() const { return scenario_->horizon.warmup_days; }
  /// The comparison policies (scenario order of `compare`), the house rule first.
  std::span<const Policy> comparisons() const;
  /// The house rule's order of an item placed on `order_day` (what it delivered lead days
  /// later), for order days before the drill and for items not drilled.
  int house_order(int order_day, int item) const;

  /// What the store knows before turn `turn`'s order, with `decided` holding at least the
  /// earlier turns' decisions.
  DrillView view(int turn, const DrillDecisions& decided);
  /// Runs the whole drill with one decision per turn and drill item.
  DrillOutcome play(const DrillDecisions& decided);

 private:
  void fill_table(const DrillDecisions& decided, int turns_known);

  std::unique_ptr<Scenario> scenario_;  ///< on the heap: policies keep a pointer to it
  std::unique_ptr<DemandModel> demand_;
  std::unique_ptr<OrderTable> table_;
  std::vector<Policy> policies_;  ///< comparisons, then the trainee
  std::vector<DrillTurn> turns_;
  std::vector<int> house_delivered_;  ///< [day * items + item]: the house rule's deliveries
  std::size_t scenario_events_ = 0;   ///< calendar events of the scenario (the drill's follow)
};

}  // namespace larder
