#pragma once
// What a store records about one item on one day (model.md, Observation). Policies see only
// this: never true demand or lost customers.

#include <cstdint>
#include <limits>

namespace larder {

struct Observation {
  std::int32_t delivered = 0;  ///< units delivered this morning
  std::int32_t sold = 0;       ///< sales at any price (to any customer: the store cannot tell)
  std::int32_t sold_discounted = 0;  ///< of which at a discounted price (next-day or markdown)
  std::int32_t leftover = 0;         ///< sellable units on the shelf at close, at any price
  std::int32_t wasted = 0;           ///< units discarded at close
  std::int32_t salvaged = 0;         ///< units sent to salvage at close
  std::int32_t donated = 0;          ///< units donated at close
  bool open = false;      ///< the store was open (closed days carry no sales information)
  bool sold_out = false;  ///< open and no unit left at close: demand >= stock (censored)
  /// With `observe: intraday`: hours after opening at which the last unit sold (NaN when the
  /// item did not sell out, or the policy observes daily).
  float sellout_hour = std::numeric_limits<float>::quiet_NaN();
};

}  // namespace larder
