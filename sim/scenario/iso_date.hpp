#pragma once
// Calendar dates written as ISO 8601 `YYYY-MM-DD` (proleptic Gregorian), for `horizon.start_date`
// and for dated histories: day index t of a scenario is start_date + t days.

#include <cstdint>
#include <optional>
#include <string>
#include <string_view>

namespace larder {

/// A calendar date (year, month 1-12, day 1-31).
struct CivilDate {
  int year = 1970;
  int month = 1;
  int day = 1;

  friend bool operator==(const CivilDate&, const CivilDate&) = default;
};

/// Reads exactly `YYYY-MM-DD` (four-digit year, two-digit month and day); nullopt when the text
/// has another shape. The date may still not exist (see `is_real_date`).
std::optional<CivilDate> parse_iso_date(std::string_view text);

/// Whether the date exists in the Gregorian calendar (e.g. 2027-02-30 does not).
bool is_real_date(const CivilDate& date);

/// Weekday of a real date, 0 = Monday ... 6 = Sunday.
int weekday_of_date(const CivilDate& date);

/// The real date `days` days after `date` (negative: before).
CivilDate add_days(const CivilDate& date, int days);

/// Days since 1970-01-01 (negative before), to order and subtract dates.
std::int64_t day_number(const CivilDate& date);

/// `YYYY-MM-DD`.
std::string to_iso(const CivilDate& date);

}  // namespace larder
