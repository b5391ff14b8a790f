#pragma once
// The level curve of one store-item-day: for each in-stock level L of a grid, the quantity the
// `in_stock_target` rule would order (the smallest Q with P(D <= Q - 1) >= L, policies.md), the
// in-stock probability it reaches and its single-day newsvendor economics (model.md, metrics;
// the profit of checks.md 1.1). `network_in_stock` sums these curves over the store-item-days of
// a group and trades profit against in-stock days across groups (allocation.hpp).

#include <span>
#include <vector>

#include "sim/stats/count_law.hpp"

namespace larder {

/// Single-day economics of a store-item (model.md, metrics; policies.md critical_fractile).
struct Economics {
  double price = 0, unit_cost = 0, recovery = 0, penalty = 0;  // recovery s per leftover unit,
                                                               // penalty g per lost customer
};

/// What ordering for an in-stock level L means for one store-item-day.
struct LevelPoint {
  int quantity = 0;     ///< Q(L): smallest Q with P(D <= Q - 1) >= L (the in_stock_target rule)
  double in_stock = 0;  ///< P(D <= Q - 1): a unit left at close
  double profit = 0;    ///< p E[min(D,Q)] + s E[(Q-D)+] - c Q - g E[(D-Q)+]
  double leftover = 0;  ///< E[(Q-D)+]
};

/// One point per level of `levels` (ascending, each in (0, 1)) for a day whose demand follows
/// `law`; `out` has the size of `levels`. One upward walk over Q: cost O(Q_max + levels.size()),
/// no per-level quantile search.
///
/// The quantity is exactly the one `in_stock_target` orders for a forecast with the law's mean
/// and variance (forecast_quantile(f, family, L) + 1, fractile_rule.hpp), to the last bit: for
/// poisson and negative_binomial the walk reads the cdf values `CountLaw::quantile` compares
/// against; for the normal family, whose rule rounds mean + sd z_L - 0.5 up, a level whose cdf
/// lies within rounding of L is settled by that formula itself. So a law with mean 0 orders 1
/// unit (P(D <= 0) = 1) in the poisson and negative binomial families, while the normal rule
/// still orders from its sd (the law's expectations then count every unit as left over).
/// Throws std::invalid_argument when the sizes differ or the levels are not ascending in (0, 1).
void level_curve(const CountLaw& law, const Economics& e, std::span<const double> levels,
                 std::span<LevelPoint> out);

/// The default level grid: 0.01, 0.02, ..., 0.99.
std::vector<double> default_levels();

}  // namespace larder
