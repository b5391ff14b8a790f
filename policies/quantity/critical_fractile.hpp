#pragma once

#include "sim/scenario/scenario.hpp"

namespace larder {

/// The newsvendor critical ratio (p - c + g) / (p - s + g) of an item with stockout penalty g;
/// s is the salvage value when leftovers are salvaged, else 0. 0 when there is nothing to gain.
double critical_ratio(const Item& item, double penalty);

}  // namespace larder
