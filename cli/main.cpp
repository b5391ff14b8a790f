// `larder`: the command line (cli.md). Parses options, dispatches to a command, and maps
// failures to exit codes: 0 success, 2 bad input, 1 internal error (130 interrupted: `run`).

#include <fmt/format.h>

#include <CLI/CLI.hpp>
#include <cstdio>
#include <exception>

#include "cli/commands.hpp"
#include "cli/option_values.hpp"
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
  cmd.add_option("-r,--replications", o.replications_text,
                 "replications (independent realisations), 1 to 1000000 as the scenario's "
                 "replications: key reads them (1e3 is 1000); overrides the scenario");
  cmd.add_option("--seed", o.seed_text,
                 "random seed, digits only, 0 to 18446744073709551615 (as the scenario's seed: "
                 "key); overrides the scenario");
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
  s += "A policy may also handle leftovers its own way, compared with the others on the same\n"
       "customers: `leftovers: donate` (or discard, salvage, discount_next_day) for every item,\n"
       "or `leftovers: { rule, next_day, markdown, salvage_value, items: [ids] | where: {k: v} }`\n"
       "(markdown: { from_hour, price, surplus_only: true } marks down only the expected\n"
       "surplus; README, \"Leftover handling as part of a policy\").\n";
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
      "                                   does the best policy stay the best with uncertain\n"
      "                                   prices and costs? (add --waste-metric co2e_kg)\n"
      "  larder run my.yaml --precision profit=0.5%\n"
      "                                   as many replications as that precision needs\n"
      "  larder allocate my.yaml --policy per-item-levels\n"
      "                                   levels a network_in_stock policy would roll out\n"
      "  larder allocate my.yaml --policy by-type -r 10 --days 7 --rollout rollout.csv\n"
      "                                   the same from 70 plans, with why, as a rollout table\n"
      "  larder history my.yaml --policy per-item --out history.csv\n"
      "                                   what the stores would have recorded\n"
      "  larder fit history.csv --items items.csv --out fitted.yaml\n"
      "                                   demand estimated back from sales cut off by sell-outs\n"
      "  larder drill scenarios/drill-bakery.yaml --trainee sam\n"
      "                                   a training drill: order, then see the scorecard\n"
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
                      "replications.csv, breakdown.csv, pairs.csv (every pair of policies), "
                      "substitution.csv (with substitutes), "
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
  run_cmd->add_flag("--force", run.force,
                    "write into an existing, non-empty --out folder that holds no larder result "
                    "(files of larder's names are replaced)");
  run_cmd->add_option("--shard", run.shard,
                      "K/N: run only the K-th of N contiguous slices of the replications (every "
                      "shard with the same seed and -r) and write shard-K-of-N.json to the "
                      "output folder instead of the results, for `larder merge`");

  larder::CommonOptions check;
  auto* check_cmd = app.add_subcommand("check",
                                       "validate a scenario and describe it: size, policies, a "
                                       "drill exercise, estimated run time and memory");
  add_common(*check_cmd, check, true);

  larder::SweepArgs sweep;
  auto* sweep_cmd = app.add_subcommand(
      "sweep",
      "rerun a scenario with settings varied on one seed: a grid (--set, sweep.csv with "
      "frontiers) or one input at a time (--vary: the ranks of the policies at each value, "
      "ranks.csv, sensitivity.csv and a tornado table)");
  add_common(*sweep_cmd, sweep.common, true);
  sweep_cmd->add_option("-s,--set", sweep.set,
                        "PATH=V1,V2,... to vary; several --set make a grid. PATH walks the YAML by "
                        "dots, picking list elements by name or id (or * for all), e.g. "
                        "policies.per-item.quantity.target=0.6,0.7,0.8 or items.*.unit_cost=1,1.2");
  sweep_cmd->add_option("--vary", sweep.vary,
                        "PATH=-10%,+10% (or values): sensitivity, one input at a time. At each "
                        "value every policy is ranked on profit and on --waste-metric, saying "
                        "where the best policy changes (ranks.csv), with a tornado table of each "
                        "policy's profit difference against the baseline (sensitivity.csv); a "
                        "PATH without dots means every item's key, e.g. --vary price=-10%,+10%");
  sweep_cmd->add_option("--waste-metric", sweep.waste_metric,
                        "with --vary: the second metric policies are ranked on, by its field "
                        "name: waste_units, waste_share, waste_kg, co2e_kg, or any metric with a "
                        "better direction that the scenario reports [waste_units]");
  sweep_cmd->add_flag("--force", sweep.force,
                      "write into an existing, non-empty --out folder that holds no larder result "
                      "(files of larder's names are replaced)");
  sweep_cmd->add_option("-o,--out", sweep.out,
                        "folder for sweep.csv or sensitivity.csv and ranks.csv, and sweep.html "
                        "[larder-out/<scenario name>]");

  larder::MergeArgs merge;
  auto* merge_cmd = app.add_subcommand(
      "merge", "combine the shard files of `run --shard K/N` runs into the results of one run");
  merge_cmd
      ->add_option("DIR", merge.inputs,
                   "folders holding shard-K-of-N.json files (not their subfolders), or the files")
      ->required();
  merge_cmd->add_option("-o,--out", merge.out, "output folder [larder-out/<scenario name>]");
  merge_cmd->add_flag("-q,--quiet", merge.quiet, "no notes on stderr");
  merge_cmd->add_flag("--force", merge.force,
                      "write into an existing, non-empty --out folder that holds no larder result "
                      "(files of larder's names are replaced)");
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
                           "CSV file [larder-out/<scenario name>/allocation-<policy>.csv]: per "
                           "group (with why: critical ratio, demand cv, leftover, profit, cost "
                           "of one more point of in-stock), per store-item and the network");
  allocate_cmd
      ->add_option("--days", allocate.days,
                   "plan on this many days from --day and allocate once on the sum; "
                   "with -r N, N replications x this many days of plans [1]")
      ->check(CLI::Range(1, 3650));
  allocate_cmd->add_option("--rollout", allocate.rollout,
                           "also write the rollout table: per store-item its group, grouping "
                           "keys, item and store attributes, level and order basis per weekday");
  allocate_cmd->footer(
      "-r N plans from N replications (default 1 here, not the scenario's replications).");

  larder::HistoryArgs history;
  auto* history_cmd = app.add_subcommand(
      "history",
      "write what the stores would have recorded under one policy (one replication): the "
      "history format that `larder fit` reads");
  add_common(*history_cmd, history.common, true);
  history_cmd->add_option("-p,--policy", history.policy, "the policy whose days are recorded")
      ->required();
  history_cmd
      ->add_option("-o,--out", history.out,
                   "history CSV to write: one row per open store-item-day, columns "
                   "date,store,item,delivered,sold,leftover,sold_out (plus sold_out_time and "
                   "sales_HH when the scenario runs hour by hour); no true demand")
      ->required();
  history_cmd
      ->add_option("--replication", history.replication,
                   "which replication's days [0]; the same days as replication R of `larder run` "
                   "with the same seed")
      ->check(CLI::Range(0, 100000000));
  history_cmd->add_option("--items-out", history.items_out,
                          "also write the item file (item,price,unit_cost,shelf_life_days and "
                          "the item attributes), for `larder fit --items`");
  history_cmd->footer(
      "Rows cover every store, item and open day of the horizon, warm-up included, dated from\n"
      "horizon.start_date (without one, from an invented Monday 2027-01-04 moved to the\n"
      "scenario's start weekday). sold_out = 1 when nothing was left at close: demand was at\n"
      "least sold (censored). sold_out_time and sales_HH appear when the days run hour by hour.\n"
      "Network-planned policies (network_in_stock) re-plan across all stores as in `larder "
      "run`.\n\n"
      "Examples:\n"
      "  larder history my.yaml --policy per-item --out history.csv --items-out items.csv\n"
      "  larder fit history.csv --items items.csv --out fitted.yaml\n"
      "                                   estimate demand back from what the stores saw");

  larder::FitArgs fit;
  auto* fit_cmd = app.add_subcommand(
      "fit",
      "estimate demand from a sales history cut off by sell-outs and write it as a scenario");
  fit_cmd->add_option("HISTORY", fit.history, "history CSV (the format `larder history` writes)")
      ->required();
  fit_cmd->add_option("-o,--out", fit.out, "scenario file to write (YAML, format 1)")->required();
  fit_cmd->add_option("--items", fit.items,
                      "item file (item,price,unit_cost,shelf_life_days, other columns are "
                      "attributes); without it prices and costs are marked placeholders");
  fit_cmd
      ->add_option("--family", fit.family,
                   "demand family: auto (smallest AIC), poisson, negative_binomial or normal "
                   "[auto]")
      ->check(CLI::IsMember({"auto", "poisson", "negative_binomial", "normal"}));
  fit_cmd
      ->add_option("--min-days", fit.min_days,
                   "an item or store with fewer days that did not sell out is left out, not "
                   "guessed [28]")
      ->check(CLI::Range(1, 100000));
  fit_cmd->add_option("--name", fit.name, "scenario name [fitted-<history file name>]");
  fit_cmd->add_flag("--substitution", fit.substitution,
                    "also estimate substitute shares between the items jointly with each item's "
                    "own demand (censored likelihood of own plus substitute demand on the days "
                    "another item sold out; needs sales_HH and sold_out_time columns)");
  fit_cmd->add_flag("--check", fit.check,
                    "then replay the history's own deliveries on the fitted scenario and print "
                    "each item's sales and sell-out share in the history against the fitted "
                    "scenario's 95% range");
  fit_cmd
      ->add_option("--check-replications", fit.check_replications,
                   "replications of the --check replay [200]")
      ->check(CLI::Range(2, 100000));
  fit_cmd->add_option("-t,--threads", fit.threads, "worker threads for --check [all cores]")
      ->check(CLI::Range(0, 4096));
  fit_cmd->add_flag("-q,--quiet", fit.quiet, "no warnings on stderr");
  fit_cmd->footer(
      "Model: mean(store, item, day) = base(item) x size(store) x weekday(item, day), fitted by\n"
      "censored likelihood: a day that did not sell out scores P(demand = sales), a sold-out day\n"
      "P(demand >= sales): the last unit went, so demand was at least the sales (not more\n"
      "than them). Store sizes average 1; weekday multipliers average 1 over the item's weekdays,\n"
      "so base is the mean demand per open day at a size-1 store. The family (poisson,\n"
      "negative_binomial or normal, spread by cv) is the one with the smallest AIC. With hourly\n"
      "sales (sales_HH) the intraday profile comes from days that did not sell out; with\n"
      "sell-out times the base is also estimated by the exposure MLE, as a check (Poisson or,\n"
      "for spread items, gamma-mixed Poisson arrivals within the day). Each item's comment\n"
      "block in the scenario gives standard errors, the cv's 95% profile-likelihood interval\n"
      "(0 at the Poisson limit), the share of sold-out days, what sales-as-demand would give\n"
      "and the lag-7 and lag-1 correlations with 95% intervals (censored pairwise likelihood;\n"
      "reported, not written as demand_shocks). Items and stores with\n"
      "fewer than --min-days days that did not sell out (or fewer than 3 on a weekday) are\n"
      "listed and left out. The table on stdout shows the same per item. Without --items,\n"
      "prices and costs are written as placeholders marked # PLACEHOLDER, with a warning.\n"
      "--substitution fits item j's share for item i jointly with i's own demand: on a day\n"
      "j sold out while i was in stock, i's demand is its own plus the share of j's demand\n"
      "expected after j's sell-out (shares above twice their standard error are written).\n"
      "--check then replays the history's deliveries on the fitted scenario (--check-\n"
      "replications times) and prints each item's sales per day and sell-out share in the\n"
      "history against the fitted scenario's 95% range.\n\n"
      "Examples:\n"
      "  larder history my.yaml --policy habit --out history.csv --items-out items.csv\n"
      "  larder fit history.csv --items items.csv --out fitted.yaml\n"
      "  larder check fitted.yaml\n");

  larder::DrillArgs drill;
  auto* drill_cmd = app.add_subcommand(
      "drill",
      "a training drill: order a scenario's drill items day by day at the prompt (or score a "
      "decision file), then compare with the scenario's policies on the same customers");
  add_common(*drill_cmd, drill.common, false);
  drill_cmd->get_option("SCENARIO")
      ->description(
          "scenario file (YAML) with a drill: section (e.g. scenarios/drill-bakery.yaml)");
  drill_cmd->remove_option(drill_cmd->get_option("--replications"));  // one replication
  drill_cmd->remove_option(drill_cmd->get_option("--threads"));       // one store, one thread
  drill_cmd->add_option("--decisions", drill.decisions,
                        "score this CSV (day,store,item,quantity: the replay format; every "
                        "drill day with a delivery needs one row per drill item) instead of "
                        "prompting; a session's decisions.csv can be given back here");
  drill_cmd->add_option("--trainee", drill.trainee,
                        "the trainee's name in the scorecard and the output folder [trainee]");
  drill_cmd->add_option("-o,--out", drill.out,
                        "output folder [larder-out/<scenario name>/drill-<trainee>]: "
                        "decisions.csv (saved after every day), scorecard.json, scorecard.txt, "
                        "scorecard.html; with --summary: class.csv "
                        "[larder-out/<scenario name>-class]");
  drill_cmd->add_flag("--force", drill.force,
                      "write into an existing, non-empty --out folder that holds no larder "
                      "result (files of larder's names are replaced)");
  drill_cmd
      ->add_option("--summary", drill.summary,
                   "class view: the scorecards in these folders (or scorecard.json files) "
                   "of one exercise in one table; writes class.csv")
      ->expected(1, -1);
  drill_cmd->footer(
      "At the prompt, type one whole number per drill item in the order shown ('12 8 0');\n"
      "'=' in place of a number repeats that item's last order, 'r' repeats all of them,\n"
      "'?' shows help and 'q' stops (the orders so far stay in decisions.csv). A bad line\n"
      "gets a one-line message and the same day is asked again. The scenario's drill:\n"
      "section sets the store, items, days, comparison policies and surprise events.\n"
      "Examples:\n"
      "  larder drill scenarios/drill-bakery.yaml --trainee sam\n"
      "  larder drill scenarios/drill-bakery.yaml --decisions sam.csv --trainee sam\n"
      "  larder drill --summary larder-out/drill-bakery/drill-*\n");

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
        sweep.common.command_line = history.common.command_line = joined(argc, argv);
    drill.common.command_line = run.common.command_line;
    // Option values with the scenario keys' rules, before any command reads or creates anything.
    for (larder::CommonOptions* o :
         {&run.common, &check, &sweep.common, &allocate.common, &history.common, &drill.common}) {
      o->overrides.seed = larder::seed_option(o->seed_text);
      o->overrides.replications = larder::replications_option(o->replications_text);
    }
    run.mpi = mpi.world();
    if (run.mpi.rank != 0) run.common.quiet = true;  // rank 0 speaks for the run
    if (*run_cmd || app.get_subcommands().empty()) return larder::run_command(run);
    if (*check_cmd) return larder::check_command(check);
    if (*bench_cmd) return larder::bench_command(bench);
    if (*allocate_cmd) return larder::allocate_command(allocate);
    if (*sweep_cmd) return larder::sweep_command(sweep);
    if (*merge_cmd) return larder::merge_command(merge);
    if (*drill_cmd) return larder::drill_command(drill);
    if (*history_cmd) return larder::history_command(history);
    if (*fit_cmd) return larder::fit_command(fit);
  } catch (const larder::InputError& e) {
    std::fputs(e.what(), stderr);
    return 2;
  } catch (const std::exception& e) {
    fmt::print(stderr, "larder: error: {}\n", e.what());
    return 1;
  }
  return 0;
}
