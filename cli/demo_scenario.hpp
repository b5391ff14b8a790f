#pragma once

namespace larder {

/// The text of scenarios/demo.yaml, compiled in so `larder run` works without files.
const char* demo_scenario_text();

}  // namespace larder
