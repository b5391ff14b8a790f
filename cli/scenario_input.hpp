#pragma once
// Reading a scenario for a command: the file (or the built-in demo), command-line overrides,
// and its policies, with every problem reported at once as InputError (exit code 2).

#include <optional>
#include <string>
#include <vector>

#include "policies/policy.hpp"
#include "sim/scenario/scenario.hpp"

namespace larder {

/// Options that override the scenario file.
struct Overrides {
  std::optional<int> replications;
  std::optional<std::uint64_t> seed;
};

struct PreparedScenario {
  Scenario scenario;
  std::vector<Policy> policies;
};

/// Loads `path` ("" = the built-in demo), applies overrides and builds the policies.
/// Throws InputError with every problem found.
PreparedScenario prepare_scenario(const std::string& path, const Overrides& overrides);

}  // namespace larder
