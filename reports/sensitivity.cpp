#include "reports/sensitivity.hpp"

#include <fmt/format.h>

#include <algorithm>

#include "reports/comparison.hpp"
#include "reports/csv.hpp"

namespace larder {

std::vector<TornadoRow> tornado(const std::vector<Setting>& varies,
                                const std::vector<SweepPoint>& points) {
  std::vector<TornadoRow> rows;
  if (points.empty()) return rows;
  const RunResult& base = points.front().result;
  for (size_t p = 0; p < base.policies.size(); ++p) {
    const int k = static_cast<int>(p);
    if (k == base.baseline) continue;
    size_t point = 1;
    for (const Setting& s : varies) {
      TornadoRow row{s.path, base.policies[p], s.values, {}, {}, 0.0};
      row.base = baseline_difference(base, k, Metric::profit);
      double lo = row.base.mean;
      double hi = row.base.mean;
      for (size_t v = 0; v < s.values.size(); ++v, ++point) {
        const Estimate e = baseline_difference(points[point].result, k, Metric::profit);
        row.difference.push_back(e);
        lo = std::min(lo, e.mean);
        hi = std::max(hi, e.mean);
      }
      row.swing = hi - lo;
      rows.push_back(std::move(row));
    }
  }
  std::stable_sort(rows.begin(), rows.end(),
                   [](const TornadoRow& a, const TornadoRow& b) { return a.swing > b.swing; });
  return rows;
}

std::string sensitivity_csv(const std::vector<SweepPoint>& points) {
  std::string out = "input,value,policy,baseline,profit_difference,stderr,ci_low,ci_high\n";
  for (const SweepPoint& pt : points) {
    const RunResult& r = pt.result;
    const std::string input = pt.values.empty() ? "base" : csv_field(pt.values[0]);
    const std::string value = pt.values.empty() ? "" : csv_field(pt.values[1]);
    for (size_t p = 0; p < r.policies.size(); ++p) {
      if (static_cast<int>(p) == r.baseline) continue;
      const Estimate e = baseline_difference(r, static_cast<int>(p), Metric::profit);
      out += fmt::format("{},{},{},{},{},{},{},{}\n", input, value, csv_field(r.policies[p]),
                         csv_field(r.policies[static_cast<size_t>(r.baseline)]), csv_number(e.mean),
                         csv_number(e.stderr_), csv_number(e.ci_low), csv_number(e.ci_high));
    }
  }
  return out;
}

std::string tornado_table(const std::vector<TornadoRow>& rows, const std::string& baseline) {
  std::string out = fmt::format(
      "profit difference against {} (paired, mean ± 95% half-width), widest swing first\n",
      baseline);
  for (const TornadoRow& r : rows) {
    std::string line = fmt::format("{:<18} {:<24} base {:>12.0f} ± {:<8.0f}", r.policy, r.path,
                                   r.base.mean, r.base.ci_high - r.base.mean);
    for (size_t v = 0; v < r.values.size(); ++v) {
      line += fmt::format("  {}: {:>10.0f} ± {:<8.0f}", r.values[v], r.difference[v].mean,
                          r.difference[v].ci_high - r.difference[v].mean);
    }
    line += fmt::format("  swing {:.0f}\n", r.swing);
    out += line;
  }
  return out;
}

}  // namespace larder
