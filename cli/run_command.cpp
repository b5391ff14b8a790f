#include <fmt/format.h>

#include <cstdio>
#include <filesystem>

#include "cli/commands.hpp"
#include "cli/interrupt.hpp"
#include "cli/mpi_world.hpp"
#include "cli/progress.hpp"
#include "cli/run_outputs.hpp"
#include "policies/quantity/rule_warnings.hpp"
#include "reports/atomic_file.hpp"
#include "reports/comparison.hpp"
#include "reports/html_report.hpp"
#include "reports/output_claim.hpp"
#include "reports/output_folder.hpp"
#include "reports/output_path.hpp"
#include "reports/shard_file.hpp"
#include "reports/summary_json.hpp"
#include "reports/terminal_table.hpp"
#include "sim/runner/memory_limit.hpp"
#include "sim/runner/monte_carlo.hpp"
#include "sim/runner/precision.hpp"
#include "sim/runner/shard_merge.hpp"
#include "sim/scenario/scenario_warnings.hpp"

namespace larder {

namespace {

/// --precision, checked against the other options (nullopt when not given).
std::optional<PrecisionTarget> precision_option(const RunArgs& args, const Scenario& sc) {
  if (args.precision.empty()) return std::nullopt;
  Diagnostics d;
  const auto target = parse_precision(args.precision);
  if (!target) {
    d.error({sc.file, 0, 0},
            fmt::format("--precision {}: expected METRIC=HALF_WIDTH, e.g. profit=0.5% or "
                        "difference:waste_units=20",
                        args.precision),
            "METRIC is a metric name of model.md (see metrics.csv)");
  } else if (!args.shard.empty()) {
    d.error({sc.file, 0, 0}, "--precision and --shard cannot be combined",
            "shards need a fixed number of replications; run --precision once without shards");
  }
  if (!d.ok()) throw InputError(d);
  return target;
}

}  // namespace

int run_command(const RunArgs& args) {
  PreparedScenario prepared = prepare_scenario(args.common.scenario, args.common.overrides);
  const Scenario& sc = prepared.scenario;
  if (!args.common.quiet) {
    for (const std::string& w : scenario_warnings(sc)) fmt::print(stderr, "{}\n", w);
    for (const std::string& w : setting_warnings(sc)) fmt::print(stderr, "{}\n", w);
    for (const std::string& w : rule_warnings(sc)) fmt::print(stderr, "{}\n", w);
  }
  if (!sc.seed_given && !args.common.quiet) {
    fmt::print(stderr, "seed {} was drawn at random; pass --seed {} to repeat this run\n", sc.seed,
               sc.seed);
  }
  // Under mpirun every rank runs one slice, as --shard rank+1/size would (mpi_world.hpp).
  const bool mpi = args.mpi.size > 1;
  if (mpi && !args.shard.empty()) {
    Diagnostics d;
    d.error({sc.file, 0, 0}, "--shard cannot be combined with mpirun",
            "mpirun already splits the replications among its ranks");
    throw InputError(d);
  }
  const RunSlice slice =
      run_slice(mpi ? fmt::format("{}/{}", args.mpi.rank + 1, args.mpi.size) : args.shard,
                sc.replications, sc.seed_given);
  // Every option is checked before anything is created (a bad --precision leaves no folder).
  const std::optional<PrecisionTarget> precision = precision_option(args, sc);
  if (mpi && precision) {
    Diagnostics d;
    d.error({sc.file, 0, 0}, "--precision cannot be combined with mpirun");
    throw InputError(d);
  }
  check_memory(sc, prepared.policies, args.common.threads, args.max_memory);
  const std::filesystem::path dir = args.out.empty() ? std::filesystem::path("larder-out") / sc.name
                                                     : std::filesystem::path(args.out);
  std::vector<std::string> names = run_output_names();
  if (slice.shard) names.push_back(shard_file_name(*slice.shard));
  check_output_folder(dir, names, {{args.common.scenario, "the scenario"}});
  claim_output_folder(dir, args.force);  // before simulating: a refusal costs nothing
  Progress progress("replications", args.common.quiet);
  const InterruptGuard interrupt;  // Ctrl-C stops after the current batch (interrupt.hpp)
  RunOptions options;
  options.threads = args.common.threads;
  options.first_replication = slice.range.first;
  options.replications = slice.range.count;
  options.stop = &interrupt.stop_flag();
  options.progress = [&](int done, int total) { progress.update(done, total); };
  RunResult result = precision ? run_to_precision(sc, prepared.policies, options, *precision,
                                                  args.max_replications)
                               : run_policies(sc, prepared.policies, options);
  progress.finish();
  // A shard's results, once merged, are those of the run without --shard.
  result.info.command = without_shard_option(args.common.command_line);
  if (!sc.seed_given) result.info.command += fmt::format(" --seed {}", sc.seed);

  RunSlice written = slice;
  if (mpi) {
    // Rank 0 gathers every rank's slice and merges them into the whole run.
    const RunTarget mine{
        dir, slice, sc.replications, args.common.scenario, args.common.command_line, false, ""};
    const std::vector<std::string> texts =
        gather_on_root(shard_file_text(as_shard(result, mine, !interrupt.interrupted())));
    if (args.mpi.rank != 0) return 0;
    std::vector<ShardSource> sources;
    for (size_t r = 0; r < texts.size(); ++r) {
      sources.push_back({fmt::format("rank {}", r), parse_shard_file(texts[r])});
    }
    const std::string command = result.info.command;
    result = merge_shards(sources, "the mpirun ranks");
    result.info.command = command;
    written = RunSlice{std::nullopt, {0, sc.replications}};
  }
  // Stopped early: fewer replications than asked, or a --precision run cut short.
  const bool stopped =
      interrupt.interrupted() && (precision || result.info.replications < written.range.count);
  RunTarget target{
      dir, written, sc.replications, args.common.scenario, args.common.command_line, stopped, ""};
  if (!written.shard && !stopped && result.info.replications > 0) {
    // A whole run, finished: report.html belongs to the same set as the other files.
    const DailyTrace trace = daily_trace(sc, prepared.policies, written.range.first);
    target.report_html = html_report(result, report_context(sc, trace));
  }
  const RunOutcome outcome = write_run_results(result, target);
  if (outcome.show_results && args.common.format == "json") {
    fmt::print("{}\n", summary_json(result).dump(2));
  } else if (outcome.show_results) {
    fmt::print("{}", comparison_table(result));
  }
  std::fflush(stdout);
  if (outcome.show_results && !args.common.quiet) {
    for (const std::string& w : target_warnings(result)) fmt::print(stderr, "{}\n", w);
  }
  if (!args.common.quiet || outcome.exit_code != 0) fmt::print(stderr, "{}\n", outcome.note);
  return outcome.exit_code;
}

}  // namespace larder
