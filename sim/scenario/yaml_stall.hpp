#pragma once
// A guard against a hang in yaml-cpp 0.7 (Debian 12), found by the scenario fuzz target: where a
// document should start, a token that cannot start a node (a lone `,`, or a tag or anchor
// followed by `,`) is never consumed, and `YAML::LoadAll` adds empty documents forever (yaml-cpp
// issue #1040, fixed upstream after 0.8). The check walks the documents with the event parser,
// which builds no nodes, and stops as soon as a document starts where the previous one started.

#include <optional>
#include <string>

namespace larder {

/// Where a document would start again without the parser moving on (0-based line and column),
/// or nullopt when the parser always moves on. May throw YAML::ParserException for text that is
/// not YAML, like YAML::LoadAll.
struct YamlStall {
  int line = 0;
  int column = 0;
  std::string what;  ///< "unexpected ','" (the character there), for the message
};
std::optional<YamlStall> find_yaml_stall(const std::string& text);

}  // namespace larder
