#pragma once
// The small pieces of CSV output shared by the writers: RFC 4180 quoting and numbers that read
// back to the same double.

#include <string>
#include <string_view>

namespace larder {

/// `field` as a CSV field: unchanged, or in double quotes (inner quotes doubled) when it holds a
/// comma, a double quote, a carriage return or a newline (RFC 4180).
std::string csv_field(std::string_view field);

/// `value` in its shortest form that reads back (strtod) to the same double: 0.1 as "0.1", 250 as
/// "250", 1e-07 as "1e-07"; an empty field for a value that is not finite (not available, e.g.
/// the interval of one replication), so no CSV file ever holds "nan" or "inf".
std::string csv_number(double value);

}  // namespace larder
