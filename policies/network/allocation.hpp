#pragma once
// The allocation of `network_in_stock` (policies.md, "Network service-level targets and
// grouping"): one in-stock level per group that maximises total expected profit subject to
//     sum over groups of expected in-stock days >= target * (store-item-days),
// a multiple-choice knapsack solved by Lagrangian relaxation. For a multiplier lambda >= 0 each
// group on its own maximises profit + lambda * in_stock; the smallest lambda whose choices meet
// the target is found by bisection.
//
// Optimality (Everett 1963, "Generalized Lagrange multiplier method for solving problems of
// optimum allocation of resources", Operations Research 11; from memory): a choice x that
// maximises profit + lambda * in_stock over all choices is optimal for the problem whose
// right-hand side is its own in_stock(x). For any feasible y, profit(y) <= profit(y) + lambda *
// (in_stock(y) - required) <= profit(x) + lambda * (in_stock(x) - required), so x is at most
// lambda * (in_stock(x) - required) below the true optimum: the reported `gap_bound`. The gap
// comes from the discreteness of the levels; it shrinks as groups get many and curves smooth.

#include <cstddef>
#include <span>
#include <vector>

namespace larder {

/// A group's level curve summed over its store-item-days (one entry per level of the grid).
struct GroupCurve {
  std::vector<double> in_stock;  ///< expected store-item-days in stock at close
  std::vector<double> profit;    ///< expected profit
  double days = 0;               ///< store-item-days in the group (the constraint's weight)
  /// Expected units left unsold (waste before recovery) per level; may be empty: the
  /// allocation does not use it, `larder allocate` shows it (group_why.hpp).
  std::vector<double> leftover = {};
};

/// The chosen levels and what they achieve.
struct Allocation {
  std::vector<int> level;  ///< per group: index into the level grid
  /// The multiplier (value of one more expected in-stock day): the smallest double at which the
  /// groups' own choices (ties: the lower level) meet the target; 0 when the unconstrained
  /// optimum meets it or the target cannot be met.
  double lambda = 0;
  double in_stock = 0;   ///< expected in-stock days achieved
  double required = 0;   ///< target x total days
  double profit = 0;     ///< expected profit
  double gap_bound = 0;  ///< profit of the best feasible choice minus `profit` is at most this
  bool feasible = true;  ///< false when even the highest level everywhere misses the target
};

/// One level per group maximising total profit subject to sum in_stock >= target * sum days:
/// Lagrangian relaxation, each group maximising profit + lambda * in_stock for a given lambda
/// (ties: the lower level), bisection on lambda >= 0 to the smallest lambda that meets the
/// target. Deterministic. When the unconstrained optimum (lambda = 0) meets the target, that is
/// the answer (gap 0). Infeasible: every group at its highest level, feasible = false.
///
/// Each group's choice as lambda grows walks up the upper concave hull of its (in_stock, profit)
/// points, and changes only where lambda crosses the slope of a hull edge (profit given up per
/// in-stock day gained). The bisection therefore runs over the sorted edge slopes of all groups
/// and ends on the exact smallest one past which the target is met: no tolerance, about
/// log2(edges) rounds of O(groups x log levels). Level curves have in_stock nondecreasing in the
/// level, so "lower in_stock" and "lower level" break ties alike. Throws std::invalid_argument on
/// curves of different or zero lengths, non-finite values or a non-finite target.
Allocation allocate(std::span<const GroupCurve> groups, double target);

/// Spends the in-stock margin a Lagrangian allocation leaves above the requirement: while some
/// group can move to a level that earns more and the target still holds, the move that earns
/// the most is made (a greedy local search; lambda is kept as the price of in-stock). The
/// result is never worse, stays feasible, and `gap_bound` shrinks by what was gained. Skipped
/// when groups x levels exceed `max_work` (with many groups the gap is small anyway).
Allocation improve(std::span<const GroupCurve> groups, Allocation a, std::size_t max_work = 200000);

}  // namespace larder
