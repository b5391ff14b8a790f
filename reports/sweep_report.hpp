#pragma once
// sweep.html (`larder sweep`): one self-contained page beside sweep.csv or sensitivity.csv.
// For a grid (`--set`): the trade-off frontiers as scatters (waste share against in-stock share
// at close, and against profit) with every (point, policy) row labelled "policy @ values" and
// the frontier rows marked in the label text, plus a table of the rows. For `--vary`: the
// tornado table and a bar chart of each row's swing.

#include <string>
#include <vector>

#include "reports/sensitivity.hpp"
#include "reports/sweep_csv.hpp"
#include "sim/runner/sweep.hpp"

namespace larder {

/// The label of a frontier row in the charts and the table.
inline constexpr std::string_view kFrontierMark = "\u2605 frontier";

/// The page of a grid sweep: `points` as run_sweep returns them for `settings`, `marks` from
/// sweep_frontiers(points).
std::string sweep_html(const std::vector<Setting>& settings, const std::vector<SweepPoint>& points,
                       const FrontierMarks& marks);

/// The page of a sensitivity sweep: `points` with the base first, `rows` = tornado(varies,
/// points).
std::string sensitivity_html(const std::vector<SweepPoint>& points,
                             const std::vector<TornadoRow>& rows);

}  // namespace larder
