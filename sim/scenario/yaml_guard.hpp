#pragma once
// Guard rails around yaml-cpp for files written by hand or exported by other systems. yaml-cpp
// parses by recursive descent and shares aliased nodes, so a hostile file can exhaust the stack
// (deep nesting) or make any later walk exponential (an alias bomb: each anchor a list of
// aliases of the previous one). Two cheap checks keep the loader safe:
//   - before parsing, a text scan (`check_yaml_text`): the size, bytes that are not UTF-8 text
//     (binary garbage), and the nesting depth of block and flow collections;
//   - after parsing, a count of the nodes the document would have with every alias expanded
//     (`check_yaml_expansion`), done without expanding: each distinct node is counted once and
//     its expanded size memoised.
// Each problem becomes one `file:line:col: error:` diagnostic naming the limit.

#include <yaml-cpp/yaml.h>

#include <cstddef>
#include <string>
#include <string_view>

#include "sim/scenario/diagnostics.hpp"

namespace larder {

/// The limits; a real scenario stays far below each (a large one: about 100 KB, 8 levels,
/// 10,000 nodes).
struct YamlLimits {
  std::size_t max_bytes = std::size_t{16} << 20;  ///< 16 MiB of text
  int max_depth = 64;                             ///< nested collections
  std::size_t max_expanded_nodes = 2'000'000;     ///< nodes with every alias expanded
};

/// Scans the text before yaml-cpp sees it: too large, not UTF-8 text (a NUL byte or an invalid
/// sequence), or nested deeper than the limit. Reports the first problem of each kind; returns
/// whether the text may be parsed.
bool check_yaml_text(std::string_view text, const std::string& file, Diagnostics& diag,
                     const YamlLimits& limits = {});

/// The number of nodes `root` would have with every alias expanded, saturating at `cap` + 1.
/// Linear in the number of distinct nodes.
std::size_t expanded_node_count(const YAML::Node& root, std::size_t cap);

/// Reports a document whose alias expansion exceeds the limit (an alias bomb); returns whether
/// the document may be walked.
bool check_yaml_expansion(const YAML::Node& root, const std::string& file, Diagnostics& diag,
                          const YamlLimits& limits = {});

}  // namespace larder
