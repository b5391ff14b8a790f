#pragma once

#include <vector>

#include "policies/part_context.hpp"
#include "sim/scenario/scenario.hpp"

namespace larder {

/// The newsvendor critical ratio (p - c + g) / (p - s + g) of an item with stockout penalty g;
/// s is the salvage value when leftovers are salvaged, else 0. 0 when there is nothing to gain.
double critical_ratio(const Item& item, double penalty);

/// Every item's critical ratio, with the rule's optional `penalty` parameter overriding the
/// items' stockout penalty; an item whose ratio reaches 1 is reported.
std::vector<double> read_critical_ratios(PartContext& ctx);

}  // namespace larder
