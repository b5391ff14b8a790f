#pragma once
// What one (replication, store) task hands to the reduction: per policy, per-item tallies and
// the units sold per substitution pair.

#include <cstdint>
#include <vector>

#include "sim/engine/store_run.hpp"

namespace larder {

struct StoreTallies {
  std::vector<std::vector<Tally>> items;
  std::vector<std::vector<std::int64_t>> substituted;
};

/// Copies a finished store run's tallies.
inline StoreTallies collect_tallies(const StoreRun& run, size_t policies) {
  StoreTallies out;
  for (size_t p = 0; p < policies; ++p) {
    const auto t = run.tallies(static_cast<int>(p));
    out.items.emplace_back(t.begin(), t.end());
    const auto s = run.substitutions(static_cast<int>(p));
    out.substituted.emplace_back(s.begin(), s.end());
  }
  return out;
}

}  // namespace larder
