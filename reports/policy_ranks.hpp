#pragma once
// Robustness of a comparison (`larder sweep --vary`): at the base scenario and at each value of
// each varied input, the rank of every policy on one metric (profit, or a waste metric chosen by
// name: waste_units, waste_kg, co2e_kg, ...) and whether the best policy changes. A ranking
// holds when the best policy stays the best, not merely when each policy keeps its sign against
// the baseline.

#include <optional>
#include <string>
#include <vector>

#include "sim/engine/metric.hpp"
#include "sim/runner/sweep.hpp"

namespace larder {

/// Competition ranks ("1224") of `means`: 1 + the number of policies with a strictly better
/// mean (higher when `better` > 0, lower when < 0). A mean that is not finite ranks last,
/// after every finite one.
std::vector<int> rank_policies(const std::vector<double>& means, int better);

/// One run of the sensitivity sweep: the base (input "base") or one value of one input.
struct RankPoint {
  std::string input;
  std::string value;
  std::vector<double> means;  ///< per policy
  std::vector<int> ranks;     ///< per policy, 1 = best
  std::vector<int> best;      ///< the policies ranked 1 (several when tied)
  bool best_changes = false;  ///< `best` differs from the base's
  /// When the best changes: whether the new best beats the base's best at this value with a
  /// paired 95% interval that excludes 0 (unknown when the table was built from means alone).
  std::optional<bool> change_clear;
};

struct RankTable {
  std::string metric;  ///< the field name
  int better = 0;
  std::vector<std::string> policies;
  std::vector<RankPoint> points;  ///< the base first
  /// True when the best policy changes at some value.
  bool best_changes() const;
};

/// Ranks from the means alone: `points` hold input, value and means (the base first).
RankTable rank_table(const std::string& metric, int better,
                     const std::vector<std::string>& policies, std::vector<RankPoint> points);

/// Ranks of metric `m` at every point of a sensitivity sweep (the base first, as run_sweep
/// returns them with `varies`), with change_clear from the paired differences.
RankTable rank_table(const std::vector<SweepPoint>& points, Metric m);

/// The table as aligned text: a row per point, a column per policy, the best, and
/// "BEST CHANGES" (or "best changes, within noise") where it does.
std::string rank_text(const RankTable& table);

/// ranks.csv rows without the header: `input,value,metric,policy,mean,rank,best,best_changes`.
std::string rank_csv_rows(const RankTable& table);
inline constexpr std::string_view kRankCsvHeader =
    "input,value,metric,policy,mean,rank,best,best_changes\n";

}  // namespace larder
