#pragma once
// A network plan averaged over replications and plan days (`larder allocate --replications N
// --days D`, README "Network plans"): the group curves of N x D plans (each the plan the policy
// would make on that day of that replication, from its own forecasts) are summed and allocated
// once, so the levels maximise the expected profit over all of them together at the target.
// One plan (N = D = 1) gives the policy's own levels. Alongside: why each group got its level
// (group_why.hpp) and, per store-item, the expectations at its level and the order basis per
// weekday, for the rollout table.

#include <tbb/task_arena.h>

#include <array>
#include <span>
#include <vector>

#include "policies/network/group_why.hpp"
#include "policies/network/network_plan.hpp"
#include "sim/engine/store_run.hpp"

namespace larder {

/// One plan and the forecasts it was made from (one entry per store).
struct PlanSample {
  std::vector<GroupCurve> curves;
  std::vector<StorePlanInput> stores;
};

struct AveragedPlan {
  GroupMap groups;
  std::vector<double> level_grid;
  std::vector<GroupCurve> curves;     ///< per group, summed over the plans
  Allocation allocation;              ///< of the summed curves, at the target
  std::vector<GroupMargins> margins;  ///< per group, summed over the plans
  int plans = 0;
  std::vector<double> group_level;  ///< per group
  std::vector<double> level;        ///< per store-item [store * items + item]
  /// Per store-item, per plan (sums over the plans / plans): one-day newsvendor expectations
  /// at its level over its planned days (level_curve.hpp).
  std::vector<double> days, in_stock, leftover, profit;
  std::vector<double> quantity;  ///< mean order basis Q(L) over its planned days
  /// Per store-item, per weekday (0 = Monday): the mean order basis Q(L) over the planned days
  /// of that weekday; NaN when none was planned (the store is closed that day).
  std::vector<std::array<double, 7>> weekday_quantity;
};

/// Averages `samples` (plans of policy target `target` on scenario `s`, all with the groups of
/// `target.grouping` and the grid `level_grid`). The per-store-item figures use each item's
/// level correction (`correction`, per item; empty: none), as the plans' own curves do.
AveragedPlan average_plans(const Scenario& s, const NetworkTarget& target,
                           std::span<const PlanSample> samples, std::span<const double> level_grid,
                           std::span<const LevelCorrection> correction = {});

/// Runs replications 0 .. replications - 1 to `day`, then takes the plan of policy `policy`
/// on each of days day .. day + days - 1 of each replication, and averages them.
AveragedPlan averaged_plan(const SimSetup& setup, int policy, int day, int replications, int days,
                           tbb::task_arena& arena);

}  // namespace larder
