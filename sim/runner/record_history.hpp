#pragma once
// What the stores would have recorded under one policy in one replication (`larder history`):
// every store, every item, every open day of the horizon, warm-up days included, as history
// rows (README, "History format"). The days are those of `larder run` (the same seed, streams
// and StoreRun), so a history can be checked against the run's own tallies. Rows stream to a
// sink day by day; only the store runs of one replication are held, never the rows.

#include <tbb/task_arena.h>

#include <functional>
#include <span>

#include "sim/engine/demand_model.hpp"
#include "sim/history/history_row.hpp"
#include "sim/runner/network_phases.hpp"

namespace larder {

/// The date of day 0: horizon.start_date, or else the first date on or after Monday 2027-01-04
/// (an invented date) that falls on horizon.start_weekday.
CivilDate history_start_date(const Scenario& scenario);

/// Runs one replication of a scenario with all its policies (as `larder run` does, network-
/// planned ones re-planning across the stores) and reports one policy's observations.
class HistoryRecorder {
 public:
  /// `policy` indexes `policies`; `scenario` and `policies` must outlive the recorder.
  HistoryRecorder(const Scenario& scenario, std::span<const Policy> policies, int policy,
                  int replication, tbb::task_arena& arena);
  /// The columns of the rows: sold_out_time and sales per opening hour when the days run hour
  /// by hour (a feature of the scenario depends on the hour), else the required ones only.
  const HistoryColumns& columns() const { return columns_; }
  /// Runs the whole horizon, calling `sink` for each open store-item-day in the order day,
  /// store, item, and `progress(days done, days)` after each day.
  void run(const std::function<void(const HistoryRow&)>& sink,
           const std::function<void(int, int)>& progress = {});

 private:
  const Scenario& scenario_;
  int policy_;
  DemandModel demand_;
  SimSetup setup_;
  PhasedRuns runs_;
  HistoryColumns columns_;
};

}  // namespace larder
