#pragma once
// Options that override scenario keys are read with the keys' own rules and messages (issue
// 23): `--seed` as `seed:` (digits only, 0 to 2^64 - 1: -1, 1e26 and 2^64 are refused, never
// wrapped), `-r` as `replications:` (a number that is whole, 1 to 1,000,000: `1e3` is 1000, as
// in the YAML). A bad value is an InputError (exit 2) before anything is read or created.

#include <cstdint>
#include <optional>
#include <string>

namespace larder {

/// `--seed TEXT`; nullopt when `text` is empty (not given).
std::optional<std::uint64_t> seed_option(const std::string& text);

/// `-r TEXT`; nullopt when `text` is empty (not given).
std::optional<int> replications_option(const std::string& text);

}  // namespace larder
