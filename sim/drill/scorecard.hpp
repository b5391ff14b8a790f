#pragma once
// The scorecard of a drill: the trainee against each comparison policy on identical demand
// (every metric of model.md over the drill items and days, and day by day), and readings of
// the trainee's habits (habits.hpp): how strongly the orders chase the last sales, how far they
// sit between the profit-maximising quantity and the mean, and the service level they imply
// against the critical fractile the margins justify. The readings use the true demand law of
// the drill (mean and quantiles with the drill's events), known only after the game.

#include <cstdint>
#include <string>
#include <vector>

#include "sim/drill/drill_game.hpp"
#include "sim/drill/habits.hpp"

namespace larder {

/// Habit readings of one item, or of all drill items pooled (item = "all").
struct HabitReading {
  std::string item;
  SlopeFit chasing;                ///< theta: 0 ignores the last sales, 1 orders them again
  SlopeFit pull_to_center;         ///< w: 0 orders Q*, 1 orders the mean
  double implied_service = 0.0;    ///< mean of F(Q) over the orders (Q: stock at opening)
  double justified_service = 0.0;  ///< the critical fractile (p - c + g) / (p - s + g)
  int orders = 0;                  ///< orders read
};

struct Scorecard {
  std::string scenario;
  std::string trainee;
  std::uint64_t seed = 0;
  std::string store;
  std::vector<std::string> items;
  std::string currency;
  int first_day = 0;  ///< scenario day of drill day 1
  int days = 0;
  std::vector<DrillEvent> events;
  /// The trainee first, then the comparison policies (the house rule first).
  std::vector<std::string> policies;
  std::vector<MetricVector> totals;              ///< per policy
  std::vector<std::vector<MetricVector>> daily;  ///< [policy][drill day - 1]
  std::vector<std::string> weekday;              ///< per drill day
  std::vector<std::vector<ItemDay>> item_days;   ///< the trainee's [drill item][drill day - 1]
  std::vector<HabitReading> habits;              ///< pooled ("all") first, then per item
};

/// Plays the drill with `decided` and reads the result.
Scorecard score_drill(DrillGame& game, const DrillDecisions& decided, std::string trainee);

/// The metrics the scorecard leads with: waste_units, in_stock_at_close, fill_rate, profit.
std::vector<Metric> scorecard_metrics();

}  // namespace larder
