#include "sim/engine/shelf.hpp"

#include <algorithm>
#include <cassert>

namespace larder {

Shelf::Shelf(std::span<const int> shelf_life_days)
    : life_(shelf_life_days.begin(), shelf_life_days.end()) {
  int off = 0;
  for (int l : life_) {
    assert(l >= 1);
    offset_.push_back(off);
    off += l;
  }
  stock_.assign(static_cast<size_t>(off), 0);
}

int Shelf::total(int item) const {
  return at_least(item, 0);
}

int Shelf::at_least(int item, int a) const {
  int n = 0;
  for (int k = std::max(a, 0); k < life(item); ++k) n += slot(item, k);
  return n;
}

void Shelf::take(int item, int sold, int oldest) {
  assert(oldest <= sold && sold <= total(item));
  int need = oldest;
  for (int a = 0; need > 0; ++a) {
    const int t = std::min(need, static_cast<int>(slot(item, a)));
    slot(item, a) -= t;
    need -= t;
  }
  need = sold - oldest;
  for (int a = life(item) - 1; need > 0; --a) {
    const int t = std::min(need, static_cast<int>(slot(item, a)));
    slot(item, a) -= t;
    need -= t;
  }
}

int Shelf::expire(int item) {
  const int n = slot(item, 0);
  slot(item, 0) = 0;
  return n;
}

void Shelf::age(int item) {
  const int l = life(item);
  for (int a = 0; a + 1 < l; ++a) slot(item, a) = slot(item, a + 1);
  slot(item, l - 1) = 0;
}

}  // namespace larder
