#pragma once
// allocation-<policy>.html (`larder allocate`): the plan of a network_in_stock policy as a
// self-contained page beside its CSV: a table of the plan groups with the numbers the command
// prints, and a bar chart of the planned level per group.

#include <cstdint>
#include <string>
#include <vector>

namespace larder {

/// One plan group (or the network) as `larder allocate` prints it.
struct AllocationRow {
  std::string group;
  double level = 0;  ///< planned in-stock level (the network's target), a share
  int store_items = 0;
  double in_stock = 0;          ///< expected in-stock share at close
  double order_basis = 0;       ///< expected order quantity per open day, units
  double leftover_per_day = 0;  ///< expected leftover units per day of a store-item
  double profit_per_day = 0;
  double critical_ratio = 0;      ///< of the group's margins (group_why.hpp); NaN: not shown
  double cv = 0;                  ///< of the group's demand; NaN: not shown
  double point_cost_per_day = 0;  ///< profit a day given up for one more point of in-stock
};

struct AllocationPage {
  std::string scenario;
  std::string policy;
  std::string grouping;  ///< how the stores and items are grouped
  std::string currency;
  int day = 0;           ///< the (first) day planned on
  int days = 1;          ///< days planned on, from `day`
  int replications = 1;  ///< replications planned from
  std::uint64_t seed = 0;
  std::vector<AllocationRow> groups;
  AllocationRow network;  ///< its level is the target
  std::string note;       ///< the multiplier and bound of the allocation, as printed
};

/// The whole page.
std::string allocation_html(const AllocationPage& page);

}  // namespace larder
