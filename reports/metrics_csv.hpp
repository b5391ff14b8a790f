#pragma once
// metrics.csv: one row per policy and reported metric with the mean over replications, its
// standard error and 95% interval (cli.md, "Output folder").

#include <string>

#include "sim/runner/run_result.hpp"

namespace larder {

/// The text of metrics.csv: header `policy,metric,mean,stderr,ci_low,ci_high,replications`, then
/// one row per policy (in order) and reported metric (in order); numbers read back exactly.
std::string metrics_csv(const RunResult& result);

}  // namespace larder
