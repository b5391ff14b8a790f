#include "sim/scenario/iso_date.hpp"

#include <fmt/format.h>

#include <chrono>

namespace larder {

namespace {

std::chrono::year_month_day to_ymd(const CivilDate& d) {
  return std::chrono::year_month_day{std::chrono::year{d.year},
                                     std::chrono::month{static_cast<unsigned>(d.month)},
                                     std::chrono::day{static_cast<unsigned>(d.day)}};
}

std::optional<int> digits(std::string_view text) {
  int v = 0;
  for (char c : text) {
    if (c < '0' || c > '9') return std::nullopt;
    v = v * 10 + (c - '0');
  }
  return v;
}

}  // namespace

std::optional<CivilDate> parse_iso_date(std::string_view text) {
  if (text.size() != 10 || text[4] != '-' || text[7] != '-') return std::nullopt;
  const auto y = digits(text.substr(0, 4));
  const auto m = digits(text.substr(5, 2));
  const auto d = digits(text.substr(8, 2));
  if (!y || !m || !d) return std::nullopt;
  return CivilDate{*y, *m, *d};
}

bool is_real_date(const CivilDate& date) {
  if (date.month < 1 || date.month > 12 || date.day < 1 || date.day > 31) return false;
  return to_ymd(date).ok();
}

int weekday_of_date(const CivilDate& date) {
  const std::chrono::weekday wd{std::chrono::sys_days{to_ymd(date)}};
  return static_cast<int>(wd.iso_encoding()) - 1;
}

CivilDate add_days(const CivilDate& date, int days) {
  const std::chrono::year_month_day ymd{std::chrono::sys_days{to_ymd(date)} +
                                        std::chrono::days{days}};
  return {static_cast<int>(ymd.year()), static_cast<int>(static_cast<unsigned>(ymd.month())),
          static_cast<int>(static_cast<unsigned>(ymd.day()))};
}

std::int64_t day_number(const CivilDate& date) {
  return std::chrono::sys_days{to_ymd(date)}.time_since_epoch().count();
}

std::string to_iso(const CivilDate& date) {
  return fmt::format("{:04}-{:02}-{:02}", date.year, date.month, date.day);
}

}  // namespace larder
