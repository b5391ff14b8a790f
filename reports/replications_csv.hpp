#pragma once
// replications.csv: every reported metric of every policy in every replication, the rows that
// all other results are computed from (cli.md, "Output folder").

#include <string>

#include "sim/runner/run_result.hpp"

namespace larder {

/// The text of replications.csv: header `policy,replication,<reported metrics in order>`, then
/// one row per policy (in order) and replication (numbered from 0); numbers read back exactly.
std::string replications_csv(const RunResult& result);

}  // namespace larder
