// Shards merged equal a single run, bit for bit (the reference is the single run itself: same
// seed, same replications, one process). The scenario has a network_in_stock policy (phased runs,
// planned levels in the breakdown) and substitution (substitution.csv), and the shards run on a
// different thread count from the single run and go through their file text, as `larder merge`
// reads them. Merge errors name the files involved.

#include <bit>
#include <catch2/catch.hpp>
#include <cstdint>
#include <cstring>

#include "reports/breakdown_csv.hpp"
#include "reports/metrics_csv.hpp"
#include "reports/replications_csv.hpp"
#include "reports/shard_file.hpp"
#include "reports/substitution_csv.hpp"
#include "reports/summary_json.hpp"
#include "sim/runner/shard_merge.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

const char* kScenario = R"(format: 1
name: shard-check
seed: 4242
horizon: { days: 56, warmup_days: 14 }
replications: 7
stores: { count: 3, size: { lognormal_cv: 0.3 } }
item_defaults:
  demand: { distribution: negative_binomial, cv: 0.4 }
items:
  - { id: loaf, price: 3, unit_cost: 1, attributes: { type: bread }, demand: { base: 12 }, substitutes: { roll: 0.4 } }
  - { id: roll, price: 1, unit_cost: 0.3, attributes: { type: bread }, demand: { base: 25 } }
  - { id: tart, price: 4, unit_cost: 2.5, shelf_life_days: 2, attributes: { type: pastry }, demand: { base: 5 } }
policies:
  - name: flat
    forecast: { method: ses_weekday, alpha: 0.2 }
    censoring: normal_tail
    quantity: { rule: in_stock_target, level: 0.7 }
  - name: per-item
    forecast: { method: ses_weekday, alpha: 0.2 }
    censoring: normal_tail
    quantity: { rule: network_in_stock, target: 0.7, groups: item }
baseline: flat
)";

/// Shard k of n of `scenario` as `larder run --shard k/n` would write it, read back from text.
ShardSource shard_of(const Scenario& scenario, const std::vector<Policy>& policies, ShardSpec k,
                     int threads) {
  const ReplicationRange range = shard_range(k, scenario.replications);
  RunOptions o;
  o.threads = threads;
  o.first_replication = range.first;
  o.replications = range.count;
  ShardResult s;
  s.shard = k;
  s.total_replications = scenario.replications;
  s.scenario_text = kScenario;
  s.scenario_digest = scenario_digest(kScenario);
  for (int id = range.first; id < range.first + range.count; ++id) s.replication_ids.push_back(id);
  s.result = run_policies(scenario, policies, o);
  return {shard_file_name(k), parse_shard_file(shard_file_text(s))};
}

/// summary.json without the fields that describe how the run went, not what it found.
std::string summary_without_volatile(const RunResult& r) {
  nlohmann::json j = summary_json(r);
  for (const char* key : {"command", "threads", "seconds"}) j.erase(key);
  return j.dump(2);
}

bool same_bits(const std::vector<MetricVector>& a, const std::vector<MetricVector>& b) {
  return a.size() == b.size() &&
         (a.empty() || std::memcmp(a.data(), b.data(), a.size() * sizeof(MetricVector)) == 0);
}

/// The text of `j` with its content digest recomputed, as a forger who knows the format would
/// write it: what the range checks must still catch.
std::string resigned(nlohmann::json j) {
  j.erase("content_digest");
  const std::string digest =
      scenario_digest(j.dump(-1, ' ', false, nlohmann::json::error_handler_t::replace));
  j["content_digest"] = digest;
  return j.dump();
}

struct Fixture {
  Scenario scenario = test::scenario_from(kScenario);
  std::vector<Policy> policies = test::policies_for(scenario);
  std::vector<ShardSource> shards(int n, int threads) {
    std::vector<ShardSource> out;
    for (int k = 1; k <= n; ++k) out.push_back(shard_of(scenario, policies, {k, n}, threads));
    return out;
  }
};

std::string merge_error(const std::vector<ShardSource>& sources) {
  try {
    merge_shards(sources, "dirs");
  } catch (const InputError& e) {
    return e.what();
  }
  return "(no error)";
}

TEST_CASE("shards 1/3 + 2/3 + 3/3 merged equal a single run, bit for bit", "[shard]") {
  Fixture f;
  RunOptions o;
  o.threads = 2;
  const RunResult single = run_policies(f.scenario, f.policies, o);
  // The scenario exercises what the merge must carry: substitution and planned levels.
  REQUIRE(!single.substitution_pairs.empty());
  REQUIRE(!single.breakdown[1].planned_level.empty());

  std::vector<ShardSource> shards = f.shards(3, 1);
  CHECK(shards[0].shard.replication_ids.size() == 2);  // 7 replications: 2, 2 and 3
  CHECK(shards[2].shard.replication_ids.size() == 3);
  std::swap(shards[0], shards[2]);  // the order of the inputs does not matter
  const RunResult merged = merge_shards(shards, "test");

  CHECK(merged.info.replications == 7);
  CHECK(metrics_csv(merged) == metrics_csv(single));
  CHECK(replications_csv(merged) == replications_csv(single));
  CHECK(breakdown_csv(merged) == breakdown_csv(single));
  CHECK(substitution_csv(merged) == substitution_csv(single));
  CHECK(summary_without_volatile(merged) == summary_without_volatile(single));
  // Every number of the RunResult, reported or not (NaN included), bit for bit.
  for (size_t p = 0; p < single.values.size(); ++p) {
    CHECK(same_bits(merged.values[p], single.values[p]));
    CHECK(merged.substituted[p] == single.substituted[p]);
    const PolicyBreakdown& a = merged.breakdown[p];
    const PolicyBreakdown& b = single.breakdown[p];
    REQUIRE(a.values.size() == b.values.size());
    for (size_t r = 0; r < a.values.size(); ++r) CHECK(same_bits(a.values[r], b.values[r]));
    CHECK(a.planned_level == b.planned_level);
    CHECK(a.planned_in_stock == b.planned_in_stock);
  }
}

TEST_CASE("merge refuses a missing shard, a duplicate and shards of another seed", "[shard]") {
  Fixture f;
  std::vector<ShardSource> shards = f.shards(3, 2);

  SECTION("missing") {
    shards.erase(shards.begin() + 1);
    CHECK_THAT(merge_error(shards),
               Catch::Contains("dirs: error: shard 2 of 3 (replications 2 to 3) is missing"));
  }
  SECTION("duplicate") {
    ShardSource copy = shards[0];
    copy.name = "copy.json";
    shards.push_back(copy);
    CHECK_THAT(merge_error(shards),
               Catch::Contains("copy.json: error: shard 1 of 3 is also in shard-1-of-3.json"));
  }
  SECTION("another seed") {
    Scenario other = f.scenario;
    other.seed = 4243;
    const std::vector<Policy> policies = test::policies_for(other);
    shards[1] = shard_of(other, policies, {2, 3}, 2);
    CHECK_THAT(merge_error(shards),
               Catch::Contains("shard-2-of-3.json: error: seed is 4243 but shard-1-of-3.json has "
                               "4242"));
  }
  SECTION("another shard count") {
    shards[2] = shard_of(f.scenario, f.policies, {2, 2}, 2);
    shards[2].name = "halves.json";
    CHECK_THAT(merge_error(shards),
               Catch::Contains("halves.json: error: shard count is 2 but shard-1-of-3.json has 3"));
  }
  SECTION("an interrupted shard") {
    shards[1].shard.complete = false;
    CHECK_THAT(merge_error(shards),
               Catch::Contains("shard-2-of-3.json: error: shard 2 of 3 was interrupted"));
  }
  SECTION("an edited scenario") {
    shards[1].shard.scenario_digest = scenario_digest("edited");
    CHECK_THAT(merge_error(shards), Catch::Contains("scenario text (digest) is"));
  }
  SECTION("nothing") {
    CHECK_THAT(merge_error({}), Catch::Contains("dirs: error: no shard files"));
  }
}

TEST_CASE("a damaged shard file is refused with a reason", "[shard]") {
  Fixture f;
  const ShardSource s = shard_of(f.scenario, f.policies, {1, 3}, 2);
  const std::string text = shard_file_text(s.shard);
  CHECK_THROWS_WITH(parse_shard_file(text.substr(0, text.size() / 2)),
                    Catch::Contains("not JSON, or cut short"));
  CHECK_THROWS_WITH(parse_shard_file("{\"format\": \"other\"}"),
                    Catch::Contains("not a larder shard file"));
  nlohmann::json j = nlohmann::json::parse(text);
  j["run"]["values"][0].erase(0);
  CHECK_THROWS_WITH(parse_shard_file(resigned(j)), Catch::Contains("expected 2 entries, found 1"));
  j = nlohmann::json::parse(text);
  j["format_version"] = 99;
  CHECK_THROWS_WITH(parse_shard_file(j.dump()), Catch::Contains("format 99 is not supported"));
}

TEST_CASE("a shard file with one changed digit or an injected number is refused", "[shard]") {
  // Issue 23: the digest covers every number and run fact, so an edit anywhere is found.
  Fixture f;
  const ShardSource s = shard_of(f.scenario, f.policies, {2, 3}, 2);
  const std::string text = shard_file_text(s.shard);
  REQUIRE_NOTHROW(parse_shard_file(text));
  // One digit of the first per-replication value.
  const size_t values = text.find("\"values\":[[[");
  REQUIRE(values != std::string::npos);
  size_t digit = text.find_first_of("0123456789", values + 12);
  std::string edited = text;
  edited[digit] = edited[digit] == '9' ? '8' : static_cast<char>(edited[digit] + 1);
  CHECK_THROWS_WITH(parse_shard_file(edited),
                    Catch::Contains("its content does not match its digest"));
  // A value replaced by NaN or 1e308, and a fact changed: the same.
  nlohmann::json j = nlohmann::json::parse(text);
  j["run"]["values"][0][0][0] = "nan:7ff8000000000001";
  CHECK_THROWS_WITH(parse_shard_file(j.dump()), Catch::Contains("does not match its digest"));
  j = nlohmann::json::parse(text);
  j["run"]["values"][0][0][0] = 1e308;
  CHECK_THROWS_WITH(parse_shard_file(j.dump()), Catch::Contains("does not match its digest"));
  j = nlohmann::json::parse(text);
  j["run"]["info"]["seed"] = 12;
  CHECK_THROWS_WITH(parse_shard_file(j.dump()), Catch::Contains("does not match its digest"));
  j = nlohmann::json::parse(text);
  j.erase("content_digest");
  CHECK_THROWS_WITH(parse_shard_file(j.dump()), Catch::Contains("carries no digest"));
}

TEST_CASE("every integer of a shard file is range-checked before conversion", "[shard]") {
  // Even with a digest that matches (recomputed), huge or negative counts never wrap.
  Fixture f;
  const ShardSource s = shard_of(f.scenario, f.policies, {2, 3}, 2);
  const nlohmann::json base = nlohmann::json::parse(shard_file_text(s.shard));
  const auto with = [&](const nlohmann::json::json_pointer& at, const nlohmann::json& value) {
    nlohmann::json j = base;
    j[at] = value;
    return resigned(j);
  };
  using ptr = nlohmann::json::json_pointer;
  CHECK_THROWS_WITH(parse_shard_file(with(ptr("/shards"), 3567587328LL)),
                    Catch::Contains("shards is 3567587328; expected a whole number from 1 to"));
  CHECK_THROWS_WITH(parse_shard_file(with(ptr("/shard"), -1)),
                    Catch::Contains("shard is -1; expected a whole number from 1 to 3"));
  CHECK_THROWS_WITH(parse_shard_file(with(ptr("/replications_total"), 1e308)),
                    Catch::Contains("replications_total is 1e+308; expected a whole number"));
  CHECK_THROWS_WITH(parse_shard_file(with(ptr("/run/info/replications"), 2147483648LL)),
                    Catch::Contains("replications is 2147483648; expected a whole number"));
  CHECK_THROWS_WITH(parse_shard_file(with(ptr("/replication_ids/0"), 99)),
                    Catch::Contains("a replication id is 99; expected a whole number from 0 to 6"));
  CHECK_THROWS_WITH(parse_shard_file(with(ptr("/run/info/seed"), -5)),
                    Catch::Contains("seed is -5; expected a whole number from 0 to"));
  CHECK_THROWS_WITH(parse_shard_file(with(ptr("/run/baseline"), 7)),
                    Catch::Contains("baseline (a policy index) is 7"));
}

}  // namespace
}  // namespace larder
