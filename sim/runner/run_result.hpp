#pragma once
// What a run produces: per policy, per replication, every metric. Everything reported
// (summary.json, metrics.csv, the terminal table) is derived from these rows, so shards can be
// merged by concatenating rows and recomputing, bit-identically.

#include <cstdint>
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

  /// The values of one metric of one policy over replications, in replication order.
  std::vector<double> series(int policy, Metric m) const;
};

}  // namespace larder
