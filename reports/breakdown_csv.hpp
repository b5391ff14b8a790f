#pragma once
// breakdown.csv (cli.md, "Output folder"): `policy,dimension,key,metric,mean,stderr` for every
// store, item and item-attribute value, and for a network_in_stock policy its plan groups with
// two more rows each: `planned_level` (the level its plans set, mean over the plans made on
// scored days) and `planned_in_stock` (the in-stock share those plans expected), to read
// against the achieved `in_stock_at_close`.

#include <string>

#include "sim/runner/run_result.hpp"

namespace larder {

std::string breakdown_csv(const RunResult& result);

}  // namespace larder
