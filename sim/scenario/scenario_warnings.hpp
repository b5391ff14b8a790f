#pragma once
// Things in a valid scenario that are probably mistakes but may be meant (a loss leader sold
// below cost): larder runs it and says so on stderr, in `larder run` and `larder check`.

#include <string>
#include <vector>

#include "sim/scenario/scenario.hpp"

namespace larder {

/// One line per doubtful setting, `file: warning: ...`, in item order: an item whose price is
/// below its unit cost (every unit sold loses money, so a profit-seeking rule orders nothing).
std::vector<std::string> scenario_warnings(const Scenario& scenario);

}  // namespace larder

namespace larder {

/// More doubtful settings (issue 23), `file: warning: ...`: an item whose shelf_capacity is
/// below its pack_size (a pack never fits: the item is never delivered), a lead time as long as
/// the horizon or longer (no order arrives), a store closed on every scored day (nothing is
/// scored), and a cv above 5 (38 is probably 0.38: cv is a ratio, not a percentage).
std::vector<std::string> setting_warnings(const Scenario& scenario);

}  // namespace larder
