#pragma once
// Shards (cli.md, `--shard K/N`): a run's replications split into N disjoint slices that can run
// on different machines and be merged into the result of one run. Draws depend only on the global
// replication id (monte_carlo.hpp), so a shard simulates exactly what a single run would for its
// replications.

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "sim/runner/run_result.hpp"

namespace larder {

/// Shard K of N (both 1-based, 1 <= K <= N).
struct ShardSpec {
  int index = 1;  ///< K
  int count = 1;  ///< N
  friend bool operator==(const ShardSpec&, const ShardSpec&) = default;
};

/// "K/N" with whole numbers 1 <= K <= N; nullopt for anything else.
std::optional<ShardSpec> parse_shard(std::string_view text);

/// Replications first, first + 1, ..., first + count - 1.
struct ReplicationRange {
  int first = 0;
  int count = 0;
  friend bool operator==(const ReplicationRange&, const ReplicationRange&) = default;
};

/// The replications of shard `s` among `replications` (ids 0 .. replications - 1): contiguous
/// blocks in shard order, shard K taking ids floor((K - 1) R / N) up to floor(K R / N) - 1, so
/// block sizes differ by at most one and every id belongs to exactly one shard.
ReplicationRange shard_range(ShardSpec s, int replications);

/// What one shard run wrote: its slice of a RunResult and what identifies the run it belongs to.
struct ShardResult {
  ShardSpec shard;
  int total_replications = 0;        ///< replications of the whole run (every shard)
  std::string scenario_text;         ///< the scenario file as read (rebuilds it for reports)
  std::string scenario_digest;       ///< of scenario_text (scenario_digest)
  std::string shard_command;         ///< the command line that ran this shard, as typed
  std::vector<int> replication_ids;  ///< the global id of each row of `result`, in row order
  bool complete = true;              ///< false when the shard run was interrupted
  RunResult result;                  ///< info.replications = replication_ids.size()
};

/// A fingerprint of a scenario's text (FNV-1a, 64 bits, as 16 hex digits), so shards of edited
/// copies of a scenario are not merged; file paths may differ between machines.
std::string scenario_digest(std::string_view text);

/// `command` without its `--shard K/N` (or `--shard=K/N`) option: the single run that
/// reproduces a merged result.
std::string without_shard_option(std::string_view command);

}  // namespace larder
