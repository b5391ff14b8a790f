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

/// The most replications a scenario (or `-r`) may ask for.
inline constexpr int kMaxReplications = 1000000;

/// The text of a scenario file (a FIFO or device too), read with the 16 MiB cap before anything
/// larger is allocated; throws InputError when it cannot be read or is larger.
std::string read_scenario_text(const std::string& path);

/// Reads a file; throws InputError carrying all diagnostics (a missing/unreadable file is one
/// diagnostic without line).
Scenario load_scenario_file(const std::string& path);

}  // namespace larder
