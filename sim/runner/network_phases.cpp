#include "sim/runner/network_phases.hpp"

#include <algorithm>

#include "sim/runner/parallel_tasks.hpp"

namespace larder {

std::vector<int> network_policies(std::span<const Policy> policies) {
  std::vector<int> out;
  for (size_t k = 0; k < policies.size(); ++k) {
    if (policies[k].quantity->network() != nullptr) out.push_back(static_cast<int>(k));
  }
  return out;
}

PhasedRuns::PhasedRuns(const SimSetup& setup, int first_rep, int n_reps, tbb::task_arena& arena)
    : setup_(setup),
      arena_(arena),
      n_reps_(n_reps),
      stores_(static_cast<int>(setup.scenario.stores.size())),
      planned_(network_policies(setup.policies)),
      runs_(static_cast<size_t>(n_reps * stores_)),
      records_(static_cast<size_t>(n_reps), std::vector<PlanRecord>(setup.policies.size())) {
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
  return plan_network(sc, target, inputs, detail);
}

void PhasedRuns::replan(int rep, int policy) {
  const NetworkPlan p = plan(rep, policy, false);
  const size_t n_items = setup_.scenario.items.size();
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

PhasedOutput run_in_phases(const SimSetup& setup, int first_rep, int n_reps,
                           tbb::task_arena& arena) {
  PhasedRuns runs(setup, first_rep, n_reps, arena);
  runs.run_until(setup.scenario.horizon.days);
  return {runs.tallies(), runs.plans()};
}

}  // namespace larder
