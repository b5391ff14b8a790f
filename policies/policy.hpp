#pragma once
// A policy: forecast -> censoring treatment -> quantity rule -> adjustments (policies.md),
// each part created by name from the registry and validated against its own parameters.

#include <memory>
#include <string>
#include <vector>

#include "policies/registry.hpp"

namespace larder {

struct Policy {
  std::string name;
  /// The scenario as this policy sees it when its leftovers differ from the items' own
  /// (`leftovers:` on the policy: the items replaced by `PolicySpec::items`); null otherwise.
  /// Its parts were created with it, and the engine hands it to their per-store states.
  std::shared_ptr<const Scenario> own_scenario;
  /// The scenario this policy's parts see: `own_scenario` or the shared one.
  const Scenario& seen(const Scenario& shared) const {
    return own_scenario ? *own_scenario : shared;
  }
  std::unique_ptr<ForecastMethod> forecast;
  std::unique_ptr<CensoringMethod> censoring;
  std::unique_ptr<QuantityMethod> quantity;
  std::vector<std::unique_ptr<AdjustmentMethod>> adjustments;
};

/// Creates every policy of the scenario; problems (unknown part names, bad or unknown
/// parameters) go to `diag`, all at once. The result is complete only when diag is ok.
std::vector<Policy> build_policies(const Scenario& scenario, Diagnostics& diag);

}  // namespace larder
