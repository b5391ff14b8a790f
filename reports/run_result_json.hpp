#pragma once
// Every number of a RunResult as JSON and back, exactly: the run facts, the policies and metrics,
// and per policy and replication every metric, substitution count, breakdown value and planned
// level. A shard file holds one of these, so merged shards can rebuild the RunResult a single run
// would have produced, bit for bit (doubles go through exact_json_number).

#include <nlohmann/json.hpp>

#include "sim/runner/run_result.hpp"

namespace larder {

/// `result` as JSON. Layout: "info" (RunInfo), "policies", "baseline", "metrics" (the reported
/// ones), "row_metrics" (every metric name, the order of the numbers in each row), "values"
/// [policy][replication][row], "substitution_pairs" [{from, to}], "substituted"
/// [policy][replication][pair], "breakdown" [policy]{keys [[dimension, key]], first_group,
/// values [replication][key][row], planned_level and planned_in_stock [replication][group]}.
nlohmann::json run_result_json(const RunResult& result);

/// The RunResult `j` describes, as written by run_result_json. Throws std::runtime_error naming
/// the field when `j` lacks one, a count does not match, or a row metric is unknown.
RunResult run_result_from_json(const nlohmann::json& j);

}  // namespace larder
