#pragma once
// `larder merge` (cli.md): shards of one run combined into the RunResult a single run of all its
// replications gives, bit for bit. Every report is derived from the per-replication rows
// (run_result.hpp), so concatenating the rows in replication order is the whole merge; what needs
// care is refusing shards that do not make up one run.

#include <string>
#include <string_view>
#include <vector>

#include "sim/runner/shard.hpp"

namespace larder {

/// One shard as read, with the name its problems are reported under (its file).
struct ShardSource {
  std::string name;
  ShardResult shard;
};

/// Merges the shards of one run. The rows are concatenated in replication order; the run facts
/// are those of the lowest shard, except `replications` (the total), `seconds` (the sum of the
/// shards' simulation times) and `threads` (the most any shard used).
/// Throws InputError listing every problem: shards of different runs (scenario, its text, seed,
/// replications, shard count, larder version, policies, metrics, breakdown keys), interrupted
/// shards, a shard or replication given twice, and missing shards (reported against `inputs`, a
/// description of where the shards were looked for).
RunResult merge_shards(const std::vector<ShardSource>& sources, std::string_view inputs);

}  // namespace larder
