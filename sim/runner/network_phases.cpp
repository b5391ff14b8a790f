#include "sim/runner/network_phases.hpp"

#include <algorithm>

#include "policies/network/level_curve.hpp"
#include "sim/runner/level_corrections.hpp"
#include "sim/runner/parallel_tasks.hpp"

namespace larder {

/// Per re-plan, the weight earlier closes keep in the calibration. The forecasts' bias moves
/// with the levels the plans set (they learn from sales cut off at those levels), so only the
/// closes since the last plan are kept: on grouping.yaml that met the target within 1 point
/// (69.1-69.7% for 70%), against 68.6-69.1% keeping half and 68.0-68.5% keeping all.
constexpr double kCalibrationMemory = 0.0;

std::vector<int> network_policies(std::span<const Policy> policies) {
  std::vector<int> out;
  for (size_t k = 0; k < policies.size(); ++k) {
    if (policies[k].quantity->network() != nullptr) out.push_back(static_cast<int>(k));
  }
  return out;
}

PhasedRuns::PhasedRuns(const SimSetup& setup, int first_rep, int n_reps, tbb::task_arena& arena,
                       const PlanCorrections* corrections)
    : setup_(setup),
      arena_(arena),
      n_reps_(n_reps),
      stores_(static_cast<int>(setup.scenario.stores.size())),
      planned_(network_policies(setup.policies)),
      runs_(static_cast<size_t>(n_reps * stores_)),
      records_(static_cast<size_t>(n_reps), std::vector<PlanRecord>(setup.policies.size())),
      corrections_(corrections),
      feedback_(static_cast<size_t>(n_reps), std::vector<Feedback>(setup.policies.size())) {
  if (corrections_ == nullptr) {
    own_corrections_ = level_corrections(setup.scenario, setup.policies, default_levels(),
                                         arena.max_concurrency());
    corrections_ = &own_corrections_;
  }
  arena_.execute([&] {
    parallel_tasks(n_reps_ * stores_, [&](int task) {
      runs_[static_cast<size_t>(task)] =
          std::make_unique<StoreRun>(setup_, first_rep + task / stores_, task % stores_);
    });
  });
}

NetworkPlan PhasedRuns::plan(int rep, int policy, bool detail) const {
  const Scenario& sc = setup_.scenario;
  const NetworkTarget& target = *setup_.policies[static_cast<size_t>(policy)].quantity->network();
  const std::vector<int> days = plan_days(day_, sc.horizon.days);
  const size_t n_items = sc.items.size();
  std::vector<StorePlanInput> inputs(static_cast<size_t>(stores_));
  for (int s = 0; s < stores_; ++s) {
    const StoreRun& run = *runs_[static_cast<size_t>(rep * stores_ + s)];
    StorePlanInput& in = inputs[static_cast<size_t>(s)];
    for (int d : days) {
      if (run.is_open(d)) in.days.push_back(d);
    }
    in.forecasts.resize(in.days.size() * n_items);
    run.forecasts(policy, in.days, in.forecasts);
  }
  PlanLearning learning;
  learning.correction = (*corrections_)[static_cast<size_t>(policy)];
  learning.calibration =
      feedback_[static_cast<size_t>(rep)][static_cast<size_t>(policy)].calibration;
  return plan_network(sc, target, inputs, learning, detail);
}

void PhasedRuns::replan(int rep, int policy) {
  const size_t n_items = setup_.scenario.items.size();
  // The closes since the last plan, by the group that plan expected them in.
  Feedback& f = feedback_[static_cast<size_t>(rep)][static_cast<size_t>(policy)];
  const bool first = f.expected.empty();
  if (first) f.seen.assign(static_cast<size_t>(stores_) * n_items, CloseCount{});
  std::vector<std::int64_t> open(f.expected.size(), 0);
  std::vector<std::int64_t> in_stock(f.expected.size(), 0);
  for (int s = 0; s < stores_; ++s) {
    const auto counts = runs_[static_cast<size_t>(rep * stores_ + s)]->close_counts(policy);
    for (size_t i = 0; i < n_items; ++i) {
      const size_t k = static_cast<size_t>(s) * n_items + i;
      if (!first) {
        const auto g = static_cast<size_t>(f.group_of[k]);
        open[g] += counts[i].open_days - f.seen[k].open_days;
        in_stock[g] += counts[i].in_stock_days - f.seen[k].in_stock_days;
      }
      f.seen[k] = counts[i];
    }
  }
  f.closes.decay(kCalibrationMemory);
  for (size_t g = 0; g < open.size(); ++g) f.closes.add(f.expected[g], open[g], in_stock[g]);
  f.calibration = f.closes.fit();
  const NetworkPlan p = plan(rep, policy, false);
  f.expected = p.group_raw_in_stock;
  f.group_of = p.groups.of_store_item;
  // Plans on scored days make the record; until the first one, every plan does.
  PlanRecord& r = records_[static_cast<size_t>(rep)][static_cast<size_t>(policy)];
  const bool scored = day_ >= setup_.scenario.horizon.warmup_days;
  if (scored && r.scored_plans == 0) r = PlanRecord{};
  if (scored || r.scored_plans == 0) {
    r.level.resize(p.group_level.size(), 0.0);
    r.in_stock.resize(p.group_level.size(), 0.0);
    for (size_t g = 0; g < p.group_level.size(); ++g) {
      r.level[g] += p.group_level[g];
      r.in_stock[g] += p.group_in_stock[g];
    }
    ++r.plans;
    r.scored_plans += scored ? 1 : 0;
  }
  for (int s = 0; s < stores_; ++s) {
    runs_[static_cast<size_t>(rep * stores_ + s)]->set_levels(
        policy,
        std::span<const double>(p.level).subspan(static_cast<size_t>(s) * n_items, n_items));
  }
}

void PhasedRuns::run_until(int day) {
  arena_.execute([&] {
    while (day_ < day) {
      // Re-plan where due, then run to the next re-plan day (or `day`).
      int next = day;
      for (int k : planned_) {
        const int every = setup_.policies[static_cast<size_t>(k)].quantity->network()->replan_days;
        next = std::min(next, (day_ / every + 1) * every);
      }
      parallel_tasks(n_reps_, [&](int r) {
        for (int k : planned_) {
          const int every =
              setup_.policies[static_cast<size_t>(k)].quantity->network()->replan_days;
          if (day_ % every == 0) replan(r, k);
        }
      });
      const int begin = day_;
      parallel_tasks(n_reps_ * stores_,
                     [&](int task) { runs_[static_cast<size_t>(task)]->run_days(begin, next); });
      day_ = next;
    }
  });
}

std::vector<StoreTallies> PhasedRuns::tallies() const {
  std::vector<StoreTallies> out;
  out.reserve(runs_.size());
  for (const auto& run : runs_) out.push_back(collect_tallies(*run, setup_.policies.size()));
  return out;
}

PhasedOutput run_in_phases(const SimSetup& setup, int first_rep, int n_reps, tbb::task_arena& arena,
                           const PlanCorrections& corrections) {
  PhasedRuns runs(setup, first_rep, n_reps, arena, &corrections);
  runs.run_until(setup.scenario.horizon.days);
  return {runs.tallies(), runs.plans()};
}

}  // namespace larder
