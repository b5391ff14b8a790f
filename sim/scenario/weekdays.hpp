#pragma once
// Weekday names in scenario files (mon ... sun, lower case): single names, lists of days (open
// or delivery weekdays) and per-weekday multipliers (demand.weekday).

#include <yaml-cpp/yaml.h>

#include <array>
#include <optional>
#include <string>
#include <string_view>

#include "sim/scenario/diagnostics.hpp"
#include "sim/scenario/params.hpp"
#include "sim/scenario/scenario.hpp"

namespace larder {

/// Per-weekday values, Monday first.
using WeekdayValues = std::array<double, kDaysPerWeek>;

/// Index (0 = Monday) of a weekday name such as "mon"; nullopt for anything else.
std::optional<int> weekday_index(std::string_view name);

/// "mon, tue, wed, thu, fri, sat, sun", for messages.
std::string weekday_names_text();

/// A hint for a word that is not a weekday name: a close match or the list of names.
std::string weekday_hint(std::string_view word);

/// Reads a non-empty list of weekday names (e.g. [mon, tue]) without repeats. Problems go to
/// `diag` with `what` as the path (e.g. "stores[1].open_weekdays"); nullopt if there was any.
std::optional<WeekdaySet> read_weekday_set(const YAML::Node& node, const std::string& what,
                                           const std::string& file, Diagnostics& diag);

/// Reads a mapping from weekday name to a number in `range` (e.g. { mon: 0.9, sat: 1.4 });
/// weekdays not listed are 1. Problems go to `diag`; nullopt if there was any.
std::optional<WeekdayValues> read_weekday_values(const YAML::Node& node, const std::string& what,
                                                 Range range, const std::string& file,
                                                 Diagnostics& diag);

}  // namespace larder
