#include "sim/scenario/iso_date.hpp"

#include <catch2/catch.hpp>

using larder::CivilDate;

TEST_CASE("iso dates: shape, calendar validity, weekday, day arithmetic", "[scenario]") {
  SECTION("only YYYY-MM-DD is read") {
    CHECK(larder::parse_iso_date("2027-01-04") == CivilDate{2027, 1, 4});
    CHECK_FALSE(larder::parse_iso_date("2027-1-4"));    // ISO 8601 calendar date: two-digit month
    CHECK_FALSE(larder::parse_iso_date("27-01-04"));    // ISO 8601: four-digit year
    CHECK_FALSE(larder::parse_iso_date("2027/01/04"));  // ISO 8601: '-' separators
    CHECK_FALSE(larder::parse_iso_date("2027-01-04T00:00"));
    CHECK_FALSE(larder::parse_iso_date(""));
  }
  SECTION("dates must exist in the Gregorian calendar") {
    // Gregorian leap years: divisible by 4, except centuries not divisible by 400.
    CHECK(larder::is_real_date({2024, 2, 29}));
    CHECK(larder::is_real_date({2000, 2, 29}));
    CHECK_FALSE(larder::is_real_date({1900, 2, 29}));  // GNU date: "invalid date '1900-02-29'"
    CHECK_FALSE(larder::is_real_date({2027, 2, 29}));
    CHECK_FALSE(larder::is_real_date({2027, 4, 31}));  // April has 30 days
    CHECK_FALSE(larder::is_real_date({2027, 13, 1}));
    CHECK_FALSE(larder::is_real_date({2027, 0, 10}));
    CHECK_FALSE(larder::is_real_date({2027, 1, 0}));
  }
  SECTION("weekday, 0 = Monday") {
    // Expected weekdays from GNU coreutils `date -u -d DATE +%A`.
    CHECK(larder::weekday_of_date({2027, 1, 4}) == 0);    // Monday
    CHECK(larder::weekday_of_date({2026, 12, 2}) == 2);   // Wednesday
    CHECK(larder::weekday_of_date({1970, 1, 1}) == 3);    // Thursday
    CHECK(larder::weekday_of_date({2000, 2, 29}) == 1);   // Tuesday
    CHECK(larder::weekday_of_date({2024, 2, 29}) == 3);   // Thursday
    CHECK(larder::weekday_of_date({2027, 12, 31}) == 4);  // Friday
  }
  SECTION("adding days") {
    // Expected dates from GNU coreutils `date -u -d 'DATE +N days' +%F`.
    CHECK(larder::add_days({2027, 1, 4}, 364) == CivilDate{2028, 1, 3});
    CHECK(larder::add_days({2024, 2, 28}, 1) == CivilDate{2024, 2, 29});
    CHECK(larder::add_days({2027, 1, 4}, -5) == CivilDate{2026, 12, 30});
    CHECK(larder::to_iso({2027, 1, 4}) == "2027-01-04");
  }
}
