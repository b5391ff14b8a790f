#pragma once
// A sweep (`larder sweep`): the scenario rerun at every point of a grid of settings
// (scenario_edit.hpp), all on the same seed, so every point and policy sees the same demand
// draws (common random numbers) and differences between points are not noise of the draws.

#include <cstdint>
#include <optional>
#include <span>
#include <string>
#include <vector>

#include "sim/runner/monte_carlo.hpp"
#include "sim/scenario/scenario_edit.hpp"

namespace larder {

struct SweepPoint {
  /// One per setting, as given; with `varies`: empty for the base, else {path, value}.
  std::vector<std::string> values;
  RunResult result;
};

/// What is swept and how each point runs.
struct SweepSpec {
  std::string text;   ///< the scenario file's text
  std::string label;  ///< its name in messages
  std::vector<Setting> settings;
  /// Sensitivity instead of a grid (`--vary`): the base scenario, then each value of each
  /// setting alone. A value `-10%` / `+10%` scales every number the path reaches; a plain value
  /// sets it. A path without a dot means every item's key (`price` = `items.*.price`).
  std::vector<Setting> varies;
  std::optional<int> replications;    ///< overrides the scenario's
  std::optional<std::uint64_t> seed;  ///< overrides; else the scenario's (drawn once if absent)
  RunOptions options;
};

/// The scenario text of one grid point (also used by tests to compare with separate runs).
/// Throws InputError naming the setting when a path or value does not fit the document.
std::string point_text(const SweepSpec& spec, std::span<const std::string> values,
                       std::uint64_t seed);

/// Every point of the grid, the first setting varying slowest; `on_point` (if set) is told
/// when each point starts (index, count). Throws InputError on a bad setting or point.
std::vector<SweepPoint> run_sweep(const SweepSpec& spec,
                                  const std::function<void(int, int)>& on_point = {});

}  // namespace larder
