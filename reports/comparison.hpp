#pragma once
// The estimates every report prints, computed one way: per policy and metric the mean over
// replications with its 95% interval, and per other policy the paired difference against the
// baseline with a verdict in plain words. summary.json and the terminal table share these so
// they always agree.

#include <string>

#include "sim/engine/metric.hpp"
#include "sim/runner/run_result.hpp"
#include "sim/stats/summary.hpp"

namespace larder {

/// Coverage of every interval in the reports.
inline constexpr double kReportLevel = 0.95;

/// Mean of metric `m` of policy `policy` over replications, with its 95% t interval.
Estimate policy_estimate(const RunResult& result, int policy, Metric m);

/// Paired difference (policy minus baseline) of metric `m` over replications, with its 95% t
/// interval.
Estimate baseline_difference(const RunResult& result, int policy, Metric m);

/// True when the difference's interval excludes 0 (and rests on at least 2 replications).
bool is_significant(const Estimate& difference);

/// What a difference says, in plain words: "better: lower waste_units (significant)",
/// "worse: higher waste_share (significant)", "higher sold_units (significant)" for metrics
/// without a better direction, "no significant difference", or "not available" when the
/// difference is not a number or has fewer than 2 replications.
std::string verdict(Metric m, const Estimate& difference);

}  // namespace larder
