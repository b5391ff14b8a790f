#include "sim/runner/monte_carlo.hpp"

#include <tbb/global_control.h>
#include <tbb/task_arena.h>

#include <algorithm>
#include <chrono>
#include <thread>

#include "policies/network/level_curve.hpp"
#include "sim/engine/store_run.hpp"
#include "sim/runner/breakdown.hpp"
#include "sim/runner/level_corrections.hpp"
#include "sim/runner/network_phases.hpp"
#include "sim/runner/parallel_tasks.hpp"
#include "sim/runner/store_tallies.hpp"

namespace larder {

std::vector<Metric> applicable_metrics(const Scenario& scenario) {
  bool weight = false;
  bool co2e = false;
  bool substitution = false;
  bool discount = false;
  bool salvage = false;
  bool donate = false;
  // Every policy's view of the items (`leftovers:` on a policy changes only their handling).
  std::vector<const std::vector<Item>*> views = {&scenario.items};
  for (size_t p = 0; p < scenario.policies.size(); ++p)
    views.push_back(&scenario.items_of(static_cast<int>(p)));
  for (const std::vector<Item>* view : views) {
    for (const Item& it : *view) {
      weight = weight || it.weight_kg.has_value();
      co2e = co2e || it.co2e_kg.has_value();
      substitution = substitution || !it.substitutes.empty();
      discount = discount || it.next_day.has_value() || it.markdown.has_value();
      salvage = salvage || it.leftovers == Leftovers::salvage ||
                (it.next_day && it.next_day->fallback == Leftovers::salvage);
      donate = donate || it.leftovers == Leftovers::donate ||
               (it.next_day && it.next_day->fallback == Leftovers::donate);
    }
  }
  // The surplus differs from the waste only when some units leave another way.
  const bool surplus = discount || salvage || donate;
  std::vector<Metric> out;
  for (size_t k = 0; k < kMetricCount; ++k) {
    const Metric m = static_cast<Metric>(k);
    // Metrics that would only repeat others when their feature is not in the scenario.
    if ((m == Metric::substitute_units || m == Metric::served_share) && !substitution) continue;
    if ((m == Metric::discounted_units || m == Metric::discount_revenue) && !discount) continue;
    if (m == Metric::salvage_revenue && !salvage) continue;
    if (m == Metric::full_price_revenue && !discount && !salvage) continue;
    if (m == Metric::waste_kg && !weight) continue;
    if (m == Metric::co2e_kg && !co2e) continue;
    if ((m == Metric::surplus_units || m == Metric::surplus_share) && !surplus) continue;
    if (m == Metric::surplus_kg && !(surplus && weight)) continue;
    if (m == Metric::surplus_co2e_kg && !(surplus && co2e)) continue;
    if (m == Metric::donated_kg && !(donate && weight)) continue;
    if (m == Metric::donated_co2e_kg && !(donate && co2e)) continue;
    if (m == Metric::salvaged_kg && !(salvage && weight)) continue;
    if (m == Metric::salvaged_co2e_kg && !(salvage && co2e)) continue;
    if (m == Metric::discounted_kg && !(discount && weight)) continue;
    if (m == Metric::discounted_co2e_kg && !(discount && co2e)) continue;
    out.push_back(m);
  }
  return out;
}

namespace {

StoreTallies simulate_store(const SimSetup& setup, int replication, int store) {
  StoreRun run(setup, replication, store);
  run.run_days(0, setup.scenario.horizon.days);
  return collect_tallies(run, setup.policies.size());
}

}  // namespace

RunResult run_policies(const Scenario& scenario, const std::vector<Policy>& policies,
                       const RunOptions& options) {
  const auto started = std::chrono::steady_clock::now();
  const int reps = options.replications > 0 ? options.replications : scenario.replications;
  const int stores = static_cast<int>(scenario.stores.size());
  const int items = static_cast<int>(scenario.items.size());
  const int threads = options.threads > 0
                          ? options.threads
                          : static_cast<int>(std::max(1u, std::thread::hardware_concurrency()));

  RunResult result;
  result.policies.reserve(policies.size());
  for (const Policy& p : policies) result.policies.push_back(p.name);
  result.baseline = scenario.baseline;
  result.metrics = applicable_metrics(scenario);
  result.values.resize(policies.size());
  result.substituted.resize(policies.size());
  for (const Item& it : scenario.items) {
    for (const Substitute& sub : it.substitutes) {
      result.substitution_pairs.push_back(
          {it.id, scenario.items[static_cast<size_t>(sub.item)].id});
    }
  }
  const size_t n_pairs = result.substitution_pairs.size();
  RunInfo& info = result.info;
  info.scenario_name = scenario.name;
  info.scenario_file = scenario.file;
  info.seed = scenario.seed;
  info.horizon_days = scenario.horizon.days;
  info.warmup_days = scenario.horizon.warmup_days;
  info.stores = stores;
  info.items = items;
  info.currency = scenario.currency;
  info.version = LARDER_VERSION;
  info.threads = threads;

  const DemandModel demand(scenario);
  const SimSetup setup{scenario, demand, policies, scenario.seed, options.detail};
  // Network-planned policies run every store of a replication in step (network_phases.hpp).
  const bool phased = !network_policies(policies).empty();
  std::vector<BreakdownDimensions> dimensions;
  result.breakdown.resize(policies.size());
  for (size_t p = 0; p < policies.size(); ++p) {
    const NetworkTarget* net = policies[p].quantity->network();
    dimensions.push_back(breakdown_dimensions(scenario, net ? &net->grouping : nullptr));
    result.breakdown[p].keys = breakdown_keys(dimensions[p]);
    if (net != nullptr) {
      result.breakdown[p].first_group =
          result.breakdown[p].keys.size() - static_cast<size_t>(dimensions[p].maps.back().count());
      result.breakdown[p].network_target = net->target;
    }
  }

  // Replications run in batches so memory stays bounded: each batch keeps the per-item tallies
  // of its (replication, store) tasks until they are reduced in a fixed order; in phases, it
  // keeps every store run of the batch alive.
  std::size_t per_task = policies.size() * static_cast<size_t>(items) * sizeof(Tally);
  std::size_t budget = std::size_t{256} << 20;
  if (phased) {
    const StoreRun probe(setup, 0, 0);
    per_task += probe.bytes_per_item_and_policy() * policies.size() * static_cast<size_t>(items) +
                probe.bytes_shared();
    budget = std::size_t{1} << 30;
  }
  const int batch = static_cast<int>(std::clamp<std::size_t>(
      budget / std::max<std::size_t>(per_task * static_cast<size_t>(stores), 1), 1,
      static_cast<size_t>(std::max(threads * 4, 8))));

  // What items that keep do to the network plans' level curves, measured once for the run.
  const PlanCorrections corrections =
      phased ? level_corrections(scenario, policies, default_levels(), threads) : PlanCorrections{};

  // Allow exactly `threads` workers, even beyond the core count (tests use that to show the
  // results do not depend on scheduling).
  const tbb::global_control allow(tbb::global_control::max_allowed_parallelism,
                                  static_cast<size_t>(threads));
  tbb::task_arena arena(threads);
  int done = 0;
  while (done < reps) {
    if (options.stop != nullptr && options.stop->load()) break;
    const int n = std::min(batch, reps - done);
    std::vector<StoreTallies> slots(static_cast<size_t>(n * stores));
    std::vector<std::vector<PlanRecord>> plans;
    if (phased) {
      PhasedOutput out =
          run_in_phases(setup, options.first_replication + done, n, arena, corrections);
      slots = std::move(out.tallies);
      plans = std::move(out.plans);
    } else {
      arena.execute([&] {
        parallel_tasks(n * stores, [&](int task) {
          const int rep = options.first_replication + done + task / stores;
          slots[static_cast<size_t>(task)] = simulate_store(setup, rep, task % stores);
        });
      });
    }
    for (int r = 0; r < n; ++r) {
      for (size_t p = 0; p < policies.size(); ++p) {
        std::vector<Tally> per_item(static_cast<size_t>(items));
        std::vector<double> per_pair(n_pairs, 0.0);
        for (int s = 0; s < stores; ++s) {
          const StoreTallies& slot = slots[static_cast<size_t>(r * stores + s)];
          const auto& t = slot.items[p];
          for (int i = 0; i < items; ++i)
            per_item[static_cast<size_t>(i)].add(t[static_cast<size_t>(i)]);
          const auto& sub = slot.substituted[p];
          for (size_t k = 0; k < sub.size(); ++k) per_pair[k] += static_cast<double>(sub[k]);
        }
        const std::vector<Item>& items_p = policies[p].seen(scenario).items;
        result.values[p].push_back(compute_metrics(per_item, items_p));
        if (n_pairs > 0) result.substituted[p].push_back(std::move(per_pair));
        PolicyBreakdown& b = result.breakdown[p];
        b.values.push_back(
            breakdown_values(scenario, items_p, dimensions[p],
                             std::span<const StoreTallies>(slots).subspan(
                                 static_cast<size_t>(r * stores), static_cast<size_t>(stores)),
                             p));
        if (!plans.empty() && b.first_group > 0) {
          const PlanRecord& rec = plans[static_cast<size_t>(r)][p];
          const double n_plans = std::max(rec.plans, 1);
          std::vector<double> level(rec.level.size());
          std::vector<double> in_stock(rec.in_stock.size());
          for (size_t g = 0; g < level.size(); ++g) {
            level[g] = rec.level[g] / n_plans;
            in_stock[g] = rec.in_stock[g] / n_plans;
          }
          b.planned_level.push_back(std::move(level));
          b.planned_in_stock.push_back(std::move(in_stock));
        }
      }
    }
    done += n;
    if (options.progress) options.progress(done, reps);
  }
  result.info.replications = done;
  result.info.seconds =
      std::chrono::duration<double>(std::chrono::steady_clock::now() - started).count();
  return result;
}

}  // namespace larder
