#include "sim/scenario/ids.hpp"

#include <fmt/format.h>

namespace larder {

namespace {
bool is_id_char(char c) {
  return (c >= 'a' && c <= 'z') || (c >= 'A' && c <= 'Z') || (c >= '0' && c <= '9') || c == '_' ||
         c == '-' || c == '.';
}
}  // namespace

std::string id_problem(std::string_view text) {
  if (text.empty()) return "must not be empty";
  if (text.size() > kMaxIdLength) {
    return fmt::format(
        "must be at most {} characters (got {}): ids name folders and files, "
        "whose names are limited",
        kMaxIdLength, text.size());
  }
  for (char c : text) {
    if (!is_id_char(c)) return fmt::format("must use only {} (got '{}')", kIdCharacters, text);
  }
  if (text == "." || text == "..") return fmt::format("must not be '{}'", text);
  return {};
}

}  // namespace larder
