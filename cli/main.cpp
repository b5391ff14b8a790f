// `larder`: the command line (cli.md). Parses options, dispatches to a command, and maps
// failures to exit codes: 0 success, 2 bad input, 1 internal error (130 interrupted: `run`).

#include <fmt/format.h>

#include <CLI/CLI.hpp>
#include <cstdio>
#include <exception>

#include "cli/commands.hpp"
#include "policies/registry.hpp"

namespace {

std::string joined(int argc, char** argv) {
  std::string s = "larder";
  for (int i = 1; i < argc; ++i) {
    const std::string a = argv[i];
    s += ' ';
    s += a.find_first_of(" \t'\"") == std::string::npos ? a : fmt::format("'{}'", a);
  }
  return s;
}

void add_common(CLI::App& cmd, larder::CommonOptions& o, bool scenario_required) {
  auto* s =
      cmd.add_option("SCENARIO", o.scenario,
                     scenario_required ? "scenario file (YAML, see scenarios/)"
                                       : "scenario file (YAML); omit to use the built-in demo");
  if (scenario_required) s->required();
  cmd.add_option("-r,--replications", o.overrides.replications,
                 "replications (independent realisations); overrides the scenario")
      ->check(CLI::Range(1, 1000000));
  cmd.add_option("--seed", o.overrides.seed, "random seed; overrides the scenario");
  cmd.add_option("-t,--threads", o.threads,
                 "worker threads [all cores]; results do not depend on it")
      ->check(CLI::Range(1, 4096));
  cmd.add_flag("-q,--quiet", o.quiet, "no progress or notes on stderr");
  cmd.add_option("--format", o.format, "what goes to stdout: table or json [table]")
      ->check(CLI::IsMember({"table", "json"}));
}

std::string parts_help() {
  const auto& r = larder::policy_registry();
  std::string s = "Policy parts (forecast -> censoring -> quantity rule):\n";
  for (const auto& p : r.forecasts.all())
    s += fmt::format("  forecast  {:<18} {}\n", p.name, p.summary);
  for (const auto& p : r.censorings.all())
    s += fmt::format("  censoring {:<18} {}\n", p.name, p.summary);
  for (const auto& p : r.quantities.all())
    s += fmt::format("  quantity  {:<18} {}\n", p.name, p.summary);
  for (const auto& p : r.adjustments.all())
    s += fmt::format("  adjust    {:<18} {}\n", p.name, p.summary);
  return s;
}

}  // namespace

int main(int argc, char** argv) {
  const larder::MpiSession mpi(argc, argv);  // under mpirun (built with LARDER_MPI): the ranks
  CLI::App app{
      "larder: a Monte Carlo simulator of ordering policies for fresh food.\n"
      "It replays stores and items day by day with random demand and scores policies on\n"
      "waste, stockouts and profit, with 95% intervals from paired replications.\n"
      "Results are model estimates, not guarantees; shelf lives, resale and donation must\n"
      "follow local food-safety law and the producer's use-by dates.",
      "larder"};
  app.set_version_flag("--version", std::string("larder ") + LARDER_VERSION);
  app.require_subcommand(0, 1);
  app.footer(
      "Examples:\n"
      "  larder run                       the built-in demo (scenarios/demo.yaml)\n"
      "  larder check my.yaml             validate a scenario, estimate time and memory\n"
      "  larder run my.yaml -r 200 --out results/\n"
      "  larder run my.yaml --shard 2/4 --out part2/\n"
      "                                   one of four slices of the replications (any machine)\n"
      "  larder merge part1/ part2/ part3/ part4/ --out results/\n"
      "                                   the four shards' results, as one run would give\n"
      "  larder sweep my.yaml --set policies.flat.quantity.level=0.6,0.7,0.8\n"
      "                                   the trade-off as one setting varies\n"
      "  larder sweep my.yaml --vary price=-10%,+10% --vary unit_cost=-20%,+20%\n"
      "                                   does the ranking survive uncertain costs?\n"
      "  larder run my.yaml --precision profit=0.5%\n"
      "                                   as many replications as that precision needs\n"
      "  larder allocate my.yaml --policy per-item-levels\n"
      "                                   levels a network_in_stock policy would roll out\n"
      "  larder bench                     engine speed on a generated network\n\n"
      "Exit codes: 0 success, 2 bad input, 1 internal error, 130 interrupted (Ctrl-C: `run`\n"
      "writes the finished replications to <out>/partial/).\n\n" +
      parts_help());

  larder::RunArgs run;
  auto* run_cmd = app.add_subcommand(
      "run", "simulate every policy of a scenario; print a comparison and write the results");
  add_common(*run_cmd, run.common, false);
  run_cmd->add_option("-o,--out", run.out,
                      "output folder [larder-out/<scenario name>]: summary.json, metrics.csv, "
                      "replications.csv, breakdown.csv, substitution.csv (with substitutes), "
                      "report.html");
  run_cmd->add_option("--precision", run.precision,
                      "METRIC=HALF_WIDTH: add replications in batches until every policy's 95% "
                      "half-width of METRIC is below it (profit=0.5% of the mean, or units: "
                      "waste_units=20); difference:METRIC=... targets the paired differences");
  run_cmd
      ->add_option("--max-replications", run.max_replications,
                   "the most replications --precision may run [10000]")
      ->check(CLI::Range(2, 1000000));
  run_cmd->add_option("--max-memory", run.max_memory,
                      "refuse to start when the estimated memory exceeds this, e.g. 4G "
                      "[half of this machine's memory]; `larder check` shows the estimate");
  run_cmd->add_option("--shard", run.shard,
                      "K/N: run only the K-th of N contiguous slices of the replications (every "
                      "shard with the same seed and -r) and write shard-K-of-N.json to the "
                      "output folder instead of the results, for `larder merge`");

  larder::CommonOptions check;
  auto* check_cmd = app.add_subcommand(
      "check",
      "validate a scenario and describe it: size, policies, estimated run time and memory");
  add_common(*check_cmd, check, true);

  larder::SweepArgs sweep;
  auto* sweep_cmd = app.add_subcommand(
      "sweep",
      "rerun a scenario with settings varied on one seed: a grid (--set, sweep.csv with "
      "frontiers) or one input at a time (--vary, sensitivity.csv and a tornado table)");
  add_common(*sweep_cmd, sweep.common, true);
  sweep_cmd->add_option("-s,--set", sweep.set,
                        "PATH=V1,V2,... to vary; several --set make a grid. PATH walks the YAML by "
                        "dots, picking list elements by name or id (or * for all), e.g. "
                        "policies.per-item.quantity.target=0.6,0.7,0.8 or items.*.unit_cost=1,1.2");
  sweep_cmd->add_option("--vary", sweep.vary,
                        "PATH=-10%,+10% (or values): sensitivity, one input at a time, with a "
                        "tornado table of each policy's profit difference against the baseline; "
                        "a PATH without dots means every item's key, e.g. --vary price=-10%,+10%");
  sweep_cmd->add_option("-o,--out", sweep.out, "folder for sweep.csv [larder-out/<scenario name>]");

  larder::MergeArgs merge;
  auto* merge_cmd = app.add_subcommand(
      "merge", "combine the shard files of `run --shard K/N` runs into the results of one run");
  merge_cmd
      ->add_option("DIR", merge.inputs,
                   "folders holding shard-K-of-N.json files (not their subfolders), or the files")
      ->required();
  merge_cmd->add_option("-o,--out", merge.out, "output folder [larder-out/<scenario name>]");
  merge_cmd->add_flag("-q,--quiet", merge.quiet, "no notes on stderr");
  merge_cmd->add_option("--format", merge.format, "what goes to stdout: table or json [table]")
      ->check(CLI::IsMember({"table", "json"}));

  larder::AllocateArgs allocate;
  auto* allocate_cmd = app.add_subcommand(
      "allocate",
      "the in-stock levels a network_in_stock policy would roll out, per group and store-item");
  add_common(*allocate_cmd, allocate.common, true);
  allocate_cmd->add_option("-p,--policy", allocate.policy, "a network_in_stock policy")->required();
  allocate_cmd->add_option(
      "--day", allocate.day,
      "plan on this day, after simulating the days before it [end of warm-up]");
  allocate_cmd->add_option("-o,--out", allocate.out,
                           "CSV file [larder-out/<scenario name>/allocation-<policy>.csv]");

  larder::BenchArgs bench;
  auto* bench_cmd = app.add_subcommand(
      "bench", "measure engine speed (store-item-days per second) on a generated network");
  bench_cmd->add_option("--stores", bench.stores, "stores [100]")->check(CLI::Range(1, 100000));
  bench_cmd->add_option("--items", bench.items, "items [50]")->check(CLI::Range(1, 100000));
  bench_cmd->add_option("--days", bench.days, "days [364]")->check(CLI::Range(7, 100000));
  bench_cmd->add_option("--max-threads", bench.max_threads, "measure 1..N threads [all cores]")
      ->check(CLI::Range(1, 4096));

  try {
    app.parse(argc, argv);
  } catch (const CLI::ParseError& e) {
    const int code = app.exit(e);
    return code == 0 ? 0 : 2;
  }

  try {
    run.common.command_line = check.command_line = allocate.common.command_line =
        sweep.common.command_line = joined(argc, argv);
    run.mpi = mpi.world();
    if (run.mpi.rank != 0) run.common.quiet = true;  // rank 0 speaks for the run
    if (*run_cmd || app.get_subcommands().empty()) return larder::run_command(run);
    if (*check_cmd) return larder::check_command(check);
    if (*bench_cmd) return larder::bench_command(bench);
    if (*allocate_cmd) return larder::allocate_command(allocate);
    if (*sweep_cmd) return larder::sweep_command(sweep);
    if (*merge_cmd) return larder::merge_command(merge);
  } catch (const larder::InputError& e) {
    std::fputs(e.what(), stderr);
    return 2;
  } catch (const std::exception& e) {
    fmt::print(stderr, "larder: error: {}\n", e.what());
    return 1;
  }
  return 0;
}
