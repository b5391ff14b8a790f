#pragma once
// `larder run --shard K/N`: which replications this run simulates, and the digest of the scenario
// text that tells merge the shards belong together.

#include <optional>
#include <string>

#include "sim/runner/shard.hpp"

namespace larder {

/// The replications `larder run` simulates: every one, or one shard's slice.
struct RunSlice {
  std::optional<ShardSpec> shard;  ///< none: the whole run
  ReplicationRange range;          ///< global replication ids to run
};

/// The slice for `--shard` (`text`; "" = the whole run) among `replications`. Throws InputError
/// when the text is not K/N with 1 <= K <= N, N exceeds the replications (a shard would be
/// empty), or the seed was drawn at random (`seed_given` false: each shard would draw its own).
RunSlice run_slice(const std::string& text, int replications, bool seed_given);

/// The scenario's text: the file at `path`, or the built-in demo when "".
std::string scenario_text(const std::string& path);

}  // namespace larder
