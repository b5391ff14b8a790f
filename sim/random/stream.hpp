#pragma once
// Random streams keyed by where a draw is used: (seed, replication, store, item, purpose).
// A stream yields a fixed number of draws per day, so the draws of day t are found by
// `advance(t * draws_per_day)`: any worker can compute any cell and results never depend on
// which thread ran it or in what order (style.md, "Randomness is a function of coordinates").

#include <cstdint>
#include <pcg_random.hpp>

namespace larder {

/// What a stream is used for. Each purpose has its own stream so that a policy or feature that
/// consumes an extra draw never shifts another one's draws.
enum class Purpose : std::uint32_t {
  demand = 1,        ///< one uniform per store-item-day: the demand count by inversion
  traffic = 2,       ///< store-day traffic shock (item = kNoItem)
  persistence = 3,   ///< AR(1) demand persistence
  intraday = 4,      ///< split of a day's customers over time buckets
  picking = 5,       ///< oldest-versus-freshest split of sales
  substitution = 6,  ///< substitute choice of customers who find the item out
  generation = 7,    ///< generated network attributes (store sizes), replication-independent
  tier_choice = 8,   ///< how many customers would take a discounted unit (one per day)
};

inline constexpr std::uint32_t kNoItem = 0xffffffffu;

/// Coordinates of one stream.
struct StreamKey {
  std::uint64_t seed = 0;
  std::uint32_t replication = 0;
  std::uint32_t store = 0;
  std::uint32_t item = 0;
  Purpose purpose = Purpose::demand;
};

/// SplitMix64 finaliser (Steele, Lea and Flood 2014): a bijective 64-bit mixer.
constexpr std::uint64_t mix64(std::uint64_t z) {
  z += 0x9e3779b97f4a7c15ull;
  z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ull;
  z = (z ^ (z >> 27)) * 0x94d049bb133111ebull;
  return z ^ (z >> 31);
}

/// The pcg32 generator of a stream: state and sequence both come from hashing the key.
inline pcg32 make_stream(const StreamKey& k) {
  std::uint64_t h = mix64(k.seed);
  h = mix64(h ^ k.replication);
  h = mix64(h ^ (std::uint64_t{k.store} << 32 | k.item));
  h = mix64(h ^ static_cast<std::uint64_t>(k.purpose));
  return pcg32(h, mix64(h ^ 0x5851f42d4c957f2dull));
}

/// The stream positioned at the first draw of `day`, for a purpose with `draws_per_day` draws.
inline pcg32 make_stream_at(const StreamKey& k, int day, std::uint64_t draws_per_day) {
  pcg32 g = make_stream(k);
  g.advance(static_cast<std::uint64_t>(day) * draws_per_day);
  return g;
}

/// A 32-bit output mapped to the open interval (0, 1): (x + 0.5) / 2^32.
constexpr double to_unit(std::uint32_t x) {
  return (static_cast<double>(x) + 0.5) * 0x1p-32;
}

}  // namespace larder
