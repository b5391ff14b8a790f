#pragma once
// The metrics of model.md (per policy and replication, scored days only). Counts are sums over
// store-item-days; shares are ratios of sums.

#include <array>
#include <cstddef>
#include <string_view>

namespace larder {

enum class Metric : std::size_t {
  demand_units,
  sold_units,
  substitute_units,
  lost_units,
  waste_units,
  salvaged_units,
  donated_units,
  delivered_units,
  discounted_units,
  waste_share,
  in_stock_at_close,
  no_stockout_share,
  fill_rate,
  served_share,
  revenue,
  full_price_revenue,
  discount_revenue,
  salvage_revenue,
  purchase_cost,
  disposal_cost,
  penalty_cost,
  profit,
  waste_value,
  waste_kg,
  co2e_kg,
  surplus_units,
  surplus_share,
  surplus_kg,
  surplus_co2e_kg,
  donated_kg,
  donated_co2e_kg,
  salvaged_kg,
  salvaged_co2e_kg,
  discounted_kg,
  discounted_co2e_kg,
};
inline constexpr std::size_t kMetricCount =
    static_cast<std::size_t>(Metric::discounted_co2e_kg) + 1;

/// What a metric is, for tables and reports.
struct MetricInfo {
  std::string_view name;         ///< snake_case, as in model.md and output files
  std::string_view unit;         ///< "units", "share", "money" or "kg"
  std::string_view description;  ///< one line for --help and reports
  int better;                    ///< +1 higher is better, -1 lower is better, 0 neutral
};

const MetricInfo& metric_info(Metric m);
inline std::string_view metric_name(Metric m) {
  return metric_info(m).name;
}

/// All metric values of one policy in one replication, indexed by Metric.
using MetricVector = std::array<double, kMetricCount>;

inline double& at(MetricVector& v, Metric m) {
  return v[static_cast<std::size_t>(m)];
}
inline double at(const MetricVector& v, Metric m) {
  return v[static_cast<std::size_t>(m)];
}

}  // namespace larder
