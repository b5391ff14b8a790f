#pragma once
// Reading a scenario file (scenario.md) into the typed `Scenario`: strict validation, every
// problem reported at once with file:line:col, unknown and repeated keys rejected.

#include <optional>
#include <string>

#include "sim/scenario/diagnostics.hpp"
#include "sim/scenario/scenario.hpp"

namespace larder {

/// Parses and validates scenario text; every problem goes to `diag` (all at once, never just the
/// first), in file order. Returns a Scenario when diag has no errors. `file_label` names the
/// text in messages and becomes `Scenario::file`. Throws nothing but std::bad_alloc.
std::optional<Scenario> parse_scenario(const std::string& yaml_text, const std::string& file_label,
                                       Diagnostics& diag);

/// Reads a file; throws InputError carrying all diagnostics (a missing/unreadable file is one
/// diagnostic without line).
Scenario load_scenario_file(const std::string& path);

}  // namespace larder
