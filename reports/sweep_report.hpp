#pragma once
// sweep.html (`larder sweep`): one self-contained page beside sweep.csv or sensitivity.csv.
// For a grid (`--set`): three trade-off charts (profit against the in-stock share achieved,
// waste against in stock, profit against waste), each policy one line in its own colour, dash
// and marker through the swept values, labels that never overlap, the frontier rows ringed,
// and a table of the rows. For `--vary`: the ranks of every policy at each value on profit and
// on the chosen waste metric with whether the best changes, the tornado table and a bar chart
// of each row's swing.

#include <string>
#include <vector>

#include "reports/policy_ranks.hpp"
#include "reports/sensitivity.hpp"
#include "reports/sweep_csv.hpp"
#include "sim/runner/sweep.hpp"

namespace larder {

/// The page of a grid sweep: `points` as run_sweep returns them for `settings`, `marks` from
/// sweep_frontiers(points).
std::string sweep_html(const std::vector<Setting>& settings, const std::vector<SweepPoint>& points,
                       const FrontierMarks& marks);

/// The page of a sensitivity sweep: `points` with the base first, `rows` = tornado(varies,
/// points), `ranks` = rank_table(points, m) for profit and the chosen waste metric.
std::string sensitivity_html(const std::vector<SweepPoint>& points,
                             const std::vector<TornadoRow>& rows,
                             const std::vector<RankTable>& ranks);

}  // namespace larder
