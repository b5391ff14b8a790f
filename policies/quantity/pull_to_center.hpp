#pragma once
// `pull_to_center`: the newsvendor quantity anchored on mean demand (Schweitzer and Cachon 2000).

namespace larder {

/// The anchored stock w * mean + (1 - w) * q_star (before rounding): q_star moved toward the
/// mean by the share w in [0, 1] of the gap.
double pull_to_center_target(double mean, double q_star, double w);

}  // namespace larder
