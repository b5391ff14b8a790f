#include "sim/stats/inversion_table.hpp"

#include <algorithm>

namespace larder {

namespace {
// The smallest and largest uniforms to_unit() can produce: (x + 0.5) / 2^32 for 32-bit x.
constexpr double kSmallestUniform = 0x1p-33;
constexpr double kLargestUniform = 1.0 - 0x1p-33;
}  // namespace

int InversionTable::entries_needed(const CountSampler& sampler) {
  // The selectable counts run from the answer for the smallest uniform to the answer for the
  // largest one.
  return sampler(kLargestUniform) - sampler(kSmallestUniform) + 1;
}

std::size_t InversionTable::bytes_for(int entries) {
  return sizeof(InversionTable) + static_cast<size_t>(entries) * sizeof(double) +
         (2 * static_cast<size_t>(entries) + 1) * sizeof(std::uint16_t);
}

InversionTable::InversionTable(const CountLaw& law, int max_entries) : sampler_(law) {
  // The normal count inverts Phi directly (no walk to save), and its cdf is not the exact
  // inverse of that in floating point: it keeps the sampler.
  if (law.family == DemandFamily::normal) return;
  if (entries_needed(sampler_) > std::min(max_entries, kMaxEntries)) return;
  const int lo = sampler_(kSmallestUniform);
  const int hi = sampler_(kLargestUniform);
  first_ = lo;
  min_u_ = lo > 0 ? kSmallestUniform : 0.0;
  cdf_.resize(static_cast<size_t>(hi - lo + 1));
  sampler_.cdf_run(lo, cdf_);
  // Two guide slots per entry keep the expected search at well under one step.
  const size_t slots = 2 * cdf_.size() + 1;
  scale_ = static_cast<double>(slots - 1);
  guide_.resize(slots);
  size_t i = 0;
  for (size_t j = 0; j < slots; ++j) {
    const double u = static_cast<double>(j) / scale_;
    while (i + 1 < cdf_.size() && cdf_[i] < u) ++i;
    guide_[j] = static_cast<std::uint16_t>(i);
  }
}

std::size_t InversionTable::bytes() const {
  return sizeof(*this) + cdf_.size() * sizeof(double) + guide_.size() * sizeof(std::uint16_t);
}

}  // namespace larder
