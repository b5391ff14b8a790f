#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <memory>
#include <thread>

#include "cli/commands.hpp"
#include "cli/history_bench.hpp"
#include "sim/engine/demand_model.hpp"
#include "sim/engine/store_run.hpp"
#include "sim/runner/monte_carlo.hpp"
#include "sim/scenario/load_scenario.hpp"

namespace larder {

namespace {

/// What a benchmark case adds to the plain network.
enum class BenchCase { daily, multi_day, hourly, substitution };

constexpr std::array<std::pair<BenchCase, const char*>, 4> kCases = {{
    {BenchCase::daily, "daily: shelf life 1, the plain daily loop"},
    {BenchCase::multi_day, "multi-day: shelf life 3, mixed picking (fifo_share 0.5)"},
    {BenchCase::hourly, "hourly: 12 buckets (observe: intraday), morning_peak profile"},
    {BenchCase::substitution, "substitution: each item sends 30% of its lost customers on"},
}};

/// A generated network for the benchmark: Poisson demand, one policy (ses_weekday +
/// in_stock_target with the normal assumption), plus what the case adds.
std::string bench_scenario(const BenchArgs& a, BenchCase c) {
  std::string y = fmt::format(
      "format: 1\nname: bench\nseed: 7\nreplications: 1\n"
      "horizon: {{ days: {}, warmup_days: 0 }}\n"
      "stores: {{ count: {}, size: {{ lognormal_cv: 0.3 }} }}\n"
      "customers: {{ fifo_share: 0.5 }}\nitems:\n",
      a.days, a.stores);
  const int life = c == BenchCase::multi_day ? 3 : 1;
  const char* profile = c == BenchCase::daily ? "flat" : "morning_peak";
  for (int i = 0; i < a.items; ++i) {
    std::string subs;
    if (c == BenchCase::substitution && a.items > 1) {
      subs = fmt::format(", substitutes: {{ i{:04}: 0.3 }}", (i + 1) % a.items);
    }
    y += fmt::format(
        "  - {{ id: i{:04}, price: 3, unit_cost: 1, shelf_life_days: {}, demand: {{ base: {}, "
        "weekday: {{ sat: 1.3 }}, intraday: {} }}{} }}\n",
        i, life, 5 + (i * 7) % 46, profile, subs);
  }
  y += fmt::format(
      "policies:\n  - name: ses-in-stock\n    observe: {}\n"
      "    forecast: {{ method: ses_weekday, alpha: 0.2 }}\n"
      "    quantity: {{ rule: in_stock_target, level: 0.8, assume: normal }}\n",
      c == BenchCase::hourly ? "intraday" : "daily");
  return y;
}

/// A scenario and its policies, which may refer to it: built in place, never moved.
struct Prepared {
  Scenario scenario;
  std::vector<Policy> policies;
};

std::unique_ptr<const Prepared> prepare(const BenchArgs& args, BenchCase c) {
  Diagnostics diag;
  auto scenario = parse_scenario(bench_scenario(args, c), "<bench>", diag);
  if (!scenario) throw InputError(diag);
  auto p = std::make_unique<Prepared>();
  p->scenario = std::move(*scenario);
  p->policies = build_policies(p->scenario, diag);
  if (!diag.ok()) throw InputError(diag);
  return p;
}

/// Replications that take about `seconds` on one thread, from a one-replication pilot.
int size_work(const Prepared& p, double seconds) {
  RunOptions pilot;
  pilot.replications = 1;
  pilot.threads = 1;
  const double t = run_policies(p.scenario, p.policies, pilot).info.seconds;
  return std::clamp(static_cast<int>(seconds / std::max(t, 1e-6)), 1, 1000);
}

double rate(const Prepared& p, int reps, int threads, double per_rep) {
  RunOptions o;
  o.replications = reps;
  o.threads = threads;
  return per_rep * reps / run_policies(p.scenario, p.policies, o).info.seconds;
}

}  // namespace

int bench_command(const BenchArgs& args) {
  const int cores = static_cast<int>(std::max(1u, std::thread::hardware_concurrency()));
  const int max_threads = args.max_threads > 0 ? args.max_threads : cores;
  const double per_rep = static_cast<double>(args.stores) * args.items * args.days;
  fmt::print(
      "larder bench: {} stores x {} items x {} days; Poisson demand, one policy\n"
      "(ses_weekday + in_stock_target, assume normal), {} core(s)\n\n",
      args.stores, args.items, args.days, cores);

  const auto daily_case = prepare(args, BenchCase::daily);
  const Prepared& daily = *daily_case;
  const int reps = size_work(daily, 2.0);
  fmt::print("daily path by thread count\n{:>7}  {:>22}  {:>18}  {:>8}\n", "threads",
             "store-item-days/s", "per thread", "speed-up");
  double single = 0.0;
  for (int t = 1; t <= max_threads; ++t) {
    const double r = rate(daily, reps, t, per_rep);
    if (t == 1) single = r;
    fmt::print("{:>7}  {:>20.1f} M  {:>16.1f} M  {:>8.2f}\n", t, r / 1e6, r / 1e6 / t, r / single);
  }

  fmt::print("\ncases on {} thread(s)\n{:>22}  {:<64}\n", max_threads, "store-item-days/s", "case");
  for (const auto& [c, what] : kCases) {
    const auto p = prepare(args, c);
    const int n = size_work(*p, 1.0);
    fmt::print("{:>20.1f} M  {:<64}\n", rate(*p, n, max_threads, per_rep) / 1e6, what);
  }

  bench_history_reader(100, 50, 400);  // 2 million rows

  const DemandModel demand(daily.scenario);
  const SimSetup setup{daily.scenario, demand, daily.policies, daily.scenario.seed};
  const StoreRun probe(setup, 0, 0);
  fmt::print(
      "\nstate per store-item (daily case): {} bytes per policy while simulating, {} bytes of "
      "shared demand model\n",
      probe.bytes_per_item_and_policy(), demand.bytes_per_store_item());
  return 0;
}

}  // namespace larder
