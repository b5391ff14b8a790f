#pragma once
// The sections of report.html that read RunResult::breakdown: the key metrics by store, item
// and item attribute (the numbers of breakdown.csv, as mean ± half-width of the 95% interval),
// and for network_in_stock policies the planned level of each plan group against the in-stock
// share achieved.

#include <string>

#include "sim/runner/run_result.hpp"

namespace larder {

/// One block per dimension (store, item, each item attribute), each holding a table per key
/// metric with a row per value and a column per policy; blocks with more than 12 rows start
/// collapsed. Empty when the run has no breakdown.
std::string html_breakdown_section(const RunResult& result);

/// Per network_in_stock policy, its plan groups: planned level, the in-stock share the plans
/// expected, and the share achieved. Empty when no policy plans across the network.
std::string html_plan_group_section(const RunResult& result);

}  // namespace larder
