#pragma once
// Sensitivity of a comparison (`larder sweep --vary`): how the paired profit difference of
// each policy against the baseline moves when one uncertain input changes at a time (a tornado
// table, widest swing first). Whether the ranking survives is policy_ranks.hpp's question.

#include <string>
#include <vector>

#include "sim/runner/sweep.hpp"
#include "sim/stats/summary.hpp"

namespace larder {

struct TornadoRow {
  std::string path;                  ///< the varied input
  std::string policy;                ///< compared with the baseline
  std::vector<std::string> values;   ///< the input's values, as given
  std::vector<Estimate> difference;  ///< profit, policy minus baseline, at each value
  Estimate base;                     ///< at the base scenario
  double swing = 0;                  ///< largest minus smallest mean difference, base included
};

/// One row per varied input and non-baseline policy, widest swing first. `points` are those
/// of run_sweep with `varies` (the base first).
std::vector<TornadoRow> tornado(const std::vector<Setting>& varies,
                                const std::vector<SweepPoint>& points);

/// sensitivity.csv: `input,value,policy,baseline,profit_difference,stderr,ci_low,ci_high`, the
/// base scenario as input `base`.
std::string sensitivity_csv(const std::vector<SweepPoint>& points);

/// The tornado as aligned text.
std::string tornado_table(const std::vector<TornadoRow>& rows, const std::string& baseline);

}  // namespace larder
