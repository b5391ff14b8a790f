#pragma once
// One network plan of `network_in_stock` (policies.md): from the policy's own forecasts of the
// coming week at every store, one in-stock level per group that maximises total expected
// profit subject to
//     sum over store-item-days of P(in stock at close) >= target * (open store-item-days),
// by a Lagrangian relaxation with bisection on the multiplier (allocation.hpp). Each
// store-item-day is valued as a single-day newsvendor: ordering Q(L), the smallest Q with
// P(D <= Q - 1) >= L, earns p E[min(D, Q)] + s E[(Q - D)+] - c Q - g E[(D - Q)+] with the
// item's price p, unit cost c, leftover recovery s (leftover_recovery) and stockout penalty g.
// Stock carried over from earlier days (shelf life above one day) is not valued: the plan
// sets levels, and the rule subtracts stock on hand when it orders.

#include <span>
#include <vector>

#include "policies/forecast.hpp"
#include "policies/network/allocation.hpp"
#include "policies/network/groups.hpp"
#include "policies/network/network_target.hpp"

namespace larder {

/// What one store contributes to a plan: its open days among those planned and the policy's
/// forecasts for them, [d * items + item].
struct StorePlanInput {
  std::vector<int> days;
  std::vector<DemandForecast> forecasts;
};

struct NetworkPlan {
  GroupMap groups;
  std::vector<double> level_grid;
  Allocation allocation;
  std::vector<double> group_level;     ///< per group
  std::vector<double> group_in_stock;  ///< per group: the in-stock share the plan expects
  std::vector<GroupCurve> curves;      ///< per group: the curves the allocation chose from
  std::vector<double> level;           ///< per store-item [store * items + item]
  /// With `detail`: per store-item, expectations over its planned days at its level.
  std::vector<double> days;      ///< open days planned
  std::vector<double> quantity;  ///< mean order basis Q(L) over those days
  std::vector<double> in_stock;  ///< expected days in stock at close
  std::vector<double> leftover;  ///< expected units left at close (waste before recovery)
  std::vector<double> profit;    ///< expected profit
};

/// The days a plan made on `day` looks at: kPlanDays days from `day`, moved back so they stay
/// within a horizon of `horizon_days` days.
std::vector<int> plan_days(int day, int horizon_days);

/// Plans one network policy. `stores` has one entry per store of the scenario.
NetworkPlan plan_network(const Scenario& scenario, const NetworkTarget& target,
                         std::span<const StorePlanInput> stores, bool detail = false);

}  // namespace larder
