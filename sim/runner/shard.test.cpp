// Shard slicing, the --shard parser, the scenario digest and the rerun command, checked by hand
// and against the published FNV-1a test vectors.

#include "sim/runner/shard.hpp"

#include <catch2/catch.hpp>
#include <vector>

namespace larder {
namespace {

TEST_CASE("parse_shard accepts K/N with 1 <= K <= N only", "[shard]") {
  CHECK(parse_shard("1/1") == ShardSpec{1, 1});
  CHECK(parse_shard("2/4") == ShardSpec{2, 4});
  CHECK(parse_shard("12/12") == ShardSpec{12, 12});
  for (const char* bad : {"", "1", "/3", "1/", "0/3", "4/3", "-1/3", "1/0", "a/3", "1/3x", " 1/3",
                          "1.5/3", "1/3/4", "2 /3"}) {
    INFO(bad);
    CHECK_FALSE(parse_shard(bad).has_value());
  }
}

TEST_CASE("shard_range: contiguous blocks, worked by hand", "[shard]") {
  // 10 replications in 3 shards: floor(10k/3) = 0, 3, 6, 10.
  CHECK(shard_range({1, 3}, 10) == ReplicationRange{0, 3});
  CHECK(shard_range({2, 3}, 10) == ReplicationRange{3, 3});
  CHECK(shard_range({3, 3}, 10) == ReplicationRange{6, 4});
  CHECK(shard_range({1, 1}, 7) == ReplicationRange{0, 7});
  CHECK(shard_range({4, 4}, 4) == ReplicationRange{3, 1});
}

TEST_CASE("shard_range: every replication in exactly one shard, sizes within one", "[shard]") {
  for (int reps = 1; reps <= 60; ++reps) {
    for (int n = 1; n <= reps; ++n) {
      std::vector<int> owner(static_cast<size_t>(reps), 0);
      int smallest = reps;
      int largest = 0;
      for (int k = 1; k <= n; ++k) {
        const ReplicationRange r = shard_range({k, n}, reps);
        smallest = std::min(smallest, r.count);
        largest = std::max(largest, r.count);
        for (int id = r.first; id < r.first + r.count; ++id) ++owner[static_cast<size_t>(id)];
      }
      INFO(reps << " replications, " << n << " shards");
      CHECK(std::all_of(owner.begin(), owner.end(), [](int c) { return c == 1; }));
      CHECK(largest - smallest <= 1);
      CHECK(smallest >= 1);
    }
  }
  // Large counts do not overflow: 1,000,000 replications in 999,983 shards.
  CHECK(shard_range({999983, 999983}, 1000000).first +
            shard_range({999983, 999983}, 1000000).count ==
        1000000);
}

TEST_CASE("scenario_digest is 64-bit FNV-1a", "[shard]") {
  // Test vectors of the FNV reference (Fowler, Noll and Vo; IETF draft-eastlake-fnv), from
  // memory, confirmed with a five-line Python FNV-1a.
  CHECK(scenario_digest("") == "cbf29ce484222325");
  CHECK(scenario_digest("a") == "af63dc4c8601ec8c");
  CHECK(scenario_digest("foobar") == "85944171f73967e8");
}

TEST_CASE("without_shard_option gives the single run's command", "[shard]") {
  CHECK(without_shard_option("larder run s.yaml --shard 2/3 --out x") ==
        "larder run s.yaml --out x");
  CHECK(without_shard_option("larder run s.yaml --shard=2/3") == "larder run s.yaml");
  CHECK(without_shard_option("larder run s.yaml --shard 2/3") == "larder run s.yaml");
  CHECK(without_shard_option("larder run s.yaml -r 5") == "larder run s.yaml -r 5");
}

}  // namespace
}  // namespace larder
