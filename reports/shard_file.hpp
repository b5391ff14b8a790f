#pragma once
// The file a `larder run --shard K/N` writes (`shard-K-of-N.json`) and `larder merge` reads: which
// run and slice it is (scenario, its text and a digest of it, seed, K, N, the replication ids)
// and every per-replication number of its RunResult, doubles exact (run_result_json.hpp).
// Compact JSON: the file is for larder, not for reading, and its rows can be many.

#include <cstddef>
#include <filesystem>
#include <string>
#include <string_view>
#include <vector>

#include "sim/runner/shard_merge.hpp"

namespace larder {

/// The largest shard file `merge` reads (about 2 million replications of 10 policies).
inline constexpr std::size_t kMaxShardFileBytes = std::size_t{1} << 30;

/// "shard-K-of-N.json".
std::string shard_file_name(ShardSpec s);

/// The text of a shard file. Layout: {"format": "larder-shard", "format_version": 1, "shard": K,
/// "shards": N, "complete", "replications_total", "replication_ids", "scenario_digest",
/// "scenario_text", "shard_command", "run": run_result_json}, with a final newline.
std::string shard_file_text(const ShardResult& shard);

/// The shard a file's text describes. Throws std::runtime_error saying what is wrong (not JSON,
/// not a shard file, another format version, a missing field, counts that do not match).
ShardResult parse_shard_file(std::string_view text);

/// Every shard among `paths`: a folder contributes its files named shard-K-of-N.json (not its
/// subfolders, so `partial/` is left out), a file itself. Throws InputError naming each path that
/// is missing, unreadable or not a shard file, and each folder without shard files.
std::vector<ShardSource> read_shard_files(const std::vector<std::string>& paths);

}  // namespace larder
