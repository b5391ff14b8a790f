#pragma once
// What a store records about one item on one day (model.md, Observation). Policies see only
// this: never true demand or lost customers.

#include <cstdint>

namespace larder {

struct Observation {
  std::int32_t delivered = 0;  ///< units delivered this morning
  std::int32_t sold = 0;       ///< full-price sales
  std::int32_t leftover = 0;   ///< sellable units on the shelf at close
  std::int32_t wasted = 0;     ///< units discarded at close
  std::int32_t salvaged = 0;   ///< units sent to salvage at close
  std::int32_t donated = 0;    ///< units donated at close
  bool open = false;           ///< the store was open (closed days carry no sales information)
  bool sold_out = false;       ///< open and no unit left at close: demand >= stock (censored)
};

}  // namespace larder
