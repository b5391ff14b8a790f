#pragma once
// Numbers for people to read (the terminal table): rounded to what the confidence interval
// supports, with thousands separators, shares as percentages. Files use csv_number instead,
// which keeps every digit.

#include <string>
#include <string_view>

namespace larder {

/// Decimals that show a half-width to about two significant digits, between 0 and 3
/// (12.3 -> 0, 1.23 -> 1, 0.123 -> 2, 0.0123 -> 3); 1 when the half-width is 0 or not finite.
int display_decimals(double half_width);

/// `value` rounded to `decimals` (fmt's correctly rounded fixed notation) with a comma between
/// thousands and no negative zero: 1234567.891, 2 -> "1,234,567.89"; -0.04, 1 -> "0.0";
/// "n/a" when not finite.
std::string format_number(double value, int decimals);

/// Shares (`unit` "share") are shown as percentages: 0.123 -> "12.3"; other values unchanged.
double display_value(double value, std::string_view unit);

/// "mean ± half-width" as the table shows it, for a metric of `unit` ("units", "share", "money",
/// "kg"): shares as percentages with 1 decimal, others with `decimals`, or display_decimals of
/// the half-width when `decimals` is negative. The unit itself is not included.
std::string format_estimate(double mean, double half_width, std::string_view unit,
                            int decimals = -1);

/// Decimals format_estimate would use for these arguments.
int estimate_decimals(double half_width, std::string_view unit, int decimals = -1);

/// "low to high" with the same rounding rules as format_estimate; "n/a" when either end is not
/// finite (an interval that is not available).
std::string format_interval(double low, double high, std::string_view unit, int decimals = -1);

/// The label of a unit in a table's unit column: "%" for shares ("% pts" for differences of
/// shares), the currency for money ("money" when there is none), else the unit itself.
std::string unit_label(std::string_view unit, std::string_view currency, bool difference = false);

}  // namespace larder
