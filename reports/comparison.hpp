#pragma once
// The estimates every report prints, computed one way: per policy and metric the mean over
// replications with its 95% interval, and per other policy the paired difference against the
// baseline with a verdict in plain words. summary.json and the terminal table share these so
// they always agree.

#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

#include "sim/engine/metric.hpp"
#include "sim/runner/run_result.hpp"
#include "sim/stats/summary.hpp"

namespace larder {

/// Coverage of every interval in the reports.
inline constexpr double kReportLevel = 0.95;

/// How tables of estimates say what their cells are.
inline constexpr std::string_view kEstimateCaption =
    "mean ± half-width of the 95% confidence interval";

/// Half the width of an estimate's interval: what tables print after "±".
inline double half_width(const Estimate& e) {
  return (e.ci_high - e.ci_low) / 2.0;
}

/// `e` with its standard error and interval marked not available (NaN) when fewer than 2
/// replications back them: every writer then shows "n/a" (text), null (JSON) or an empty field
/// (CSV), never a made-up zero-width interval (README, "One replication").
Estimate without_interval_below_two(Estimate e);

/// The mean of `values` (one per replication) with its 95% t interval, as reports show it.
Estimate report_estimate(std::span<const double> values);

/// Mean of metric `m` of policy `policy` over replications, with its 95% t interval.
Estimate policy_estimate(const RunResult& result, int policy, Metric m);

/// Paired difference (policy `a` minus policy `b`) of metric `m` over replications, with its
/// 95% t interval.
Estimate paired_difference(const RunResult& result, int a, int b, Metric m);

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

/// The same verdict naming the metric `name` (pages name metrics in words: "lower waste").
std::string verdict(Metric m, const Estimate& difference, std::string_view name);

/// The tone of a verdict, for styling it: a significant difference that is better, worse, or
/// neutral (a metric without a better direction), or `none` (not significant, not available).
enum class VerdictTone { better, worse, neutral, none };
VerdictTone verdict_tone(Metric m, const Estimate& difference);

/// "newsvendor: difference vs habit (paired, 95% CI)": the title of a policy's differences.
std::string difference_title(const RunResult& result, int policy);

/// Mean over replications of metric `m` of breakdown key `key` of a policy's breakdown, with its
/// 95% interval: the numbers of breakdown.csv.
Estimate breakdown_estimate(const PolicyBreakdown& breakdown, std::size_t key, Metric m);

/// One plan group of a network_in_stock policy, each as a mean over replications with its 95%
/// interval: the level its plans set, the in-stock share they expected, the share achieved.
struct PlanGroupRow {
  std::string group;
  Estimate planned_level;
  Estimate planned_in_stock;
  Estimate in_stock_at_close;
};

/// The plan groups of policy `policy` (empty unless it is network-planned).
std::vector<PlanGroupRow> plan_group_rows(const RunResult& result, std::size_t policy);

/// A network plan's promise kept or missed: its network in-stock target against the in-stock
/// share at close achieved over the scored days (mean over replications, 95% interval).
struct TargetCheck {
  double target = 0.0;
  Estimate achieved;
  /// Achieved minus target, in percentage points.
  double points() const { return 100.0 * (achieved.mean - target); }
  /// Missed by more than its interval: the whole 95% interval lies below the target.
  bool missed() const { return achieved.ci_high < target; }
};

/// Policy `policy`'s target check, or none when it is not network-planned.
std::optional<TargetCheck> target_check(const RunResult& result, std::size_t policy);

/// "target 75% -> achieved 71.0% (-4.0 points)".
std::string target_text(const TargetCheck& check);

/// One warning per network-planned policy that missed its target beyond its interval.
std::vector<std::string> target_warnings(const RunResult& result);

}  // namespace larder
