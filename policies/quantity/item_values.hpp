#pragma once
// A rule parameter given as one number for every item or as a map from item id to number
// (e.g. `quantity: 12` or `quantity: { sourdough: 12, rye: 8 }`).

#include <optional>
#include <string_view>
#include <vector>

#include "policies/part_context.hpp"

namespace larder {

/// One value per item (index = item index). A map must name existing items and every item.
/// Returns nullopt (after reporting) when missing and `required`, or invalid.
std::optional<std::vector<double>> read_item_values(PartContext& ctx, std::string_view key,
                                                    Range range, bool required);

}  // namespace larder
