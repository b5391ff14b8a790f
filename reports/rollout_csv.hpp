#pragma once
// The rollout table of `larder allocate --rollout FILE.csv` (README, "Network plans"): one row
// per store-item with the group it is in, the value of each grouping key, every item and store
// attribute, its level and its order basis per weekday, so the plan can be loaded into the
// systems that set store orders.

#include <string>

#include "sim/runner/averaged_plan.hpp"

namespace larder {

/// The whole table. Columns, in order:
///   store, item, group
///   one per grouping key, named as written (e.g. attribute:type, store_attribute:format, abc)
///   attribute:<k> for every item attribute key, store_attribute:<k> for every store attribute
///     key, sorted, leaving out those already a grouping key (blank where the item or store
///     has none)
///   level (the in-stock level, a share), expected_in_stock (a share, one-day newsvendor)
///   order_mon .. order_sun: the mean order basis Q(L) on that weekday over the planned days
///     (blank when the store is closed that weekday); for an item sold in one day that is the
///     order, for an item that keeps the rule orders it less the stock on hand.
std::string rollout_csv(const Scenario& s, const Grouping& g, const AveragedPlan& plan);

}  // namespace larder
