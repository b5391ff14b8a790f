#pragma once
// summary.json: what was run (scenario, seed, replications, horizon, versions), every reported
// metric of every policy as {mean, stderr, ci_low, ci_high}, and the paired differences against
// the baseline with a verdict in plain words (cli.md, "Output folder").

#include <nlohmann/json.hpp>
#include <string>

#include "sim/runner/run_result.hpp"

namespace larder {

/// The summary of a run as JSON. Layout:
///   run facts as top-level fields (scenario, scenario_file, seed, replications, horizon_days,
///   warmup_days, stores, items, currency, command, larder_version, threads, seconds,
///   confidence_level);
///   "metrics": [{name, unit, better, description}] in reported order;
///   "policies": [{name, metrics: {<metric>: {mean, stderr, ci_low, ci_high}}}] in policy order;
///   "baseline": the baseline policy's name;
///   "differences": [{policy, baseline, metrics: {<metric>: {mean, stderr, ci_low, ci_high,
///   verdict}}}] for every other policy, in policy order (policy minus baseline, paired).
/// Values that are not numbers (a share of nothing) appear as null.
nlohmann::json summary_json(const RunResult& result);

/// The text of summary.json: summary_json indented by 2, with a final newline. Doubles are
/// printed in their shortest form that reads back to the same value.
std::string summary_json_text(const RunResult& result);

}  // namespace larder
