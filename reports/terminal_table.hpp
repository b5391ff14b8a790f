#pragma once
// The comparison printed to the terminal after a run: the key metrics of every policy as
// mean ± half-width of the 95% interval, then, for every policy other than the baseline, the
// paired difference against the baseline with its interval and a verdict in plain words.

#include <string>
#include <vector>

#include "sim/runner/run_result.hpp"

namespace larder {

/// The metrics the table shows, in this order, when the run reports them: waste_units,
/// waste_share, in_stock_at_close, no_stockout_share, fill_rate, lost_units, sold_units, revenue,
/// profit, waste_kg, co2e_kg.
std::vector<Metric> table_metrics(const RunResult& result);

/// The comparison as aligned plain text ending in a newline (then, for each network_in_stock
/// policy with at most 12 plan groups, its planned levels against the in-stock achieved). Numbers
/// are right-aligned and rounded to what their interval supports; shares are percentages; every
/// line of a block has the same width. `color` adds ANSI colours (green better, red worse) without
/// changing widths.
std::string comparison_table(const RunResult& result, bool color = false);

}  // namespace larder
