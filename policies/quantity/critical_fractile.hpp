#pragma once

#include <span>
#include <vector>

#include "policies/part_context.hpp"
#include "sim/scenario/scenario.hpp"

namespace larder {

/// What a leftover unit brings back (s in the critical ratio), under the customer model: the
/// salvage value when leftovers are salvaged and nothing outlives the day (shelf life 1, lead
/// time 1, no discounted tier), 0 when they are discarded or donated; otherwise
/// approximate_recovery (chain_ratio.hpp): a discounted unit's price less the full-price sale
/// it takes, a carried unit's saved purchase. `penalty` is the stockout penalty g.
double leftover_recovery(const Scenario& scenario, const Item& item, double penalty);

/// The newsvendor critical ratio (p - c + g) / (p - s + g) of an item with stockout penalty g
/// and leftover recovery s (leftover_recovery). 0 when there is nothing to gain.
double critical_ratio(const Scenario& scenario, const Item& item, double penalty);

/// Every item's critical ratio, with the rule's optional `penalty` parameter overriding the
/// items' stockout penalty; an item whose ratio reaches 1 is reported. Items that keep, a lead
/// time above one or a discounted tier take the ratio measured on the item's exact chain
/// (chain_ratio.hpp) where it fits, with the family the rule assumes.
std::vector<double> read_critical_ratios(PartContext& ctx, std::span<const DemandFamily> family);

}  // namespace larder
