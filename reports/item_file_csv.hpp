#pragma once
// The item file of a scenario (`larder history --items-out`), the companion of a history for
// `larder fit --items`: item,price,unit_cost,shelf_life_days and one column per item attribute
// key of the scenario (sorted; blank for items without that key). Read by read_item_file.

#include <string>

#include "sim/scenario/scenario.hpp"

namespace larder {

/// The whole file as text, with a header line.
std::string item_file_csv(const Scenario& scenario);

}  // namespace larder
