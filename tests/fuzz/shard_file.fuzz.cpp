// Fuzz target: a shard file as `larder merge` reads it (reports/shard_file.hpp,
// parse_shard_file), then merged alone (sim/runner/shard_merge.hpp). Each input is read twice:
// as it is (almost always refused by the content digest), and signed again, its digests
// recomputed as a writer would, so that the fuzzer reaches the checks behind the digest.
// Contract checked on every input: no crash, hang or sanitizer report; a shard or
// std::runtime_error with a message, never another exception; an accepted shard is within its
// limits (1 <= shard <= shards, replication ids below the total and one per replication, one
// row of values per policy and replication) and written back it reads as the same text;
// merge_shards gives a result or InputError. Crashes found become tests in
// tests/fuzz_regressions.test.cpp.

#include "reports/shard_file.hpp"

#include <cstddef>
#include <cstdint>
#include <nlohmann/json.hpp>
#include <stdexcept>
#include <string>

#include "sim/runner/shard_merge.hpp"
#include "sim/scenario/diagnostics.hpp"

namespace {

using nlohmann::json;

/// `text` with its digests made right, as shard_file_text makes them (the canonical compact dump
/// of every field but content_digest, digested by scenario_digest); empty when not a JSON object.
std::string signed_again(const std::string& text) {
  json j = json::parse(text, nullptr, false);
  if (j.is_discarded() || !j.is_object()) return {};
  j.erase("content_digest");
  const auto scenario = j.find("scenario_text");
  if (scenario != j.end() && scenario->is_string()) {
    j["scenario_digest"] = larder::scenario_digest(scenario->get<std::string>());
  }
  j["content_digest"] =
      larder::scenario_digest(j.dump(-1, ' ', false, json::error_handler_t::replace));
  return j.dump(-1, ' ', false, json::error_handler_t::replace);
}

void check(const std::string& text) {
  larder::ShardResult s;
  try {
    s = larder::parse_shard_file(text);
  } catch (const std::runtime_error& e) {
    if (std::string(e.what()).empty()) __builtin_trap();
    return;
  }
  if (s.shard.count < 1 || s.shard.index < 1 || s.shard.index > s.shard.count) __builtin_trap();
  if (s.replication_ids.size() != static_cast<size_t>(s.result.info.replications)) __builtin_trap();
  for (const int id : s.replication_ids)
    if (id < 0 || id >= s.total_replications) __builtin_trap();
  if (s.result.values.size() != s.result.policies.size()) __builtin_trap();
  for (const auto& per_policy : s.result.values)
    if (per_policy.size() != s.replication_ids.size()) __builtin_trap();
  // Written back, it reads back as itself.
  const std::string again = larder::shard_file_text(s);
  try {
    if (larder::shard_file_text(larder::parse_shard_file(again)) != again) __builtin_trap();
  } catch (const std::runtime_error&) {
    __builtin_trap();
  }
  try {
    (void)larder::merge_shards({{"shard.json", s}}, "the fuzz input");
  } catch (const larder::InputError& e) {
    if (e.diagnostics().ok()) __builtin_trap();
  }
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  check(text);
  const std::string resigned = signed_again(text);
  if (!resigned.empty()) check(resigned);
  return 0;
}
