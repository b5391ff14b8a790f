#pragma once
// Inversion by table look-up for a count law that is drawn from many times (the demand of a
// store-item on a given weekday): the cdf of every count a 32-bit uniform can select, and a
// guide table (Chen and Asau 1974, "On generating random variates from an empirical
// distribution"; Devroye 1986, Non-Uniform Random Variate Generation, section III.2.4) that
// starts the search next to the answer. It returns exactly what CountSampler returns for the
// same uniform, only faster: about one comparison instead of a walk from the mode.

#include <cstdint>
#include <vector>

#include "sim/stats/count_law.hpp"

namespace larder {

class InversionTable {
 public:
  /// Builds the table (poisson and negative binomial; the normal family keeps its direct
  /// inversion, already fast); laws whose selectable range is wider than `max_entries` (at most
  /// kMaxEntries; 0 = never) keep only the sampler (the walk).
  explicit InversionTable(const CountLaw& law, int max_entries = kMaxEntries);

  static constexpr int kMaxEntries = 4096;

  /// Number of table entries the law needs (hi - lo + 1 of the selectable counts).
  static int entries_needed(const CountSampler& sampler);
  /// Bytes a table of `entries` entries holds.
  static std::size_t bytes_for(int entries);

  /// Smallest k >= 0 with P(D <= k) >= u, bit-identical to CountSampler(law)(u).
  int operator()(double u) const {
    if (cdf_.empty() || u < min_u_ || u > cdf_.back()) return sampler_(u);
    const double* f = cdf_.data();
    std::uint32_t i = guide_[static_cast<std::size_t>(u * scale_)];
    while (i > 0 && f[i - 1] >= u) --i;  // rounding of u * scale_ (rare)
    while (f[i] < u) ++i;
    return first_ + static_cast<int>(i);
  }

  /// Bytes held (for memory estimates).
  std::size_t bytes() const;

 private:
  CountSampler sampler_;
  int first_ = 0;                     ///< count of cdf_[0]
  double min_u_ = 0.0;                ///< smaller uniforms use the sampler
  double scale_ = 0.0;                ///< guide_.size() - 1
  std::vector<double> cdf_;           ///< cdf_[i] = P(D <= first_ + i)
  std::vector<std::uint16_t> guide_;  ///< guide_[j]: a start index for u in [j, j+1) / scale_
};

}  // namespace larder
