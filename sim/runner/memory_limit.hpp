#pragma once
// `--max-memory`: a run whose estimated peak memory (run_estimate.hpp) exceeds the limit
// refuses to start, with a clear message, instead of being killed half-way.

#include <cstddef>
#include <optional>
#include <string>
#include <vector>

#include "policies/policy.hpp"

namespace larder {

/// "512M", "4G", "1.5G", "800000" (bytes); K, M, G, T are powers of 1024. nullopt if malformed.
std::optional<std::size_t> parse_memory_size(const std::string& text);

/// "512 MiB", "1.5 GiB".
std::string format_bytes(std::size_t bytes);

/// The default limit: half of the machine's physical memory (8 GiB if it cannot be read).
std::size_t default_memory_limit();

/// A lower bound of the memory a run needs, computed from the scenario's sizes alone (the demand
/// model's calendar of 10 bytes per store-day and its weekday laws of at least 100 bytes per
/// store-item and weekday, the result rows of 8 bytes per replication, policy and metric), so that
/// a run far too large is refused before anything that size is built.
std::size_t minimum_memory(const Scenario& scenario, std::size_t policies);

/// Throws InputError when the run's estimated memory exceeds `limit_text` (or the default).
/// Returns the estimate.
std::size_t check_memory(const Scenario& scenario, const std::vector<Policy>& policies, int threads,
                         const std::string& limit_text);

}  // namespace larder
