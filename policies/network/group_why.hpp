#pragma once
// Why a network plan gave a group its level (`larder allocate`, README "Network plans"): the
// critical ratio of the group's margins, its demand variability, what its level is expected to
// achieve (in stock, units left over, profit) and the shadow price of one more point of
// in-stock, per group and for the network. Plans may be averaged: the curves of several plans
// (replications, days) are summed and allocated once, which maximises the expected profit over
// those plans together.

#include <span>
#include <vector>

#include "policies/network/allocation.hpp"
#include "policies/network/level_curve.hpp"

namespace larder {

/// Demand and margins of a group's store-item-days, summed over the days planned.
struct GroupMargins {
  double demand = 0;     ///< sum of expected demand
  double demand_sd = 0;  ///< sum of the standard deviations of demand
  double underage = 0;   ///< sum of expected demand x (p - c + g): what a unit short costs
  double overage = 0;    ///< sum of expected demand x (c - s): what a unit left over costs
  /// One store-item-day with expected demand `mean`, variance `variance` and economics `e`.
  void add(double mean, double variance, const Economics& e);
  /// The critical ratio of the group's margins: underage / (underage + overage), the
  /// newsvendor critical fractile (p - c + g) / (p - s + g) of its items weighted by expected
  /// demand; 0 when the group expects no demand or nothing is to gain.
  double critical_ratio() const;
  /// Demand variability: the sum of the standard deviations over the sum of the means (the
  /// demand-weighted mean coefficient of variation); 0 without demand.
  double cv() const;
};

/// What a group's chosen level means, per plan (one plan covers its planned days).
struct GroupWhy {
  double level = 0;     ///< the in-stock level chosen
  double in_stock = 0;  ///< expected share of its store-item-days in stock at close
  double leftover = 0;  ///< expected units left unsold per plan (waste before recovery)
  double profit = 0;    ///< expected profit per plan
  double days = 0;      ///< store-item-days per plan
  /// Profit per plan given up to raise this group's in-stock by one point (0.01 x its days) at
  /// the next grid level that raises it: the slope of its curve past the chosen level; NaN at
  /// the top of the grid.
  double point_cost = 0;
  double critical_ratio = 0;  ///< of its margins (GroupMargins)
  double cv = 0;              ///< of its demand (GroupMargins)
};

/// Adds `plan` (one plan's group curves) to `sum` (empty, or of the same groups and levels);
/// `leftover` is summed when both have it.
void add_curves(std::vector<GroupCurve>& sum, std::span<const GroupCurve> plan);

/// The allocation of summed curves for `target` (allocate, then improve), as a plan makes it.
Allocation allocate_summed(std::span<const GroupCurve> curves, double target);

/// Why each group got its level: `curves` summed over `plans` plans, `a` their allocation on
/// grid `levels`, `margins` per group summed over the same plans.
std::vector<GroupWhy> group_why(std::span<const GroupCurve> curves, const Allocation& a,
                                std::span<const double> levels,
                                std::span<const GroupMargins> margins, double plans);

/// The shadow price of one more point of network in-stock, per plan: from the multiplier
/// (lambda x 0.01 x store-item-days) and as the finite difference of the best profit at
/// `target` and at `target` + 0.01 (allocate_summed on both; NaN when target + 0.01 cannot be
/// met or exceeds 1).
struct PointPrice {
  double multiplier = 0;
  double finite_difference = 0;
};
PointPrice network_point_price(std::span<const GroupCurve> curves, const Allocation& a,
                               double target, double plans);

}  // namespace larder
