#pragma once
// `larder run --precision METRIC=0.5%`: replications are added in batches until the 95%
// half-width of METRIC is below the target for every policy (or, with `difference:METRIC`, for
// every paired difference against the baseline), or a maximum is reached. Batches continue the
// replication ids, so the result equals one run of that many replications.

#include <optional>
#include <string>
#include <vector>

#include "sim/runner/monte_carlo.hpp"

namespace larder {

struct PrecisionTarget {
  Metric metric = Metric::profit;
  double half_width = 0.0;  ///< the target: a share of |mean| when relative, else in units
  bool relative = false;    ///< given as a percentage
  bool difference = false;  ///< applies to paired differences against the baseline
};

/// "profit=0.5%", "waste_units=25", "difference:profit=1%"; nullopt when malformed or the
/// metric is unknown.
std::optional<PrecisionTarget> parse_precision(const std::string& text);

/// The largest ratio of half-width to target over the policies (or differences): <= 1 means met.
double precision_ratio(const RunResult& result, const PrecisionTarget& target);

/// Runs the scenario's replications, then more in batches (sized from the half-widths seen so
/// far, at least a tenth more each time) until the target is met or `max_replications` run.
RunResult run_to_precision(const Scenario& scenario, const std::vector<Policy>& policies,
                           RunOptions options, const PrecisionTarget& target, int max_replications);

}  // namespace larder
