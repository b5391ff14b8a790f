#pragma once
// The rule for a random seed, shared by the scenario's `seed:` key and `--seed`: a whole
// number of decimal digits only, from 0 to 2^64 - 1 (no sign, exponent or fraction, so -1,
// 1e26 and 2^64 are refused rather than wrapped or rounded).

#include <cstdint>
#include <optional>
#include <string>
#include <string_view>

namespace larder {

/// The seed `text` holds, or nullopt when it breaks the rule.
std::optional<std::uint64_t> parse_seed_text(std::string_view text);

/// "seed must be a whole number in [0, 18446744073709551615]": the rule in words, after `what`.
std::string seed_rule(std::string_view what);

}  // namespace larder
