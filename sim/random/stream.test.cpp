// Tests of the random streams (sim/random/stream.hpp): the library generator is the reference
// pcg32 (checks.md section 8 test vector), skip-ahead equals stepping, and every stream is a
// function of its coordinates only.

#include "sim/random/stream.hpp"

#include <catch2/catch.hpp>
#include <cstdint>
#include <set>
#include <vector>

namespace {

using larder::make_stream;
using larder::make_stream_at;
using larder::Purpose;
using larder::StreamKey;
using larder::to_unit;

std::vector<std::uint32_t> first_outputs(pcg32 g, int n) {
  std::vector<std::uint32_t> out;
  for (int i = 0; i < n; ++i) out.push_back(g());
  return out;
}

}  // namespace

TEST_CASE("pcg32 reproduces the reference test vector", "[random]") {
  // checks.md 8 [V: the reference demo output of O'Neill's pcg32; C: reproduced in Python]:
  // seed (42, 54) gives these six outputs.
  pcg32 g(42u, 54u);
  const std::uint32_t expected[] = {0xa15c02b7u, 0x7b47f409u, 0xba1d3330u,
                                    0x83d2f293u, 0xbfa4784bu, 0xcbed606eu};
  for (std::uint32_t e : expected) CHECK(g() == e);
  // checks.md 8 [C]: stream 55 starts 0xadd2c78f.
  pcg32 h(42u, 55u);
  CHECK(h() == 0xadd2c78fu);
}

TEST_CASE("pcg32 advance(n) equals n steps", "[random]") {
  pcg32 stepped(42u, 54u);
  pcg32 jumped(42u, 54u);
  for (int i = 0; i < 1000; ++i) stepped();
  jumped.advance(1000);
  CHECK(jumped == stepped);
  // checks.md 8 [C]: after advance(1000) the next output is 0xefebeab3.
  CHECK(jumped() == 0xefebeab3u);
  CHECK(stepped() == 0xefebeab3u);
  // checks.md 8 [C]: advance(2^64 - 1) followed by one step returns to the start state.
  const pcg32 start(42u, 54u);
  pcg32 wrapped = start;
  wrapped.advance(~std::uint64_t{0});
  wrapped();
  CHECK(wrapped == start);
  for (std::uint64_t n : {1u, 2u, 7u, 64u, 12345u}) {
    pcg32 a(7u, 3u);
    pcg32 b(7u, 3u);
    for (std::uint64_t i = 0; i < n; ++i) a();
    b.advance(n);
    CHECK(a == b);
  }
}

TEST_CASE("make_stream_at(key, day, k) equals day * k draws from make_stream(key)", "[random]") {
  const StreamKey key{123456789u, 3u, 17u, 42u, Purpose::demand};
  for (std::uint64_t per_day : {1u, 3u, 24u}) {
    pcg32 seq = make_stream(key);
    for (int day = 0; day < 30; ++day) {
      CAPTURE(per_day, day);
      pcg32 at = make_stream_at(key, day, per_day);
      CHECK(at == seq);
      for (std::uint64_t i = 0; i < per_day; ++i) CHECK(at() == seq());
    }
  }
  // Cells replayed in reverse order give the same values (style.md, "Randomness is a function
  // of coordinates").
  std::vector<std::uint32_t> forward;
  pcg32 g = make_stream(key);
  for (int day = 0; day < 50; ++day) forward.push_back(g());
  for (int day = 49; day >= 0; --day) {
    pcg32 at = make_stream_at(key, day, 1);
    CHECK(at() == forward[static_cast<std::size_t>(day)]);
  }
}

TEST_CASE("different coordinates give different streams", "[random]") {
  const StreamKey base{2024u, 0u, 0u, 0u, Purpose::demand};
  std::vector<StreamKey> keys = {base};
  auto with = [&](auto change) {
    StreamKey k = base;
    change(k);
    keys.push_back(k);
  };
  with([](StreamKey& k) { k.seed = 2025u; });
  with([](StreamKey& k) { k.replication = 1u; });
  with([](StreamKey& k) { k.replication = 2u; });
  with([](StreamKey& k) { k.store = 1u; });
  with([](StreamKey& k) { k.item = 1u; });  // store 0 item 1 versus store 1 item 0
  with([](StreamKey& k) { k.item = larder::kNoItem; });
  with([](StreamKey& k) { k.purpose = Purpose::traffic; });
  with([](StreamKey& k) { k.purpose = Purpose::persistence; });
  with([](StreamKey& k) { k.purpose = Purpose::intraday; });
  with([](StreamKey& k) { k.purpose = Purpose::picking; });
  with([](StreamKey& k) { k.purpose = Purpose::substitution; });
  with([](StreamKey& k) { k.purpose = Purpose::generation; });
  std::set<std::vector<std::uint32_t>> seen;
  std::set<std::uint32_t> first;
  for (const StreamKey& k : keys) {
    const auto out = first_outputs(make_stream(k), 4);
    seen.insert(out);
    first.insert(out[0]);
  }
  CHECK(seen.size() == keys.size());
  CHECK(first.size() == keys.size());
  // The same key always gives the same stream.
  CHECK(first_outputs(make_stream(base), 8) == first_outputs(make_stream(base), 8));
  // Streams of neighbouring replications do not overlap in their first draws.
  StreamKey r1 = base;
  r1.replication = 1u;
  const auto a = first_outputs(make_stream(base), 1000);
  const auto b = first_outputs(make_stream(r1), 1000);
  const std::set<std::uint32_t> sa(a.begin(), a.end());
  int shared = 0;
  for (std::uint32_t x : b) shared += sa.count(x) > 0 ? 1 : 0;
  CHECK(shared <= 2);  // 1000 x 1000 / 2^32 ~ 0.0002 expected by chance
}

TEST_CASE("to_unit maps 32 bits into the open interval (0, 1)", "[random]") {
  CHECK(to_unit(0u) > 0.0);
  CHECK(to_unit(0u) == 0x1p-33);  // (0 + 0.5) / 2^32
  CHECK(to_unit(0xffffffffu) < 1.0);
  CHECK(to_unit(0xffffffffu) == 1.0 - 0x1p-33);  // exact in double
  CHECK(to_unit(0x80000000u) == 0.5 + 0x1p-33);
  CHECK(to_unit(1u) > to_unit(0u));
  CHECK(to_unit(0xfffffffeu) < to_unit(0xffffffffu));
}
