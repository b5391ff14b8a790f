// `larder merge DIR...` (cli.md): the shard files of one run combined into the output files a
// single run with the same seed and replications writes, bit for bit (sim/runner/shard_merge.hpp).

#include <fmt/format.h>
#include <fmt/ranges.h>

#include <cstdio>
#include <filesystem>

#include "cli/commands.hpp"
#include "policies/policy.hpp"
#include "reports/atomic_file.hpp"
#include "reports/comparison.hpp"
#include "reports/html_report.hpp"
#include "reports/output_claim.hpp"
#include "reports/output_folder.hpp"
#include "reports/output_path.hpp"
#include "reports/shard_file.hpp"
#include "reports/summary_json.hpp"
#include "reports/terminal_table.hpp"
#include "sim/runner/daily_trace.hpp"
#include "sim/scenario/load_scenario.hpp"

namespace larder {

namespace {

/// The default output folder, larder-out/<scenario name>, refusing a name from a file that could
/// point elsewhere (scenario names are letters, digits, `_`, `-` and `.`).
std::filesystem::path default_folder(const std::string& name) {
  const bool safe = !name.empty() && name != "." && name != ".." &&
                    name.find_first_not_of(
                        "abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ"
                        "0123456789_-.") == std::string::npos;
  if (!safe) {
    Diagnostics diag;
    diag.error({"merge"}, fmt::format("the shards' scenario name '{}' cannot name a folder", name),
               "pass --out DIR");
    throw InputError(diag);
  }
  return std::filesystem::path("larder-out") / name;
}

/// report.html as `larder run` writes it, from the scenario text the shards carry (its sample
/// store-item is simulated again, replication 0). Throws std::runtime_error when the scenario
/// cannot be rebuilt here (a policy reading a file that is not on this machine, say).
std::string merged_report(const ShardResult& shard, const RunResult& merged) {
  Diagnostics diag;
  std::optional<Scenario> sc = parse_scenario(shard.scenario_text, merged.info.scenario_file, diag);
  if (!sc) throw std::runtime_error(diag.format());
  sc->replications = merged.info.replications;
  sc->seed = merged.info.seed;
  sc->seed_given = true;
  const std::vector<Policy> policies = build_policies(*sc, diag);
  if (!diag.ok()) throw std::runtime_error(diag.format());
  return html_report(merged, report_context(*sc, daily_trace(*sc, policies, 0)));
}

}  // namespace

int merge_command(const MergeArgs& args) {
  const std::vector<ShardSource> shards = read_shard_files(args.inputs);
  const RunResult merged = merge_shards(shards, fmt::format("{}", fmt::join(args.inputs, ", ")));
  const std::filesystem::path dir = args.out.empty() ? default_folder(merged.info.scenario_name)
                                                     : std::filesystem::path(args.out);
  std::vector<InputFile> inputs;
  for (const ShardSource& s : shards) inputs.push_back({s.name, "a shard file"});
  check_output_folder(dir, run_output_names(), inputs);
  claim_output_folder(dir, args.force);
  std::vector<ResultFile> extra;
  try {
    extra.push_back({"report.html", merged_report(shards.front().shard, merged)});
  } catch (const std::exception& e) {
    fmt::print(stderr, "larder: note: report.html not written: {}\n", e.what());
  }
  write_run_outputs(merged, dir, std::move(extra));
  if (args.format == "json") {
    fmt::print("{}\n", summary_json(merged).dump(2));
  } else {
    fmt::print("{}", comparison_table(merged));
  }
  std::fflush(stdout);
  if (!args.quiet) {
    for (const std::string& w : target_warnings(merged)) fmt::print(stderr, "{}\n", w);
    fmt::print(stderr, "merged {} shard files ({} replications) into {}\n", shards.size(),
               merged.info.replications, dir.string());
  }
  return 0;
}

}  // namespace larder
