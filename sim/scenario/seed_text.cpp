#include "sim/scenario/seed_text.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <charconv>
#include <limits>

namespace larder {

std::optional<std::uint64_t> parse_seed_text(std::string_view text) {
  const bool digits_only = !text.empty() && std::all_of(text.begin(), text.end(), [](char c) {
    return c >= '0' && c <= '9';
  });
  if (!digits_only) return std::nullopt;
  std::uint64_t v = 0;
  const auto [end, ec] = std::from_chars(text.data(), text.data() + text.size(), v);
  if (ec != std::errc{} || end != text.data() + text.size()) return std::nullopt;
  return v;
}

std::string seed_rule(std::string_view what) {
  return fmt::format("{} must be a whole number in [0, {}]", what,
                     std::numeric_limits<std::uint64_t>::max());
}

}  // namespace larder
