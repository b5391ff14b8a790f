#include "reports/json_integer.hpp"

#include <fmt/format.h>

#include <stdexcept>
#include <string>

namespace larder {

namespace {

std::string shown(const nlohmann::json& j) {
  std::string s = j.dump();
  if (s.size() > 40) s = s.substr(0, 40) + "...";
  return s;
}

}  // namespace

std::int64_t json_integer(const nlohmann::json& j, std::string_view what, std::int64_t lo,
                          std::int64_t hi) {
  bool ok = false;
  std::int64_t v = 0;
  if (j.is_number_unsigned()) {
    const auto u = j.get<std::uint64_t>();
    ok = u <= static_cast<std::uint64_t>(INT64_MAX);
    v = ok ? static_cast<std::int64_t>(u) : 0;
  } else if (j.is_number_integer()) {
    v = j.get<std::int64_t>();
    ok = true;
  }
  if (!ok || v < lo || v > hi) {
    throw std::runtime_error(
        fmt::format("{} is {}; expected a whole number from {} to {}", what, shown(j), lo, hi));
  }
  return v;
}

int json_int(const nlohmann::json& j, std::string_view what, int lo, int hi) {
  return static_cast<int>(json_integer(j, what, lo, hi));
}

std::uint64_t json_uint64(const nlohmann::json& j, std::string_view what) {
  if (j.is_number_unsigned()) return j.get<std::uint64_t>();
  if (j.is_number_integer() && j.get<std::int64_t>() >= 0) {
    return static_cast<std::uint64_t>(j.get<std::int64_t>());
  }
  throw std::runtime_error(fmt::format(
      "{} is {}; expected a whole number from 0 to 18446744073709551615", what, shown(j)));
}

}  // namespace larder
