#pragma once
// Ids and names (scenario, stores, items, policies, attribute keys) end up in folder names and
// CSV files, so they are restricted to a portable character set.

#include <string>
#include <string_view>

namespace larder {

/// What ids may contain, for messages: "letters, digits, '_', '-' and '.'".
inline constexpr std::string_view kIdCharacters = "letters, digits, '_', '-' and '.'";

/// Why `text` cannot be an id, as the end of a sentence starting with its path (e.g. "must not be
/// empty"); empty when it is a valid id.
std::string id_problem(std::string_view text);

/// Whether `text` is a valid id: non-empty, only ASCII letters, digits, '_', '-' and '.', and not
/// "." or ".." (which would name another folder).
inline bool is_valid_id(std::string_view text) {
  return id_problem(text).empty();
}

}  // namespace larder
