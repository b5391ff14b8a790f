#pragma once
// The decision page's numbers (report.html, "Decision summary"): per policy against the
// baseline, the paired change per year in tonnes wasted, tonnes of CO2e, customers lost and
// profit, each with its 95% interval, and one sentence in plain words built from those numbers
// and the verdicts (comparison.hpp). "Per year" scales the sums over the scored days (the
// horizon after the warm-up, closed days included) to 365 days.

#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "sim/runner/run_result.hpp"
#include "sim/stats/summary.hpp"

namespace larder {

/// Days the metrics sum: horizon_days - warmup_days (a store's closed days among them).
int scored_days(const RunInfo& info);

/// 365 / scored_days; NaN when no day is scored.
double annual_factor(const RunInfo& info);

/// `e` times `factor` (> 0): mean, standard error and both ends of the interval.
Estimate scaled(Estimate e, double factor);

/// A paired difference per year, policy minus baseline.
struct AnnualChange {
  Estimate difference;
  bool available = false;  ///< the run reports the metric
};

/// One policy's row of the decision table.
struct DecisionRow {
  std::string policy;
  AnnualChange waste;  ///< tonnes when the items have weights, else units
  bool waste_in_tonnes = false;
  AnnualChange co2e;    ///< tonnes of CO2e
  AnnualChange lost;    ///< customers who left without buying
  AnnualChange profit;  ///< the run's currency
};

/// One row per policy other than the baseline, in the run's order.
std::vector<DecisionRow> decision_rows(const RunResult& result);

/// "newsvendor cuts waste by 4.1 t a year (3.2 to 5.0), 9.8 t CO2e less a year (7.7 to 12)
/// and costs 1,900 more lost customers a year (1,500 to 2,300); profit +12 k EUR a year
/// (+8.0 k to +16 k)." A clause says a change only when its interval excludes 0 (the verdict
/// is significant), "no clear difference" otherwise; quantities the run lacks are left out.
std::string decision_sentence(const DecisionRow& row, std::string_view currency);

/// A signed amount for the decision page: thousands separators, "k" or "M" for money of
/// 10,000 or more, rounded to what the interval supports (two significant digits of
/// `half_width`) but to no more than three significant digits.
std::string decision_amount(double value, double half_width, bool money, bool sign);

/// "+12.0 k (+8.0 k to +16.0 k)": a signed change and its interval with one scale and one
/// number of decimals ("n/a" for a missing end).
std::string decision_change(const Estimate& e, bool money);

}  // namespace larder
