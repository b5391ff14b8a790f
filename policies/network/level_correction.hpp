#pragma once
// What an item's life beyond one day does to the one-day level curve (level_curve.hpp). For
// items that keep, lead times above one and discounted tiers, stock carried from one day to the
// next changes what ordering for a level brings: fewer units are thrown away (a leftover is
// sold tomorrow), the shelf may open above the rule's target, and a delivery covers the days to
// the next one. The runner measures the difference once per run on the item's own dynamics
// (sim/runner/level_corrections.hpp: the rule itself simulated at a typical store with oracle
// forecasts) and the plan adds it to every store-item-day's one-day curve.

#include <vector>

namespace larder {

/// One item's difference from its one-day curve, per level of the plan's grid. Empty: the
/// one-day curve is the item's own (shelf life 1, lead time 1, no discounted tier).
struct LevelCorrection {
  std::vector<double> in_stock;         ///< added to the in-stock probability
  std::vector<double> profit_per_unit;  ///< added profit per unit of the day's mean demand
  std::vector<double> waste_ratio;      ///< units wasted per unit the one-day curve leaves
  bool empty() const { return in_stock.empty(); }
};

}  // namespace larder
