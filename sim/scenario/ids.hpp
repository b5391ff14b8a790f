#pragma once
// Ids and names (scenario, stores, items, policies, attribute keys) end up in folder names and
// CSV files, so they are restricted to a portable character set.

#include <cstddef>
#include <string>
#include <string_view>

namespace larder {

/// What ids may contain, for messages: "letters, digits, '_', '-' and '.'".
inline constexpr std::string_view kIdCharacters = "letters, digits, '_', '-' and '.'";

/// The longest id: a scenario name becomes `larder-out/<name>-class/`, a trainee
/// `drill-<trainee>/`, a policy `allocation-<policy>.html`, within a file system's 255 bytes.
inline constexpr std::size_t kMaxIdLength = 200;

/// Why `text` cannot be an id, as the end of a sentence starting with its path (e.g. "must not be
/// empty"); empty when it is a valid id.
std::string id_problem(std::string_view text);

/// Whether `text` is a valid id: non-empty, only ASCII letters, digits, '_', '-' and '.', and not
/// "." or ".." (which would name another folder).
inline bool is_valid_id(std::string_view text) {
  return id_problem(text).empty();
}

}  // namespace larder
