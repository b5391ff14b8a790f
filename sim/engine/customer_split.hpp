#pragma once
// Splitting a count of customers over categories (the hours of a day, or the substitutes of an
// item) by conditional binomials: category k gets Binomial(remaining, p_k / p_remaining). The
// result is an exact multinomial draw, made from one uniform per category so that the same
// uniforms always give the same (or a monotonically shifted) split: common random numbers.

#include <span>
#include <vector>

namespace larder {

/// The conditional probabilities of a split with fixed shares, computed once.
struct SplitPlan {
  std::vector<double> p;      ///< category k given that it is not one of 0..k-1
  std::vector<double> log_q;  ///< log(1 - p[k])
  bool complete = true;       ///< the last category takes what is left
};

SplitPlan plan_split(std::span<const double> shares, bool complete);

/// split_count with a plan (same result, fewer logarithms).
int split_count(int n, const SplitPlan& plan, std::span<const double> u, std::span<int> out);

/// Splits `n` over categories with probabilities `shares` into `out` (same size), using u[k] for
/// category k. When `complete`, the shares sum to 1 and the last category takes what is left
/// (u needs shares.size() - 1 entries); otherwise 1 - sum(shares) is an implicit "none" category
/// (u needs shares.size() entries). Returns the count left in "none" (0 when complete).
int split_count(int n, std::span<const double> shares, std::span<const double> u,
                std::span<int> out, bool complete);

}  // namespace larder
