#pragma once
// Changing a scenario by path before it is validated: `larder sweep --set PATH=V1,V2` and
// `--vary PATH=-10%,+10%`. A path walks the YAML document by keys separated by dots; in a list
// a step picks the element whose `name` (policies) or `id` (items, stores) equals it, or a
// number picks by position, and `*` picks every element. Examples:
//   policies.per-item-levels.quantity.target
//   items.sourdough.price        items.*.unit_cost        customers.fifo_share
// The edited document is validated like any scenario file, so every rule still applies.

#include <yaml-cpp/yaml.h>

#include <optional>
#include <string>
#include <vector>

namespace larder {

/// PATH=V1,V2,... as given on the command line.
struct Setting {
  std::string path;
  std::vector<std::string> values;
};

/// Splits "PATH=V1,V2,..." (values may not be empty); nullopt when malformed.
std::optional<Setting> parse_setting(const std::string& text);

/// Sets every node `path` reaches under `root` to `value` (a YAML scalar or flow value such as
/// `0.7`, `poisson` or `[mon, tue]`), creating a missing last key. Returns an empty string, or
/// what went wrong (e.g. "policies has no element named 'x'").
std::string set_path(YAML::Node root, const std::string& path, const std::string& value);

/// The numbers at every node `path` reaches (for relative changes); what went wrong in `error`.
std::vector<double> numbers_at(const YAML::Node& root, const std::string& path, std::string& error);

/// Scales every number `path` reaches by `factor` (`--vary price=-10%`).
std::string scale_path(YAML::Node root, const std::string& path, double factor);

}  // namespace larder
