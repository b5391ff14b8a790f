#include "sim/runner/level_corrections.hpp"

#include <algorithm>
#include <cmath>
#include <stdexcept>

#include "policies/network/level_curve.hpp"
#include "policies/network/network_plan.hpp"
#include "policies/quantity/fractile_rule.hpp"
#include "sim/engine/demand_model.hpp"
#include "sim/runner/monte_carlo.hpp"

namespace larder {

namespace {

bool daily_deliveries(const Scenario& sc) {
  return std::all_of(sc.logistics.delivery_weekdays.begin(), sc.logistics.delivery_weekdays.end(),
                     [](bool d) { return d; });
}

/// The coarse grid the rule is simulated at.
std::vector<double> coarse_levels() {
  std::vector<double> out{0.01};
  for (int k = 1; k < 20; ++k) out.push_back(0.05 * k);
  out.push_back(0.99);
  return out;
}

/// Linear interpolation of `y` (on `x`, ascending) at `at`, constant beyond the ends.
double interpolate(std::span<const double> x, std::span<const double> y, double at) {
  if (at <= x.front()) return y.front();
  if (at >= x.back()) return y.back();
  const auto hi = static_cast<size_t>(std::upper_bound(x.begin(), x.end(), at) - x.begin());
  const double t = (at - x[hi - 1]) / (x[hi] - x[hi - 1]);
  return y[hi - 1] + t * (y[hi] - y[hi - 1]);
}

YAML::Node part(const char* key, const char* name) {
  YAML::Node n(YAML::NodeType::Map);
  n[key] = name;
  return n;
}

/// The corrections of one network policy (index `k`) for the items `needed`.
std::vector<LevelCorrection> measure(const Scenario& sc, std::span<const Policy> policies, size_t k,
                                     const std::vector<int>& needed, std::span<const double> levels,
                                     int threads) {
  const NetworkTarget& target = *policies[k].quantity->network();
  const std::vector<double> grid = coarse_levels();
  // The copy: one typical store, the items that need it, the rule at every grid level.
  Scenario one = sc;
  double size = 0.0;
  for (const Store& s : sc.stores) size += s.size;
  Store typical;
  typical.id = "typical";
  typical.size = size / static_cast<double>(sc.stores.size());
  one.stores = {typical};
  one.items.clear();
  std::vector<DemandFamily> family;
  for (int i : needed) {
    Item it = sc.items[static_cast<size_t>(i)];
    it.substitutes.clear();
    one.items.push_back(std::move(it));
    family.push_back(target.family[static_cast<size_t>(i)]);
  }
  one.horizon.days = std::min(sc.horizon.days, 2 * 364);
  one.horizon.warmup_days = std::min(14, one.horizon.days / 2);
  const int scored = one.horizon.days - one.horizon.warmup_days;
  one.replications = std::clamp((kCorrectionDays + scored - 1) / scored, 1, 64);
  one.policies.clear();
  const PolicySpec& own = sc.policies[k];
  for (size_t l = 0; l < grid.size(); ++l) {
    PolicySpec p;
    p.name = "level-" + std::to_string(l);
    p.forecast = {"oracle", part("method", "oracle"), own.where, own.forecast.path};
    p.censoring = {"ignore", part("method", "ignore"), own.where, own.censoring.path};
    YAML::Node q = part("rule", "in_stock_target");
    q["level"] = 0.5;
    p.quantity = {"in_stock_target", q, own.where, own.quantity.path};
    p.adjustments = own.adjustments;
    one.policies.push_back(std::move(p));
  }
  Diagnostics diag;
  std::vector<Policy> rules = build_policies(one, diag);
  if (!diag.ok()) throw std::logic_error("level corrections: " + diag.format());
  for (size_t l = 0; l < grid.size(); ++l) {
    rules[l].quantity =
        std::make_unique<FractileMethod>(std::vector<double>(needed.size(), grid[l]), family, 1);
  }
  RunOptions options;
  options.threads = threads;
  const RunResult run = run_policies(one, rules, options);

  // The one-day curves of the same days, as the plan would draw them with exact forecasts.
  const DemandModel truth(one);
  const size_t n_levels = grid.size();
  std::vector<LevelCorrection> out(sc.items.size());
  std::vector<LevelPoint> points(n_levels);
  for (size_t j = 0; j < needed.size(); ++j) {
    const Item& item = one.items[j];
    const Economics e = plan_economics(one, item);
    std::vector<double> in_stock(n_levels, 0.0);
    std::vector<double> profit(n_levels, 0.0);
    std::vector<double> leftover(n_levels, 0.0);
    double days = 0.0;
    double demand = 0.0;
    for (int t = one.horizon.warmup_days; t < one.horizon.days; ++t) {
      if (!one.is_open(0, t)) continue;
      const CountLaw law = truth.law(0, static_cast<int>(j), t);
      level_curve(plan_law({law.mean, law.variance}, family[j]), e, grid, points);
      for (size_t l = 0; l < n_levels; ++l) {
        in_stock[l] += points[l].in_stock;
        profit[l] += points[l].profit;
        leftover[l] += points[l].leftover;
      }
      days += 1.0;
      demand += law.mean;
    }
    if (days <= 0.0 || demand <= 0.0) continue;
    // What the rule did, averaged over the copy's replications (item j's breakdown row).
    const PolicyBreakdown& first = run.breakdown[0];
    size_t key = 0;
    while (key < first.keys.size() &&
           !(first.keys[key].dimension == "item" && first.keys[key].key == item.id)) {
      ++key;
    }
    if (key == first.keys.size()) throw std::logic_error("level corrections: no item row");
    std::vector<double> d_in(n_levels), d_profit(n_levels), ratio(n_levels);
    for (size_t l = 0; l < n_levels; ++l) {
      const PolicyBreakdown& b = run.breakdown[l];
      double sim_in = 0.0;
      double sim_profit = 0.0;
      double sim_waste = 0.0;
      for (size_t r = 0; r < b.values.size(); ++r) {
        const MetricVector& v = b.values[r][key];
        sim_in += v[static_cast<size_t>(Metric::in_stock_at_close)];
        sim_profit += v[static_cast<size_t>(Metric::profit)];
        sim_waste += v[static_cast<size_t>(Metric::waste_units)] +
                     v[static_cast<size_t>(Metric::salvaged_units)] +
                     v[static_cast<size_t>(Metric::donated_units)];
      }
      const auto reps = static_cast<double>(b.values.size());
      d_in[l] = sim_in / reps - in_stock[l] / days;
      d_profit[l] = (sim_profit / reps - profit[l]) / demand;
      ratio[l] = leftover[l] > 0.0 ? (sim_waste / reps) / leftover[l] : 1.0;
    }
    LevelCorrection& c = out[static_cast<size_t>(needed[j])];
    for (double at : levels) {
      c.in_stock.push_back(interpolate(grid, d_in, at));
      c.profit_per_unit.push_back(interpolate(grid, d_profit, at));
      c.waste_ratio.push_back(interpolate(grid, ratio, at));
    }
  }
  return out;
}

}  // namespace

bool one_day_item(const Scenario& sc, const Item& item) {
  return item.shelf_life_days == 1 && sc.logistics.lead_time_days == 1 && !item.next_day &&
         !item.markdown && daily_deliveries(sc);
}

std::vector<std::vector<LevelCorrection>> level_corrections(const Scenario& sc,
                                                            std::span<const Policy> policies,
                                                            std::span<const double> levels,
                                                            int threads) {
  std::vector<std::vector<LevelCorrection>> out(policies.size());
  std::vector<int> needed;
  for (size_t i = 0; i < sc.items.size(); ++i) {
    if (!one_day_item(sc, sc.items[i])) needed.push_back(static_cast<int>(i));
  }
  if (needed.empty() || sc.stores.empty()) return out;
  for (size_t k = 0; k < policies.size(); ++k) {
    const NetworkTarget* target = policies[k].quantity->network();
    if (target == nullptr) continue;
    // Policies that assume the same families and adjust alike share their corrections.
    for (size_t j = 0; j < k; ++j) {
      const NetworkTarget* other = policies[j].quantity->network();
      if (other != nullptr && other->family == target->family &&
          sc.policies[j].adjustments.empty() && sc.policies[k].adjustments.empty() &&
          !out[j].empty()) {
        out[k] = out[j];
        break;
      }
    }
    if (out[k].empty()) out[k] = measure(sc, policies, k, needed, levels, threads);
  }
  return out;
}

}  // namespace larder
