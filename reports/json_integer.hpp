#pragma once
// Whole numbers read from larder's own JSON files (shard files, scorecards) with their range
// checked before any conversion: a forged or damaged file with 1e308, -1 or 2^40 where a count
// belongs is refused by name instead of wrapping ("shard 2 of -727379968").

#include <cstdint>
#include <nlohmann/json.hpp>
#include <string_view>

namespace larder {

/// The integer `j` holds, if it is a JSON whole number (not 2.0 or 1e3) from `lo` to `hi`;
/// else std::runtime_error naming `what`, the value and the range.
std::int64_t json_integer(const nlohmann::json& j, std::string_view what, std::int64_t lo,
                          std::int64_t hi);

/// json_integer as an int (the range must lie within int's).
int json_int(const nlohmann::json& j, std::string_view what, int lo, int hi);

/// A JSON whole number from 0 to 2^64 - 1 (seeds).
std::uint64_t json_uint64(const nlohmann::json& j, std::string_view what);

}  // namespace larder
