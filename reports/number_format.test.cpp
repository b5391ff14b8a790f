#include "reports/number_format.hpp"

#include <catch2/catch.hpp>
#include <limits>

// Every expected string below was worked by hand.

TEST_CASE("display_decimals keeps about two significant digits of the half-width", "[reports]") {
  using larder::display_decimals;
  CHECK(display_decimals(150.0) == 0);
  CHECK(display_decimals(12.3) == 0);
  CHECK(display_decimals(10.0) == 0);
  CHECK(display_decimals(9.99) == 1);
  CHECK(display_decimals(1.23) == 1);
  CHECK(display_decimals(0.123) == 2);
  CHECK(display_decimals(0.0123) == 3);
  CHECK(display_decimals(0.000123) == 3);  // at most 3
  CHECK(display_decimals(0.0) == 1);       // no interval (one replication, or no variation)
  CHECK(display_decimals(std::numeric_limits<double>::quiet_NaN()) == 1);
}

TEST_CASE("format_number rounds and separates thousands", "[reports]") {
  using larder::format_number;
  CHECK(format_number(0.0, 0) == "0");
  CHECK(format_number(7.0, 2) == "7.00");
  CHECK(format_number(999.0, 0) == "999");
  CHECK(format_number(1000.0, 0) == "1,000");
  CHECK(format_number(1234567.891, 2) == "1,234,567.89");
  CHECK(format_number(2569.6, 0) == "2,570");
  CHECK(format_number(999.96, 1) == "1,000.0");  // rounding carries into a new group
  CHECK(format_number(123456.0, 0) == "123,456");
  CHECK(format_number(-1234.56, 0) == "-1,235");
  CHECK(format_number(-1000000.0, 0) == "-1,000,000");
  CHECK(format_number(-19.8, 1) == "-19.8");
  CHECK(format_number(-0.06, 1) == "-0.1");
  CHECK(format_number(-0.04, 1) == "0.0");  // no negative zero
  CHECK(format_number(-0.0, 0) == "0");
  CHECK(format_number(0.0004, 3) == "0.000");
  CHECK(format_number(std::numeric_limits<double>::quiet_NaN(), 1) == "n/a");
  CHECK(format_number(-std::numeric_limits<double>::infinity(), 1) == "n/a");
}

TEST_CASE("format_estimate shows mean ± half-width in the metric's unit", "[reports]") {
  using larder::format_estimate;
  // Units, money and kg: decimals from the half-width.
  CHECK(format_estimate(126.8, 11.085, "units") == "127 ± 11");
  CHECK(format_estimate(-19.8, 2.388, "units") == "-19.8 ± 2.4");
  CHECK(format_estimate(2569.6, 110.94, "money") == "2,570 ± 111");
  CHECK(format_estimate(0.4567, 0.0321, "kg") == "0.457 ± 0.032");
  CHECK(format_estimate(5.0, 0.0, "kg") == "5.0 ± 0.0");
  // Decimals forced by the caller (a table row shares one rounding).
  CHECK(format_estimate(126.8, 11.085, "units", 1) == "126.8 ± 11.1");
  // Shares as percentages with one decimal.
  CHECK(format_estimate(0.1228, 0.0083015, "share") == "12.3 ± 0.8");
  CHECK(format_estimate(0.92, 0.019632, "share") == "92.0 ± 2.0");
  CHECK(format_estimate(-0.0178, 0.0016189, "share") == "-1.8 ± 0.2");
  CHECK(format_estimate(1.0, 0.0, "share") == "100.0 ± 0.0");
  CHECK(format_estimate(std::numeric_limits<double>::quiet_NaN(), 0.0, "share") == "n/a ± 0.0");
}

TEST_CASE("format_interval shows low to high with the same rounding", "[reports]") {
  using larder::format_interval;
  CHECK(format_interval(-22.1884, -17.4116, "units") == "-22.2 to -17.4");
  CHECK(format_interval(127.126, 170.474, "money") == "127 to 170");
  CHECK(format_interval(-15.5357, 9.1357, "money") == "-16 to 9");
  CHECK(format_interval(-0.0235529, -0.0124471, "share") == "-2.4 to -1.2");
  CHECK(format_interval(1950.0, 12400.0, "money", 0) == "1,950 to 12,400");
}

TEST_CASE("unit_label names the unit column", "[reports]") {
  using larder::unit_label;
  CHECK(unit_label("share", "EUR") == "%");
  CHECK(unit_label("share", "EUR", true) == "% pts");
  CHECK(unit_label("money", "EUR") == "EUR");
  CHECK(unit_label("money", "") == "money");
  CHECK(unit_label("units", "EUR") == "units");
  CHECK(unit_label("kg", "EUR", true) == "kg");
}
