// The tier rule against a brute-force replay of customers one by one in every order: each takes
// a unit of the tier they prefer, or of the other tier when theirs is empty (model.md, step 3).
// The totals must not depend on the order (the property the engine relies on).

#include "sim/engine/price_tiers.hpp"

#include <algorithm>
#include <catch2/catch.hpp>
#include <vector>

namespace larder {
namespace {

TierTake replay(std::vector<bool> prefers_discounted, int full, int discounted) {
  TierTake t;
  for (const bool d : prefers_discounted) {
    if ((d && discounted > 0) || (!d && full == 0 && discounted > 0)) {
      --discounted;
      ++t.discounted;
    } else if (full > 0) {
      --full;
      ++t.full;
    }
  }
  return t;
}

TEST_CASE("take_tiers: hand-computed cases", "[engine][tiers]") {
  // 3 want discounted, 5 full price; 4 full and 2 discounted on the shelf: 2 discounted units
  // go, the third bargain hunter takes a full-price unit, leaving 3 for 5 others: all 4 go.
  CHECK(take_tiers(3, 5, 4, 2).full == 4);
  CHECK(take_tiers(3, 5, 4, 2).discounted == 2);
  // Plenty of both: everyone gets the tier they want.
  CHECK(take_tiers(3, 5, 10, 10).full == 5);
  CHECK(take_tiers(3, 5, 10, 10).discounted == 3);
  // Full price sold out: the others take discounted units.
  CHECK(take_tiers(1, 6, 2, 10).discounted == 5);
  CHECK(take_tiers(1, 6, 2, 10).full == 2);
}

TEST_CASE("take_tiers equals a one-by-one replay in every order", "[engine][tiers]") {
  for (int a = 0; a <= 4; ++a) {
    for (int b = 0; b <= 4; ++b) {
      for (int f = 0; f <= 5; ++f) {
        for (int d = 0; d <= 5; ++d) {
          std::vector<bool> order(static_cast<size_t>(a), true);
          order.insert(order.end(), static_cast<size_t>(b), false);
          std::sort(order.begin(), order.end());
          const TierTake want = take_tiers(a, b, f, d);
          do {
            const TierTake got = replay(order, f, d);
            INFO("a=" << a << " b=" << b << " full=" << f << " discounted=" << d);
            REQUIRE(got.full == want.full);
            REQUIRE(got.discounted == want.discounted);
          } while (std::next_permutation(order.begin(), order.end()));
        }
      }
    }
  }
}

}  // namespace
}  // namespace larder
