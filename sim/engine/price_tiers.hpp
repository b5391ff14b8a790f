#pragma once
// Full-price and discounted units of one item on the same shelf (model.md, step 3): a customer
// takes a discounted unit with probability take_rate when one is shown, otherwise a full-price
// unit, and takes the other tier when the chosen one is empty. Given how many customers prefer
// each tier, the units taken from each tier do not depend on the order in which the customers
// come, because a tier can only overflow into the other once it is empty.

#include <algorithm>

namespace larder {

struct TierTake {
  int full = 0;        ///< full-price units taken
  int discounted = 0;  ///< discounted units taken
};

/// Units taken by `prefer_discounted` and `prefer_full` customers from `full` full-price and
/// `discounted` discounted units.
constexpr TierTake take_tiers(int prefer_discounted, int prefer_full, int full, int discounted) {
  const int d = std::min(prefer_discounted, discounted);
  const int f = std::min(prefer_full, full);
  return {f + std::min(full - f, prefer_discounted - d),
          d + std::min(discounted - d, prefer_full - f)};
}

}  // namespace larder
