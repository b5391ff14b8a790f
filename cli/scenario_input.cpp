#include "cli/scenario_input.hpp"

#include "cli/demo_scenario.hpp"
#include "sim/scenario/load_scenario.hpp"

namespace larder {

PreparedScenario prepare_scenario(const std::string& path, const Overrides& overrides) {
  PreparedScenario out;
  if (path.empty()) {
    Diagnostics diag;
    auto s = parse_scenario(demo_scenario_text(), "<demo>", diag);
    if (!s) throw InputError(diag);
    out.scenario = std::move(*s);
  } else {
    out.scenario = load_scenario_file(path);
  }
  if (overrides.replications) out.scenario.replications = *overrides.replications;
  if (overrides.seed) {
    out.scenario.seed = *overrides.seed;
    out.scenario.seed_given = true;
  }
  Diagnostics diag;
  out.policies = build_policies(out.scenario, diag);
  if (!diag.ok()) throw InputError(diag);
  return out;
}

}  // namespace larder
