#pragma once
// substitution.csv: which item served whose customers. One row per policy and substitution pair
// with the units sold per replication to customers whose first choice was out (mean over
// replications, standard error and 95% interval). Written only when the scenario substitutes.

#include <string>

#include "sim/runner/run_result.hpp"

namespace larder {

/// Header `policy,from_item,to_item,mean,stderr,ci_low,ci_high,replications`, then one row per
/// policy (in order) and pair (in scenario order). Empty when there are no pairs.
std::string substitution_csv(const RunResult& result);

}  // namespace larder
