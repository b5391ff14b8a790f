#include "cli/shard_option.hpp"

#include <fmt/format.h>

#include "cli/demo_scenario.hpp"
#include "sim/scenario/diagnostics.hpp"
#include "sim/scenario/load_scenario.hpp"

namespace larder {

namespace {

[[noreturn]] void bad_shard(std::string message, std::string hint = {}) {
  Diagnostics diag;
  diag.error({"--shard"}, std::move(message), std::move(hint));
  throw InputError(diag);
}

}  // namespace

RunSlice run_slice(const std::string& text, int replications, bool seed_given) {
  if (text.empty()) return {std::nullopt, {0, replications}};
  const std::optional<ShardSpec> shard = parse_shard(text);
  if (!shard) {
    bad_shard(fmt::format("expected K/N with whole numbers 1 <= K <= N (got '{}')", text),
              "--shard 2/4 runs the second of four slices of the replications");
  }
  if (shard->count > replications) {
    bad_shard(fmt::format("{} shards of {} replications would leave some empty", shard->count,
                          replications),
              "use at most as many shards as replications");
  }
  if (!seed_given) {
    bad_shard("a shard needs the run's seed, but this scenario has none",
              "pass the same --seed S to every shard");
  }
  return {shard, shard_range(*shard, replications)};
}

std::string scenario_text(const std::string& path) {
  if (path.empty()) return demo_scenario_text();
  return read_scenario_text(path);
}

}  // namespace larder
