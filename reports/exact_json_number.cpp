#include "reports/exact_json_number.hpp"

#include <fmt/format.h>

#include <bit>
#include <charconv>
#include <cmath>
#include <cstdint>
#include <limits>
#include <stdexcept>
#include <string>

namespace larder {

namespace {

constexpr std::string_view kNanPrefix = "nan:";

double nan_from_text(std::string_view hex) {
  std::uint64_t bits = 0;
  const auto [end, ec] = std::from_chars(hex.data(), hex.data() + hex.size(), bits, 16);
  const double value = std::bit_cast<double>(bits);
  if (ec != std::errc{} || end != hex.data() + hex.size() || hex.size() != 16 ||
      !std::isnan(value)) {
    throw std::runtime_error(fmt::format("'nan:{}' is not the bit pattern of a NaN", hex));
  }
  return value;
}

}  // namespace

nlohmann::json exact_json_number(double value) {
  if (std::isfinite(value)) return value;
  if (std::isnan(value)) {
    return fmt::format("{}{:016x}", kNanPrefix, std::bit_cast<std::uint64_t>(value));
  }
  return value > 0 ? "inf" : "-inf";
}

double exact_json_number_value(const nlohmann::json& j) {
  if (j.is_number()) return j.get<double>();
  if (j.is_string()) {
    const auto& s = j.get_ref<const std::string&>();
    if (s == "inf") return std::numeric_limits<double>::infinity();
    if (s == "-inf") return -std::numeric_limits<double>::infinity();
    if (s.starts_with(kNanPrefix))
      return nan_from_text(std::string_view(s).substr(kNanPrefix.size()));
  }
  throw std::runtime_error(fmt::format("expected a number, got {}", j.dump()));
}

}  // namespace larder
