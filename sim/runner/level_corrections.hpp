#pragma once
// The level corrections of network_in_stock (policies/network/level_correction.hpp): what an
// item's life beyond one day does to what ordering for an in-stock level brings. Measured once
// per run, on the rule itself: a copy of the scenario with one typical store (the mean store
// size, open as the calendar says) and only the items that need it (shelf life above one day,
// a lead time above one, deliveries not every day, a next-day discount or an evening markdown),
// with oracle forecasts and without substitution, runs the network rule at fixed levels of a
// coarse grid (every 0.05, and 0.01 and 0.99) on common random numbers, over about kDays
// scored days per level. The correction at each level is the simulated in-stock share, profit
// and waste less what the one-day curves of the same days say; between grid levels it is
// interpolated linearly. Exact at the typical store up to the simulation's standard error; for
// other stores the profit difference scales with the day's mean demand (see README, "Network
// plans for items that keep").

#include <span>
#include <vector>

#include "policies/network/level_correction.hpp"
#include "policies/policy.hpp"

namespace larder {

/// Scored days simulated per level (replications of the copy's horizon, rounded up).
inline constexpr int kCorrectionDays = 4000;

/// Whether an item's one-day curve is its own: shelf life 1, lead time 1, deliveries every day,
/// no next-day discount and no markdown.
bool one_day_item(const Scenario& scenario, const Item& item);

/// Per policy (empty for policies that do not plan across the network, or when no item needs
/// a correction), per item of the scenario (empty for items that do not need one), on the plan
/// grid `levels`. `threads` as in RunOptions.
std::vector<std::vector<LevelCorrection>> level_corrections(const Scenario& scenario,
                                                            std::span<const Policy> policies,
                                                            std::span<const double> levels,
                                                            int threads);

}  // namespace larder
