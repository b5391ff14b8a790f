#pragma once
// Where `larder run` puts what it simulated (README, Outputs):
//   - the whole run, finished: the output files in the folder (write_run_outputs);
//   - a shard, finished: `shard-K-of-N.json` in the folder, for `larder merge`;
//   - interrupted (Ctrl-C): the same files for the finished replications, in `<folder>/partial/`,
//     exit code 130; nothing at all when no replication finished.
// A finished run removes what an earlier interrupted run of the same kind left in `partial/`.

#include <filesystem>
#include <string>

#include "cli/shard_option.hpp"
#include "sim/runner/run_result.hpp"
#include "sim/runner/shard.hpp"

namespace larder {

/// What the results belong to.
struct RunTarget {
  std::filesystem::path dir;   ///< the output folder
  RunSlice slice;              ///< the replications asked for
  int total_replications = 0;  ///< of the whole run (every shard)
  std::string scenario_path;   ///< "" = the built-in demo (its text identifies a shard's run)
  std::string command_line;    ///< as typed
  bool stopped = false;        ///< Ctrl-C stopped the run before it finished its work
  std::string report_html;     ///< report.html of a whole, finished run ("" = none)
};

/// What was written, for the command to report.
struct RunOutcome {
  int exit_code = 0;          ///< 0, or 130 when interrupted before the slice finished
  bool show_results = false;  ///< print the comparison (not for a shard, nor for nothing)
  std::string note;           ///< one line for stderr: what went where
};

/// The shard file content of a finished or stopped slice (`target.slice.shard` set).
ShardResult as_shard(const RunResult& result, const RunTarget& target, bool complete);

/// Writes `result` (the replications of `target.slice` that finished, from its first: all of
/// them unless `target.stopped`) and says what it did.
RunOutcome write_run_results(const RunResult& result, const RunTarget& target);

}  // namespace larder
