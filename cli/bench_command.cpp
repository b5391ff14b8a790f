#include <fmt/format.h>

#include <algorithm>
#include <thread>

#include "cli/commands.hpp"
#include "sim/engine/demand_model.hpp"
#include "sim/engine/store_run.hpp"
#include "sim/runner/monte_carlo.hpp"
#include "sim/scenario/load_scenario.hpp"

namespace larder {

namespace {

/// A generated network for the benchmark: Poisson demand, shelf life 1, one policy
/// (ses_weekday + in_stock_target with the normal assumption), the single-bucket path.
std::string bench_scenario(const BenchArgs& a) {
  std::string y = fmt::format(
      "format: 1\nname: bench\nseed: 7\nreplications: 1\n"
      "horizon: {{ days: {}, warmup_days: 0 }}\n"
      "stores: {{ count: {}, size: {{ lognormal_cv: 0.3 }} }}\nitems:\n",
      a.days, a.stores);
  for (int i = 0; i < a.items; ++i) {
    y += fmt::format(
        "  - {{ id: i{:04}, price: 3, unit_cost: 1, demand: {{ base: {}, weekday: {{ sat: 1.3 }} "
        "}} }}\n",
        i, 5 + (i * 7) % 46);
  }
  y += "policies:\n  - name: ses-in-stock\n    forecast: { method: ses_weekday, alpha: 0.2 }\n"
       "    quantity: { rule: in_stock_target, level: 0.8, assume: normal }\n";
  return y;
}

}  // namespace

int bench_command(const BenchArgs& args) {
  Diagnostics diag;
  auto scenario = parse_scenario(bench_scenario(args), "<bench>", diag);
  if (!scenario) throw InputError(diag);
  auto policies = build_policies(*scenario, diag);
  if (!diag.ok()) throw InputError(diag);

  const int cores = static_cast<int>(std::max(1u, std::thread::hardware_concurrency()));
  const int max_threads = args.max_threads > 0 ? args.max_threads : cores;
  const double per_rep = static_cast<double>(args.stores) * args.items * args.days;
  fmt::print(
      "larder bench: {} stores x {} items x {} days; Poisson demand, shelf life 1,\n"
      "ses_weekday + in_stock_target (assume normal), single-bucket path, {} core(s)\n\n",
      args.stores, args.items, args.days, cores);

  // Size the work to about two seconds on one thread, from a one-replication pilot.
  RunOptions pilot;
  pilot.replications = 1;
  pilot.threads = 1;
  const double pilot_seconds = run_policies(*scenario, policies, pilot).info.seconds;
  const int reps = std::clamp(static_cast<int>(2.0 / std::max(pilot_seconds, 1e-6)), 1, 1000);

  fmt::print("{:>7}  {:>22}  {:>18}  {:>8}\n", "threads", "store-item-days/s", "per thread",
             "speed-up");
  double single = 0.0;
  for (int t = 1; t <= max_threads; ++t) {
    RunOptions o;
    o.replications = reps;
    o.threads = t;
    const RunResult r = run_policies(*scenario, policies, o);
    const double rate = per_rep * reps / r.info.seconds;
    if (t == 1) single = rate;
    fmt::print("{:>7}  {:>20.1f} M  {:>16.1f} M  {:>8.2f}\n", t, rate / 1e6, rate / 1e6 / t,
               rate / single);
  }
  const DemandModel demand(*scenario);
  const SimSetup setup{*scenario, demand, policies, scenario->seed};
  const StoreRun probe(setup, 0, 0);
  fmt::print(
      "\nstate per store-item: {} bytes per policy while simulating, {} bytes of shared "
      "demand model\n",
      probe.bytes_per_item_and_policy(), demand.bytes_per_store_item());
  return 0;
}

}  // namespace larder
