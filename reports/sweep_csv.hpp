#pragma once
// sweep.csv: one row per sweep point and policy with every reported metric (mean and standard
// error over replications) and two frontier marks: `waste_in_stock_frontier` (no other row has
// both a lower waste_share and a higher in_stock_at_close, one strictly) and
// `profit_waste_frontier` (likewise for higher profit and lower waste_share). When some row
// donates or salvages, both read surplus_share instead of waste_share (`frontier_waste` column).

#include <string>
#include <vector>

#include "sim/runner/sweep.hpp"

namespace larder {

/// Per row (point-major, then policy): on the waste-versus-in-stock frontier, and on the
/// profit-versus-waste frontier.
struct FrontierMarks {
  std::vector<bool> waste_in_stock;
  std::vector<bool> profit_waste;
  /// What "waste" means on both frontiers: waste_share, or surplus_share when some row donates
  /// or salvages (donated and salvaged units are not waste, so waste alone would crown them by
  /// definition; the surplus counts every unit not sold at full price).
  Metric waste = Metric::waste_share;
};
FrontierMarks sweep_frontiers(const std::vector<SweepPoint>& points);
/// The waste measure of the frontiers: surplus_share when some row donates or salvages, else
/// waste_share.
Metric frontier_waste_metric(const std::vector<SweepPoint>& points);

std::string sweep_csv(const std::vector<Setting>& settings, const std::vector<SweepPoint>& points);

}  // namespace larder
