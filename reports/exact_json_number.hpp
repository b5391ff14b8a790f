#pragma once
// Doubles in JSON that read back bit for bit, so merged shards report exactly what one run would.
// Finite values are JSON numbers (nlohmann::json prints the shortest decimal that reads back to the
// same double, and reads with strtod); values JSON has no number for (NaN, infinities) are strings,
// NaN with its bit pattern so even its sign and payload survive.

#include <nlohmann/json.hpp>

namespace larder {

/// `value` as JSON: a number when finite; "inf", "-inf" or "nan:<16 hex digits of the bits>".
nlohmann::json exact_json_number(double value);

/// The double `j` holds, as written by exact_json_number (a plain JSON integer is accepted too).
/// Throws std::runtime_error when `j` is neither a number nor one of those strings.
double exact_json_number_value(const nlohmann::json& j);

}  // namespace larder
