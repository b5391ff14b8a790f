#pragma once
// Pareto-efficient points of a trade-off (sweeps): a point is on the frontier when no other
// point is at least as good on both criteria and strictly better on one.

#include <span>
#include <vector>

namespace larder {

/// For each point (lower[i] is better when lower, higher[i] when higher): on the frontier?
/// Identical points are all on it when none is dominated.
std::vector<bool> pareto_front(std::span<const double> lower, std::span<const double> higher);

}  // namespace larder
