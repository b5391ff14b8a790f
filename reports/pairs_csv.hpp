#pragma once
// pairs.csv: every pair of policies compared on every reported metric, paired over the
// replications (common random numbers), so two rules can be compared when neither is the
// baseline (README, "Output folder").

#include <string>

#include "sim/runner/run_result.hpp"

namespace larder {

/// The text of pairs.csv: header
/// `policy,versus,metric,difference,stderr,ci_low,ci_high,replications,verdict`, then for each
/// pair of policies in scenario order (each policy against every earlier one) and reported
/// metric the paired difference policy minus versus with its 95% interval and the verdict of
/// the run table. Empty when the run has fewer than 2 policies.
std::string pairs_csv(const RunResult& result);

}  // namespace larder
