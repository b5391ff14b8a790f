#pragma once
// YAML itself forbids repeated keys in a mapping, but yaml-cpp accepts them and lookups silently
// see only the first: a repeated key is reported here, at its second occurrence.

#include <yaml-cpp/yaml.h>

#include <string>

#include "sim/scenario/diagnostics.hpp"

namespace larder {

/// Reports every key that appears twice in one mapping anywhere under `root` (message
/// "duplicate key 'k' in <path>", hint naming the line of the first). Aliased nodes are visited
/// once.
void report_duplicate_keys(const YAML::Node& root, const std::string& file, Diagnostics& diag);

}  // namespace larder
