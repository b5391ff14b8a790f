#pragma once
// The breakdown of a run (cli.md, breakdown.csv): every metric by store, by item, by each item
// attribute, by each store attribute (`store:<key>`) and, for a network_in_stock policy, by its
// plan groups. Each key is a set of
// store-items; its metrics are those of model.md over that set (shares are ratios of sums).

#include <span>
#include <vector>

#include "policies/network/groups.hpp"
#include "sim/runner/run_result.hpp"
#include "sim/runner/store_tallies.hpp"

namespace larder {

/// The dimensions of a policy's breakdown, each as a grouping of store-items.
struct BreakdownDimensions {
  std::vector<std::string> names;  ///< `store`, `item`, item attribute keys, `store:<key>`,
                                   ///< `plan_group`
  std::vector<GroupMap> maps;
};

/// Store, item, every attribute key used by an item (sorted), every attribute key used by a
/// store (sorted, as `store:<key>`), plus `plan_group` when `plan` is given.
BreakdownDimensions breakdown_dimensions(const Scenario& scenario, const Grouping* plan);

/// The keys, in dimension then group order.
std::vector<BreakdownKey> breakdown_keys(const BreakdownDimensions& d);

/// One replication's metrics for every key of `d`, from the tallies of its stores (in store
/// order) for policy `policy`, whose items (as it handles their leftovers) are `items`.
std::vector<MetricVector> breakdown_values(const Scenario& scenario, std::span<const Item> items,
                                           const BreakdownDimensions& d,
                                           std::span<const StoreTallies> stores, size_t policy);

}  // namespace larder
