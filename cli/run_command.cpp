#include <fmt/format.h>

#include <cstdio>
#include <filesystem>

#include "cli/commands.hpp"
#include "cli/progress.hpp"
#include "reports/output_folder.hpp"
#include "reports/summary_json.hpp"
#include "reports/terminal_table.hpp"
#include "sim/runner/monte_carlo.hpp"

namespace larder {

int run_command(const RunArgs& args) {
  PreparedScenario prepared = prepare_scenario(args.common.scenario, args.common.overrides);
  const Scenario& sc = prepared.scenario;
  if (!sc.seed_given && !args.common.quiet) {
    fmt::print(stderr, "seed {} was drawn at random; pass --seed {} to repeat this run\n", sc.seed,
               sc.seed);
  }
  Progress progress("replications", args.common.quiet);
  RunOptions options;
  options.threads = args.common.threads;
  options.progress = [&](int done, int total) { progress.update(done, total); };
  RunResult result = run_policies(sc, prepared.policies, options);
  progress.finish();
  result.info.command = args.common.command_line;
  if (!sc.seed_given) result.info.command += fmt::format(" --seed {}", sc.seed);

  const std::filesystem::path dir = args.out.empty() ? std::filesystem::path("larder-out") / sc.name
                                                     : std::filesystem::path(args.out);
  write_run_outputs(result, dir);
  if (args.common.format == "json") {
    fmt::print("{}\n", summary_json(result).dump(2));
  } else {
    fmt::print("{}", comparison_table(result));
  }
  std::fflush(stdout);
  if (!args.common.quiet) {
    fmt::print(stderr, "results written to {} ({} replications in {})\n", dir.string(),
               result.info.replications, format_duration(result.info.seconds));
  }
  return 0;
}

}  // namespace larder
