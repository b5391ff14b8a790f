#pragma once
// Helpers for tests that simulate: a scenario from YAML text, its policies, and a run.

#include <stdexcept>
#include <string>

#include "policies/policy.hpp"
#include "sim/runner/monte_carlo.hpp"
#include "sim/scenario/load_scenario.hpp"
#include "sim/stats/summary.hpp"

namespace larder::test {

/// Parses a scenario or throws with every diagnostic, so a broken fixture fails loudly.
inline Scenario scenario_from(const std::string& yaml) {
  Diagnostics diag;
  auto s = parse_scenario(yaml, "test.yaml", diag);
  if (!s) throw std::runtime_error(diag.format());
  return std::move(*s);
}

inline std::vector<Policy> policies_for(const Scenario& s) {
  Diagnostics diag;
  auto p = build_policies(s, diag);
  if (!diag.ok()) throw std::runtime_error(diag.format());
  return p;
}

/// Runs every policy of the scenario with `threads` threads.
inline RunResult run_scenario(const Scenario& s, int threads = 1) {
  RunOptions o;
  o.threads = threads;
  return run_policies(s, policies_for(s), o);
}

/// The estimate of one metric of one policy, divided by `per` (e.g. scored days).
inline Estimate metric_estimate(const RunResult& r, int policy, Metric m, double per = 1.0) {
  auto v = r.series(policy, m);
  for (double& x : v) x /= per;
  return estimate_mean(v);
}

}  // namespace larder::test
