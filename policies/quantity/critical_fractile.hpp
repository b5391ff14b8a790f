#pragma once

#include <vector>

#include "policies/part_context.hpp"
#include "sim/scenario/scenario.hpp"

namespace larder {

/// What a leftover unit brings back (s in the critical ratio): the salvage value when leftovers
/// are salvaged; with a next-day discount, a planner's estimate: the next-day price times
/// `discount_take_rate` (the share of customers who take a discounted unit), plus the fallback's
/// salvage value for the rest; 0 when leftovers are discarded or donated.
double leftover_recovery(const Item& item, double discount_take_rate);

/// The newsvendor critical ratio (p - c + g) / (p - s + g) of an item with stockout penalty g
/// and leftover recovery s (leftover_recovery). 0 when there is nothing to gain.
double critical_ratio(const Item& item, double penalty, double discount_take_rate);

/// Every item's critical ratio, with the rule's optional `penalty` parameter overriding the
/// items' stockout penalty; an item whose ratio reaches 1 is reported.
std::vector<double> read_critical_ratios(PartContext& ctx);

}  // namespace larder
