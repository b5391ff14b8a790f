// A network plan averaged over replications and plan days (averaged_plan.hpp).

#include "sim/runner/averaged_plan.hpp"

#include <algorithm>
#include <cmath>
#include <limits>

#include "policies/network/level_curve.hpp"
#include "policies/network/network_plan.hpp"
#include "sim/runner/network_phases.hpp"
#include "sim/stats/count_law.hpp"

namespace larder {

namespace {

double variance_for(const DemandForecast& f, DemandFamily family) {
  return family == DemandFamily::poisson ? std::max(f.mean, 0.0) : f.variance;
}

}  // namespace

AveragedPlan average_plans(const Scenario& s, const NetworkTarget& target,
                           std::span<const PlanSample> samples, std::span<const double> level_grid,
                           std::span<const LevelCorrection> correction) {
  const size_t n_items = s.items.size();
  const size_t n_store_items = s.stores.size() * n_items;
  AveragedPlan out;
  out.groups = make_groups(target.grouping, s);
  out.level_grid.assign(level_grid.begin(), level_grid.end());
  out.plans = static_cast<int>(samples.size());
  for (const PlanSample& p : samples) add_curves(out.curves, p.curves);
  out.allocation = allocate_summed(out.curves, target.target);
  for (int l : out.allocation.level) out.group_level.push_back(level_grid[static_cast<size_t>(l)]);
  out.level.resize(n_store_items);
  for (size_t k = 0; k < n_store_items; ++k) {
    out.level[k] = out.group_level[static_cast<size_t>(out.groups.of_store_item[k])];
  }

  std::vector<Economics> economics;
  for (const Item& it : s.items) economics.push_back(plan_economics(s, it));
  const auto correction_of = [&](size_t i) -> const LevelCorrection* {
    return i < correction.size() && !correction[i].empty() ? &correction[i] : nullptr;
  };
  out.margins.assign(static_cast<size_t>(out.groups.count()), GroupMargins{});
  out.days.assign(n_store_items, 0.0);
  out.in_stock.assign(n_store_items, 0.0);
  out.leftover.assign(n_store_items, 0.0);
  out.profit.assign(n_store_items, 0.0);
  out.quantity.assign(n_store_items, 0.0);
  std::vector<std::array<double, 7>> weekday_days(n_store_items, std::array<double, 7>{});
  out.weekday_quantity.assign(n_store_items, std::array<double, 7>{});
  std::vector<LevelPoint> one(1);
  for (const PlanSample& p : samples) {
    for (size_t st = 0; st < p.stores.size(); ++st) {
      const StorePlanInput& in = p.stores[st];
      for (size_t d = 0; d < in.days.size(); ++d) {
        const auto wd = static_cast<size_t>(s.weekday_of(in.days[d]));
        for (size_t i = 0; i < n_items; ++i) {
          const size_t k = st * n_items + i;
          const DemandForecast& f = in.forecasts[d * n_items + i];
          const DemandFamily family = target.family[i];
          out.margins[static_cast<size_t>(out.groups.of_store_item[k])].add(
              f.mean, variance_for(f, family), economics[i]);
          const auto g = static_cast<size_t>(out.groups.of_store_item[k]);
          const double level = out.level[k];
          day_curve(f, family, economics[i], correction_of(i), std::span<const double>(&level, 1),
                    static_cast<size_t>(out.allocation.level[g]), one);
          out.days[k] += 1.0;
          out.quantity[k] += one[0].quantity;
          out.in_stock[k] += one[0].in_stock;
          out.leftover[k] += one[0].leftover;
          out.profit[k] += one[0].profit;
          weekday_days[k][wd] += 1.0;
          out.weekday_quantity[k][wd] += one[0].quantity;
        }
      }
    }
  }
  const double per = out.plans > 0 ? 1.0 / out.plans : 0.0;
  for (size_t k = 0; k < n_store_items; ++k) {
    if (out.days[k] > 0) out.quantity[k] /= out.days[k];
    out.days[k] *= per;
    out.in_stock[k] *= per;
    out.leftover[k] *= per;
    out.profit[k] *= per;
    for (size_t wd = 0; wd < 7; ++wd) {
      out.weekday_quantity[k][wd] = weekday_days[k][wd] > 0
                                        ? out.weekday_quantity[k][wd] / weekday_days[k][wd]
                                        : std::numeric_limits<double>::quiet_NaN();
    }
  }
  return out;
}

AveragedPlan averaged_plan(const SimSetup& setup, int policy, int day, int replications, int days,
                           tbb::task_arena& arena) {
  const Scenario& sc = setup.scenario;
  const NetworkTarget& target = *setup.policies[static_cast<size_t>(policy)].quantity->network();
  const size_t n_items = sc.items.size();
  PhasedRuns runs(setup, 0, replications, arena);
  std::vector<PlanSample> samples;
  std::vector<double> grid;
  for (int j = 0; j < days; ++j) {
    runs.run_until(day + j);
    const std::vector<int> window = plan_days(day + j, sc.horizon.days);
    for (int r = 0; r < replications; ++r) {
      NetworkPlan plan = runs.plan(r, policy, false);
      PlanSample sample;
      sample.curves = std::move(plan.curves);
      if (grid.empty()) grid = plan.level_grid;
      sample.stores.resize(sc.stores.size());
      for (size_t st = 0; st < sc.stores.size(); ++st) {
        const StoreRun& run = runs.run(r, static_cast<int>(st));
        StorePlanInput& in = sample.stores[st];
        for (int d : window) {
          if (run.is_open(d)) in.days.push_back(d);
        }
        in.forecasts.resize(in.days.size() * n_items);
        run.forecasts(policy, in.days, in.forecasts);
      }
      samples.push_back(std::move(sample));
    }
  }
  return average_plans(sc, target, samples, grid, runs.corrections(policy));
}

}  // namespace larder
