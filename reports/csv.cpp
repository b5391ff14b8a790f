#include "reports/csv.hpp"

#include <fmt/format.h>

#include <cmath>

namespace larder {

std::string csv_field(std::string_view field) {
  if (field.find_first_of(",\"\r\n") == std::string_view::npos) return std::string(field);
  std::string out;
  out.reserve(field.size() + 2);
  out += '"';
  for (char c : field) {
    if (c == '"') out += '"';
    out += c;
  }
  out += '"';
  return out;
}

std::string csv_number(double value) {
  if (!std::isfinite(value)) return {};  // not available: an empty field, never "nan"
  return fmt::format("{}", value);
}

}  // namespace larder
