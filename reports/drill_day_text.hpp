#pragma once
// The screen of one drill turn, as plain text that reads the same over SSH, in a basic terminal
// or a log: for each drill item what the store knows after the close of the order day (the last
// week's deliveries, sales with sold-out marks and times, units left and thrown out, stock by
// age, units on order, the trainee's previous order, price and cost), the weekday of the
// delivery and any announced event. Never the true demand.

#include <string>

#include "sim/drill/drill_game.hpp"

namespace larder {

/// The screen before turn `v` (drill_scenario: DrillGame::scenario()).
std::string drill_day_text(const Scenario& drill_scenario, const DrillView& v);

/// The prompt line for turn `v`.
std::string drill_prompt_text(const Scenario& drill_scenario, const DrillView& v);

/// What the prompt accepts (shown by `?`).
std::string drill_help_text(const Scenario& drill_scenario);

}  // namespace larder
