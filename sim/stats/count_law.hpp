#pragma once
// The law of one day's demand count given its mean (model.md, Demand): Poisson, negative
// binomial, or a normal rounded to the nearest integer and truncated at 0. Counts are drawn by
// inversion of one uniform (common random numbers), and policies take newsvendor quantiles and
// expected sales, leftovers and shortages from the same law.

#include <optional>
#include <span>

#include "sim/scenario/scenario.hpp"

namespace larder {

/// Distribution of a daily demand count.
///
/// For `poisson` and `negative_binomial`, `mean` and `variance` are those of the count (the
/// negative binomial has size r = mean^2 / (variance - mean) and success probability
/// r / (r + mean)). For `normal`, they are those of the underlying normal X, and the count is
/// max(0, X rounded to the nearest integer): P(D <= x) = Phi((x + 0.5 - mean) / sd) for x >= 0.
/// Its own mean then differs from `mean` by the truncated mass below 0 (negligible unless
/// mean < 3 sd or so). A mean of 0 gives the count 0 in every family, whatever the variance.
struct CountLaw {
  DemandFamily family = DemandFamily::poisson;
  double mean = 0.0;
  double variance = 0.0;  ///< equals mean for poisson

  /// The law of model.md: for negative_binomial and normal, exactly one of `cv`
  /// (variance = (cv * mean)^2) or `dispersion` k (variance = mean + mean^2 / k, k > 0);
  /// poisson ignores both. A negative binomial whose variance does not exceed its mean cannot
  /// exist and becomes poisson. Throws std::invalid_argument on a negative or non-finite mean,
  /// a negative cv, a non-positive k, or a missing or doubly given spread.
  static CountLaw make(DemandFamily f, double mean, std::optional<double> cv,
                       std::optional<double> dispersion);

  /// The law with these moments (a forecast's mean and variance), with the same poisson
  /// fallback for a negative binomial with variance <= mean. A negative variance counts as 0.
  /// Throws std::invalid_argument on a negative or non-finite mean or a non-finite variance.
  static CountLaw from_moments(DemandFamily f, double mean, double variance);

  /// P(D = k).
  double pmf(int k) const;

  /// P(D <= k), computed exactly as `quantile` and CountSampler accumulate it, so that
  /// quantile(p) is the smallest k with cdf(k) >= p to the last bit.
  double cdf(int k) const;

  /// Smallest k >= 0 with cdf(k) >= p: the newsvendor quantile and the inversion rule
  /// (p in (0, 1)). For the normal family, max(0, ceil(mean + sd * z_p - 0.5)).
  int quantile(double p) const;

  /// Expected shortage (lost sales) E[(D - q)+] when q units are stocked.
  double expected_shortage(int q) const;

  /// Expected sales E[min(D, q)].
  double expected_sales(int q) const;

  /// Expected leftover E[(q - D)+].
  double expected_leftover(int q) const;
};

/// Repeated inversion from one law, fast: the work that does not depend on the uniform (the
/// mode, its pmf and cdf) is done once, and a draw walks from the mode with the pmf
/// recurrence, about 0.8 sd steps on average, with no allocation and no special functions
/// (poisson, negative binomial); the normal family costs one normal_quantile. sample(u) is
/// bit-identical to law.quantile(u) for every u.
class CountSampler {
 public:
  explicit CountSampler(const CountLaw& law);

  /// The count for uniform u in (0, 1): smallest k >= 0 with cdf(k) >= u. When u is so close
  /// to 1 that the accumulated cdf never reaches it, returns the cap.
  int operator()(double u) const;

  /// P(D <= k) by the same accumulation as operator() (1 from the cap on).
  double cdf(int k) const;

  /// P(D <= k) for k = first, first + 1, ... (out.size() values, first >= 0) in one pass,
  /// bit-identical to cdf(k): for building lookup tables.
  void cdf_run(int first, std::span<double> out) const;

  /// Largest count ever returned: about mean + 40 sd + 50, a guard for the far upper tail.
  int cap() const { return cap_; }

 private:
  enum class Kind : unsigned char { zero, poisson, negative_binomial, normal };

  template <class Step>
  int walk(double u, Step step) const;
  template <class Step>
  double walk_cdf(int k, Step step) const;
  template <class Step>
  void walk_cdf_run(int first, std::span<double> out, Step step) const;

  Kind kind_ = Kind::zero;
  int cap_ = 0;
  double mean_ = 0.0;    ///< poisson / negative binomial mean, normal location
  double sd_ = 0.0;      ///< normal scale
  double r_ = 0.0;       ///< negative binomial size
  double q_ = 0.0;       ///< negative binomial mean / (r + mean)
  double mode_ = 0.0;    ///< walking start (an integer value)
  double p_mode_ = 0.0;  ///< P(D = mode)
  double f_mode_ = 0.0;  ///< P(D <= mode), summed downward from the mode
};

}  // namespace larder
