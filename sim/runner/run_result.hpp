#pragma once
// What a run produces: per policy, per replication, every metric. Everything reported
// (summary.json, metrics.csv, the terminal table) is derived from these rows, so shards can be
// merged by concatenating rows and recomputing, bit-identically.

#include <cstdint>
#include <limits>
#include <string>
#include <vector>

#include "sim/engine/metric.hpp"

namespace larder {

/// The facts about a run that reports print so it can be repeated.
struct RunInfo {
  std::string scenario_name;
  std::string scenario_file;
  std::uint64_t seed = 0;
  int replications = 0;
  int horizon_days = 0;
  int warmup_days = 0;
  int stores = 0;
  int items = 0;
  std::string currency;
  std::string command;  ///< the command line that reproduces the run
  std::string version;  ///< larder version
  int threads = 0;
  double seconds = 0.0;  ///< wall time of the simulation
};

/// Customers of `from` who found it out and bought `to` instead (model.md, step 3).
struct SubstitutionPair {
  std::string from;
  std::string to;
};

/// One row key of the breakdown: a dimension (`store`, `item`, an item attribute's key, or
/// `plan_group` for a network_in_stock policy's groups) and a value of it.
struct BreakdownKey {
  std::string dimension;
  std::string key;
};

/// Every metric by store, item, item attribute and (network_in_stock) plan group, per
/// replication: the same definitions as the totals, over a subset of store-item-days.
struct PolicyBreakdown {
  std::vector<BreakdownKey> keys;
  std::vector<std::vector<MetricVector>> values;  ///< [replication][key]
  /// `plan_group` keys only, else empty: per replication, the mean over the plans made on
  /// scored days of the planned level and of the in-stock share the plan expected.
  std::vector<std::vector<double>> planned_level;     ///< [replication][group]
  std::vector<std::vector<double>> planned_in_stock;  ///< [replication][group]
  std::size_t first_group = 0;                        ///< index of the first plan_group key
  /// network_in_stock only, else NaN: the network in-stock target its plans promise (the
  /// share of open store-item-days in stock at close).
  double network_target = std::numeric_limits<double>::quiet_NaN();
};

struct RunResult {
  RunInfo info;
  std::vector<std::string> policies;
  int baseline = 0;             ///< index into policies
  std::vector<Metric> metrics;  ///< the metrics that apply (waste_kg only with weights, ...)
  /// values[policy][replication] = every metric of that policy in that replication.
  std::vector<std::vector<MetricVector>> values;
  /// Every substitution pair of the scenario (empty when there is no substitution).
  std::vector<SubstitutionPair> substitution_pairs;
  /// substituted[policy][replication][pair] = units sold to substitute customers (scored days).
  std::vector<std::vector<std::vector<double>>> substituted;
  std::vector<PolicyBreakdown> breakdown;  ///< per policy

  /// The values of one metric of one policy over replications, in replication order.
  std::vector<double> series(int policy, Metric m) const;
  /// Adds the rows of `more`, a run of the same scenario and policies over the replications
  /// that follow; the facts of the run (replications, seconds) are updated.
  void append(RunResult&& more);
};

}  // namespace larder
