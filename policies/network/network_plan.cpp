#include "policies/network/network_plan.hpp"

#include <algorithm>
#include <cassert>

#include "policies/network/level_curve.hpp"
#include "policies/quantity/critical_fractile.hpp"
#include "sim/stats/count_law.hpp"

namespace larder {

std::vector<int> plan_days(int day, int horizon_days) {
  const int n = std::min(kPlanDays, horizon_days);
  const int first = std::clamp(day, 0, horizon_days - n);
  std::vector<int> out;
  for (int d = first; d < first + n; ++d) out.push_back(d);
  return out;
}

namespace {

CountLaw law_of(const DemandForecast& f, DemandFamily family) {
  const double mean = std::max(f.mean, 0.0);
  return CountLaw::from_moments(family, mean, family == DemandFamily::poisson ? mean : f.variance);
}

}  // namespace

NetworkPlan plan_network(const Scenario& scenario, const NetworkTarget& target,
                         std::span<const StorePlanInput> stores, bool detail) {
  const size_t n_items = scenario.items.size();
  assert(stores.size() == scenario.stores.size());
  NetworkPlan plan;
  plan.groups = make_groups(target.grouping, scenario);
  plan.level_grid = default_levels();
  const size_t n_levels = plan.level_grid.size();
  std::vector<Economics> economics;
  for (const Item& it : scenario.items) {
    economics.push_back({it.price, it.unit_cost,
                         leftover_recovery(scenario, it, it.stockout_penalty),
                         it.stockout_penalty});
  }
  std::vector<GroupCurve> curves(static_cast<size_t>(plan.groups.count()));
  for (auto& c : curves) {
    c.in_stock.assign(n_levels, 0.0);
    c.profit.assign(n_levels, 0.0);
    c.leftover.assign(n_levels, 0.0);
  }
  // Sums in a fixed order (store, day, item), so a plan never depends on threads.
  std::vector<LevelPoint> points(n_levels);
  for (size_t s = 0; s < stores.size(); ++s) {
    const StorePlanInput& in = stores[s];
    for (size_t d = 0; d < in.days.size(); ++d) {
      for (size_t i = 0; i < n_items; ++i) {
        GroupCurve& c = curves[static_cast<size_t>(plan.groups.of_store_item[s * n_items + i])];
        level_curve(law_of(in.forecasts[d * n_items + i], target.family[i]), economics[i],
                    plan.level_grid, points);
        for (size_t l = 0; l < n_levels; ++l) {
          c.in_stock[l] += points[l].in_stock;
          c.profit[l] += points[l].profit;
          c.leftover[l] += points[l].leftover;
        }
        c.days += 1.0;
      }
    }
  }
  plan.allocation = improve(curves, allocate(curves, target.target));
  plan.curves = curves;
  for (size_t g = 0; g < curves.size(); ++g) {
    const auto l = static_cast<size_t>(plan.allocation.level[g]);
    plan.group_level.push_back(plan.level_grid[l]);
    plan.group_in_stock.push_back(curves[g].days > 0 ? curves[g].in_stock[l] / curves[g].days
                                                     : 0.0);
  }
  const size_t n_store_items = stores.size() * n_items;
  plan.level.resize(n_store_items);
  for (size_t k = 0; k < n_store_items; ++k) {
    plan.level[k] = plan.group_level[static_cast<size_t>(plan.groups.of_store_item[k])];
  }
  if (!detail) return plan;
  plan.days.assign(n_store_items, 0.0);
  plan.quantity.assign(n_store_items, 0.0);
  plan.in_stock.assign(n_store_items, 0.0);
  plan.leftover.assign(n_store_items, 0.0);
  plan.profit.assign(n_store_items, 0.0);
  std::vector<LevelPoint> one(1);
  for (size_t s = 0; s < stores.size(); ++s) {
    const StorePlanInput& in = stores[s];
    for (size_t d = 0; d < in.days.size(); ++d) {
      for (size_t i = 0; i < n_items; ++i) {
        const size_t k = s * n_items + i;
        const double level = plan.level[k];
        level_curve(law_of(in.forecasts[d * n_items + i], target.family[i]), economics[i],
                    std::span<const double>(&level, 1), one);
        plan.days[k] += 1.0;
        plan.quantity[k] += one[0].quantity;
        plan.in_stock[k] += one[0].in_stock;
        plan.leftover[k] += one[0].leftover;
        plan.profit[k] += one[0].profit;
      }
    }
  }
  for (size_t k = 0; k < n_store_items; ++k) {
    if (plan.days[k] > 0.0) plan.quantity[k] /= plan.days[k];
  }
  return plan;
}

}  // namespace larder
