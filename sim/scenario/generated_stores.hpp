#pragma once
// Stores generated from `stores: { count: N, size: { lognormal_cv: v } }` (scenario.md): ids
// s001, s002, ... and size factors lognormal with mean exactly 1, drawn from the scenario seed so
// that the same seed always gives the same network.

#include <cstdint>
#include <string>
#include <vector>

namespace larder {

/// Id of generated store `index` (0-based) of `count`: "s" and index + 1, zero-padded to three
/// digits, or to the width of `count` when that is wider (so ids sort in store order).
std::string generated_store_id(int index, int count);

/// Size factors of `count` generated stores: lognormal with mean 1 and coefficient of variation
/// `cv` (all 1 when cv is 0). Store i's size is drawn by inversion from the first uniform of
/// the generation stream (seed, replication 0, store i, no item).
std::vector<double> generated_store_sizes(std::uint64_t seed, int count, double cv);

}  // namespace larder
