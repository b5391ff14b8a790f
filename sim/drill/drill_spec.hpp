#pragma once
// The `drill:` section of a scenario (scenario.md extension, README "Training drills"): the
// exercise a trainer prepares. One store, a few items, a number of days the trainee orders for,
// the scenario's policies the trainee is compared with, and surprises: demand events that are
// announced the day before, or hidden (they change demand but the trainee is never told).

#include <string>
#include <vector>

#include "sim/scenario/diagnostics.hpp"

namespace larder {

class Params;
struct Scenario;

/// A demand event of the drill, on drill day `day` (1 = the first day the trainee orders for).
struct DrillEvent {
  int day = 1;
  double demand = 1.0;     ///< multiplies the day's mean demand at the drill store
  bool announced = false;  ///< shown to the trainee when ordering for that day
};

struct DrillSpec {
  int store = 0;             ///< index into Scenario::stores
  std::vector<int> items;    ///< indices into Scenario::items, in the order shown
  int days = 28;             ///< drill days: scored days the trainee orders for
  std::vector<int> compare;  ///< indices into Scenario::policies (the first is the house rule)
  std::vector<DrillEvent> events;
  Location where;  ///< the `drill:` mapping, for messages about the exercise as a whole
};

/// Most items a drill shows side by side (a terminal line per item and day).
inline constexpr int kMaxDrillItems = 8;
/// Most days a drill may last.
inline constexpr int kMaxDrillDays = 364;

/// Reads the `drill:` mapping once the stores, items and policies of `scenario` are known;
/// every problem goes to the mapping's diagnostics with its file:line:col.
DrillSpec read_drill(Params& p, const Scenario& scenario);

}  // namespace larder
