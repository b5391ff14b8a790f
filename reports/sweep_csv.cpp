#include "reports/sweep_csv.hpp"

#include <fmt/format.h>

#include "reports/comparison.hpp"
#include "reports/csv.hpp"
#include "reports/pareto.hpp"

namespace larder {

Metric frontier_waste_metric(const std::vector<SweepPoint>& points) {
  for (const SweepPoint& pt : points) {
    for (const auto& rows : pt.result.values) {
      for (const MetricVector& v : rows) {
        if (at(v, Metric::donated_units) > 0.0 || at(v, Metric::salvaged_units) > 0.0) {
          return Metric::surplus_share;
        }
      }
    }
  }
  return Metric::waste_share;
}

FrontierMarks sweep_frontiers(const std::vector<SweepPoint>& points) {
  const Metric measure = frontier_waste_metric(points);
  std::vector<double> waste;
  std::vector<double> in_stock;
  std::vector<double> profit;
  for (const SweepPoint& pt : points) {
    for (size_t p = 0; p < pt.result.policies.size(); ++p) {
      const int k = static_cast<int>(p);
      waste.push_back(policy_estimate(pt.result, k, measure).mean);
      in_stock.push_back(policy_estimate(pt.result, k, Metric::in_stock_at_close).mean);
      profit.push_back(policy_estimate(pt.result, k, Metric::profit).mean);
    }
  }
  return {pareto_front(waste, in_stock), pareto_front(waste, profit), measure};
}

std::string sweep_csv(const std::vector<Setting>& settings, const std::vector<SweepPoint>& points) {
  if (points.empty()) return {};
  const std::vector<Metric>& metrics = points.front().result.metrics;
  std::string out = "point";
  for (const Setting& s : settings) {
    out += ',';
    out += csv_field(s.path);
  }
  out += ",policy";
  for (Metric m : metrics) out += fmt::format(",{0},{0}_stderr", metric_name(m));
  out += ",waste_in_stock_frontier,profit_waste_frontier,frontier_waste\n";
  const FrontierMarks marks = sweep_frontiers(points);
  size_t row = 0;
  for (size_t i = 0; i < points.size(); ++i) {
    const RunResult& r = points[i].result;
    for (size_t p = 0; p < r.policies.size(); ++p, ++row) {
      out += std::to_string(i + 1);
      for (const std::string& v : points[i].values) {
        out += ',';
        out += csv_field(v);
      }
      out += ',';
      out += csv_field(r.policies[p]);
      for (Metric m : metrics) {
        const Estimate e = policy_estimate(r, static_cast<int>(p), m);
        out += fmt::format(",{},{}", csv_number(e.mean), csv_number(e.stderr_));
      }
      out += fmt::format(",{},{},{}\n", marks.waste_in_stock[row] ? 1 : 0,
                         marks.profit_waste[row] ? 1 : 0, metric_name(marks.waste));
    }
  }
  return out;
}

}  // namespace larder
