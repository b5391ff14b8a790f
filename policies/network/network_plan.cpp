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

CountLaw plan_law(const DemandForecast& f, DemandFamily family) {
  const double mean = std::max(f.mean, 0.0);
  return CountLaw::from_moments(family, mean, family == DemandFamily::poisson ? mean : f.variance);
}

Economics plan_economics(const Scenario& scenario, const Item& it) {
  return {it.price, it.unit_cost, leftover_recovery(scenario, it, it.stockout_penalty),
          it.stockout_penalty};
}

namespace {

/// The item's correction at grid level `l` applied to a one-day point of a day with mean demand
/// `mean`.
void correct(LevelPoint& point, const LevelCorrection& c, size_t l, double mean) {
  if (c.empty()) return;
  point.in_stock = std::clamp(point.in_stock + c.in_stock[l], 0.0, 1.0);
  point.profit += c.profit_per_unit[l] * mean;
  point.leftover *= c.waste_ratio[l];
}

}  // namespace

void day_curve(const DemandForecast& f, DemandFamily family, const Economics& e,
               const LevelCorrection* c, std::span<const double> levels, size_t first_level,
               std::span<LevelPoint> out) {
  level_curve(plan_law(f, family), e, levels, out);
  if (c == nullptr) return;
  for (size_t l = 0; l < out.size(); ++l)
    correct(out[l], *c, first_level + l, std::max(f.mean, 0.0));
}

NetworkPlan plan_network(const Scenario& scenario, const NetworkTarget& target,
                         std::span<const StorePlanInput> stores, const PlanLearning& learning,
                         bool detail) {
  const size_t n_items = scenario.items.size();
  assert(stores.size() == scenario.stores.size());
  NetworkPlan plan;
  plan.groups = make_groups(target.grouping, scenario);
  plan.level_grid = default_levels();
  const size_t n_levels = plan.level_grid.size();
  std::vector<Economics> economics;
  for (const Item& it : scenario.items) economics.push_back(plan_economics(scenario, it));
  const auto correction_of = [&](size_t i) -> const LevelCorrection* {
    if (learning.correction.empty() || learning.correction[i].empty()) return nullptr;
    return &learning.correction[i];
  };
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
        day_curve(in.forecasts[d * n_items + i], target.family[i], economics[i], correction_of(i),
                  plan.level_grid, 0, points);
        for (size_t l = 0; l < n_levels; ++l) {
          c.in_stock[l] += points[l].in_stock;
          c.profit[l] += points[l].profit;
          c.leftover[l] += points[l].leftover;
        }
        c.days += 1.0;
      }
    }
  }
  // What the forecasts say, then what the closes seen so far say they mean.
  std::vector<GroupCurve> raw;
  if (!learning.calibration.identity()) {
    raw = curves;
    for (GroupCurve& c : curves) {
      if (c.days <= 0.0) continue;
      for (double& x : c.in_stock) x = c.days * learning.calibration.apply(x / c.days);
    }
  }
  const std::vector<GroupCurve>& expected = raw.empty() ? curves : raw;
  plan.allocation = improve(curves, allocate(curves, target.target));
  plan.curves = curves;
  for (size_t g = 0; g < curves.size(); ++g) {
    const auto l = static_cast<size_t>(plan.allocation.level[g]);
    const double days = curves[g].days;
    plan.group_level.push_back(plan.level_grid[l]);
    plan.group_in_stock.push_back(days > 0 ? curves[g].in_stock[l] / days : 0.0);
    plan.group_raw_in_stock.push_back(days > 0 ? expected[g].in_stock[l] / days : 0.0);
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
        const auto g = static_cast<size_t>(plan.groups.of_store_item[k]);
        const double level = plan.level[k];
        day_curve(in.forecasts[d * n_items + i], target.family[i], economics[i], correction_of(i),
                  std::span<const double>(&level, 1), static_cast<size_t>(plan.allocation.level[g]),
                  one);
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
