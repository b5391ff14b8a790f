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
