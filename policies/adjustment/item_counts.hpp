#pragma once
// A whole-number parameter of an adjustment given as one number for every item or as a map
// from item id to number (e.g. `capacity: 40` or `capacity: { sourdough: 40, rye: 24 }`).

#include <optional>
#include <string_view>
#include <vector>

#include "policies/part_context.hpp"

namespace larder {

/// One whole number >= 0 per item (index = item index); reports and returns nullopt when
/// missing and `required`, out of [0, 1e9], or not whole.
std::optional<std::vector<int>> read_item_counts(PartContext& ctx, std::string_view key,
                                                 bool required);

}  // namespace larder
