#include "reports/number_format.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

namespace larder {

namespace {
constexpr int kShareDecimals = 1;
constexpr int kMaxDecimals = 3;
constexpr int kDefaultDecimals = 1;

bool is_share(std::string_view unit) {
  return unit == "share";
}
}  // namespace

int display_decimals(double half_width) {
  if (!std::isfinite(half_width) || half_width <= 0.0) return kDefaultDecimals;
  const int magnitude = static_cast<int>(std::floor(std::log10(half_width)));
  return std::clamp(1 - magnitude, 0, kMaxDecimals);
}

std::string format_number(double value, int decimals) {
  if (!std::isfinite(value)) return "n/a";
  decimals = std::max(decimals, 0);
  std::string digits = fmt::format("{:.{}f}", std::fabs(value), decimals);
  const bool all_zero = digits.find_first_not_of("0.") == std::string::npos;
  const bool negative = std::signbit(value) && !all_zero;

  const std::size_t point = digits.find('.');
  const std::size_t int_len = point == std::string::npos ? digits.size() : point;
  std::string out;
  out.reserve(digits.size() + digits.size() / 3 + 1);
  if (negative) out += '-';
  for (std::size_t i = 0; i < int_len; ++i) {
    if (i > 0 && (int_len - i) % 3 == 0) out += ',';
    out += digits[i];
  }
  out.append(digits, int_len, std::string::npos);
  return out;
}

double display_value(double value, std::string_view unit) {
  return is_share(unit) ? value * 100.0 : value;
}

int estimate_decimals(double half_width, std::string_view unit, int decimals) {
  if (decimals >= 0) return decimals;
  if (is_share(unit)) return kShareDecimals;
  return display_decimals(half_width);
}

std::string format_estimate(double mean, double half_width, std::string_view unit, int decimals) {
  const int d = estimate_decimals(half_width, unit, decimals);
  return fmt::format("{} ± {}", format_number(display_value(mean, unit), d),
                     format_number(display_value(half_width, unit), d));
}

std::string format_interval(double low, double high, std::string_view unit, int decimals) {
  if (!std::isfinite(low) || !std::isfinite(high)) return "n/a";  // e.g. one replication
  const int d = estimate_decimals((high - low) / 2.0, unit, decimals);
  return fmt::format("{} to {}", format_number(display_value(low, unit), d),
                     format_number(display_value(high, unit), d));
}

std::string unit_label(std::string_view unit, std::string_view currency, bool difference) {
  if (is_share(unit)) return difference ? "% pts" : "%";
  if (unit == "money") return currency.empty() ? "money" : std::string(currency);
  return std::string(unit);
}

}  // namespace larder
