#pragma once
// Replications with network-planned policies (`network_in_stock`): every store of a
// replication runs up to a re-plan day, the plan reads every store's forecasts and hands each
// store its levels, then the stores run on to the next re-plan. Stores run in parallel within
// a phase and replications plan in parallel between phases; every plan sums in a fixed order,
// so results stay bit-identical at any thread count.

#include <tbb/task_arena.h>

#include <memory>
#include <span>
#include <vector>

#include "policies/network/network_plan.hpp"
#include "sim/runner/store_tallies.hpp"

namespace larder {

/// The indices of the policies whose quantity rule is planned across the network.
std::vector<int> network_policies(std::span<const Policy> policies);

/// What the plans of one policy in one replication said, summed over the plans made on scored
/// days (all plans when none was).
struct PlanRecord {
  std::vector<double> level;     ///< per group: sum of planned levels
  std::vector<double> in_stock;  ///< per group: sum of expected in-stock shares
  int plans = 0;
  int scored_plans = 0;
};

/// Per policy, per item: the level corrections of the network-planned policies
/// (level_corrections.hpp).
using PlanCorrections = std::vector<std::vector<LevelCorrection>>;

/// Every store of a batch of replications, run in phases between re-plans. Each plan of a
/// replication learns from the closes its stores have seen since its last plan: the in-stock
/// calibration (in_stock_calibration.hpp) of what that plan expected against what the stores
/// saw.
class PhasedRuns {
 public:
  /// Replications first_rep .. first_rep + n_reps - 1, every store, at day 0. `corrections`
  /// (level_corrections(), measured once per run) are measured here when not given.
  PhasedRuns(const SimSetup& setup, int first_rep, int n_reps, tbb::task_arena& arena,
             const PlanCorrections* corrections = nullptr);
  /// Runs every store up to `day` (exclusive), re-planning at each re-plan day on the way.
  void run_until(int day);
  /// The plan policy `policy` would make for replication `first_rep + rep` on day `day_`, with
  /// the calibration learned up to its last re-plan.
  NetworkPlan plan(int rep, int policy, bool detail) const;
  /// Policy `policy`'s level corrections, per item (empty when none is needed).
  std::span<const LevelCorrection> corrections(int policy) const {
    return (*corrections_)[static_cast<size_t>(policy)];
  }
  /// The run of store `store` in replication `first_rep + rep` (after run_until: its last day).
  const StoreRun& run(int rep, int store) const {
    return *runs_[static_cast<size_t>(rep * stores_ + store)];
  }
  /// The tallies of task r * stores + s.
  std::vector<StoreTallies> tallies() const;
  /// What the plans said, [rep][policy] (empty records for policies that do not plan).
  const std::vector<std::vector<PlanRecord>>& plans() const { return records_; }

 private:
  void replan(int rep, int policy);

  /// What one policy's plans in one replication learned from the closes.
  struct Feedback {
    CloseRecord closes;
    InStockCalibration calibration;
    std::vector<int> group_of;     ///< the last plan's group per store-item
    std::vector<double> expected;  ///< the last plan's raw in-stock per group
    std::vector<CloseCount> seen;  ///< per store-item: counts at the last plan
  };

  const SimSetup& setup_;
  tbb::task_arena& arena_;
  int n_reps_;
  int stores_;
  int day_ = 0;  ///< every store has run the days before this one
  std::vector<int> planned_;
  std::vector<std::unique_ptr<StoreRun>> runs_;
  std::vector<std::vector<PlanRecord>> records_;
  PlanCorrections own_corrections_;
  const PlanCorrections* corrections_;
  std::vector<std::vector<Feedback>> feedback_;  ///< [rep][policy]
};

struct PhasedOutput {
  std::vector<StoreTallies> tallies;           ///< task r * stores + s
  std::vector<std::vector<PlanRecord>> plans;  ///< [rep][policy]
};

/// Runs replications first_rep .. first_rep + n_reps - 1 (every store) over the horizon in
/// phases.
PhasedOutput run_in_phases(const SimSetup& setup, int first_rep, int n_reps, tbb::task_arena& arena,
                           const PlanCorrections& corrections);

}  // namespace larder
