#pragma once
// One network plan of `network_in_stock` (policies.md): from the policy's own forecasts of the
// coming week at every store, one in-stock level per group that maximises total expected
// profit subject to
//     sum over store-item-days of P(in stock at close) >= target * (open store-item-days),
// by a Lagrangian relaxation with bisection on the multiplier (allocation.hpp). Each
// store-item-day is valued as a single-day newsvendor: ordering Q(L), the smallest Q with
// P(D <= Q - 1) >= L, earns p E[min(D, Q)] + s E[(Q - D)+] - c Q - g E[(D - Q)+] with the
// item's price p, unit cost c, leftover recovery s (leftover_recovery) and stockout penalty g.
// For items that keep, lead times above one and discounted tiers, the item's LevelCorrection
// (measured by the runner on the item's own dynamics) is added to each day's curve. The
// group's expected in-stock is then recalibrated by what the stores have seen at their closes
// (in_stock_calibration.hpp), so a plan made from forecasts that run low still meets its
// target.

#include <span>
#include <vector>

#include "policies/forecast.hpp"
#include "policies/network/allocation.hpp"
#include "policies/network/groups.hpp"
#include "policies/network/in_stock_calibration.hpp"
#include "policies/network/level_correction.hpp"
#include "policies/network/level_curve.hpp"
#include "policies/network/network_target.hpp"

namespace larder {

/// What one store contributes to a plan: its open days among those planned and the policy's
/// forecasts for them, [d * items + item].
struct StorePlanInput {
  std::vector<int> days;
  std::vector<DemandForecast> forecasts;
};

/// What the runner learned that the forecasts do not say.
struct PlanLearning {
  std::span<const LevelCorrection> correction;  ///< per item; empty: no item needs one
  InStockCalibration calibration;               ///< of the group in-stock probabilities
};

struct NetworkPlan {
  GroupMap groups;
  std::vector<double> level_grid;
  Allocation allocation;
  std::vector<double> group_level;     ///< per group
  std::vector<double> group_in_stock;  ///< per group: the in-stock share the plan expects
  /// per group: the same before the calibration (what the calibration is fitted against)
  std::vector<double> group_raw_in_stock;
  std::vector<GroupCurve> curves;  ///< per group: the curves the allocation chose from
  std::vector<double> level;       ///< per store-item [store * items + item]
  /// With `detail`: per store-item, expectations over its planned days at its level.
  std::vector<double> days;      ///< open days planned
  std::vector<double> quantity;  ///< mean order basis Q(L) over those days
  std::vector<double> in_stock;  ///< expected days in stock at close (before calibration)
  std::vector<double> leftover;  ///< expected units that leave unsold (waste before recovery)
  std::vector<double> profit;    ///< expected profit
};

/// The single-day economics a plan values an item's days with.
Economics plan_economics(const Scenario& scenario, const Item& item);
/// The law a plan assumes for a day with forecast `f` under `family`.
CountLaw plan_law(const DemandForecast& f, DemandFamily family);

/// One store-item-day's curve at `levels` (the plan grid's levels from index `first_level` on):
/// the one-day newsvendor of forecast `f`, corrected by the item's `correction` (null: none).
void day_curve(const DemandForecast& f, DemandFamily family, const Economics& e,
               const LevelCorrection* correction, std::span<const double> levels,
               size_t first_level, std::span<LevelPoint> out);

/// The days a plan made on `day` looks at: kPlanDays days from `day`, moved back so they stay
/// within a horizon of `horizon_days` days.
std::vector<int> plan_days(int day, int horizon_days);

/// Plans one network policy. `stores` has one entry per store of the scenario.
NetworkPlan plan_network(const Scenario& scenario, const NetworkTarget& target,
                         std::span<const StorePlanInput> stores, const PlanLearning& learning,
                         bool detail = false);

}  // namespace larder
