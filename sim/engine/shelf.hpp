#pragma once
// Stock of one store under one policy, by item and remaining shelf life (model.md, steps 1-5).
// Slot a of an item holds units that can be sold today and on the a following days; slot 0 is
// the oldest (last sellable day), slot life-1 the freshest. Defined inline: these run once per
// store-item-day on the engine's hot path.

#include <algorithm>
#include <cassert>
#include <cstdint>
#include <span>
#include <vector>

namespace larder {

class Shelf {
 public:
  /// One entry per item: its shelf life in days (>= 1).
  explicit Shelf(std::span<const int> shelf_life_days)
      : life_(shelf_life_days.begin(), shelf_life_days.end()) {
    int off = 0;
    for (int l : life_) {
      assert(l >= 1);
      offset_.push_back(off);
      off += l;
    }
    stock_.assign(static_cast<size_t>(off), 0);
  }

  int life(int item) const { return life_[static_cast<size_t>(item)]; }
  /// Units of an item by slot (slot 0 the oldest).
  std::span<const std::int32_t> by_age(int item) const {
    return {slots(item), static_cast<size_t>(life(item))};
  }
  /// Units of an item on the shelf.
  int total(int item) const { return at_least(item, 0); }
  /// Units with `a` or more further days to live (slots a..life-1).
  int at_least(int item, int a) const {
    const std::int32_t* s = slots(item);
    int n = 0;
    for (int k = std::max(a, 0); k < life(item); ++k) n += s[k];
    return n;
  }
  /// Morning delivery: units arrive as the freshest.
  void receive(int item, int units) { slots(item)[life(item) - 1] += units; }
  /// Sells `sold` units (<= total): `oldest` of them from the oldest end, the rest from the
  /// freshest end (exact: the two ends only meet when the shelf runs out).
  void take(int item, int sold, int oldest) {
    assert(oldest <= sold && sold <= total(item));
    std::int32_t* s = slots(item);
    const int l = life(item);
    if (l == 1) {
      s[0] -= sold;
      return;
    }
    int need = oldest;
    for (int a = 0; need > 0; ++a) {
      const int t = std::min(need, static_cast<int>(s[a]));
      s[a] -= t;
      need -= t;
    }
    need = sold - oldest;
    for (int a = l - 1; need > 0; --a) {
      const int t = std::min(need, static_cast<int>(s[a]));
      s[a] -= t;
      need -= t;
    }
  }
  /// Removes and returns the units whose last sellable day is today.
  int expire(int item) {
    std::int32_t* s = slots(item);
    const int n = s[0];
    s[0] = 0;
    return n;
  }
  /// Puts back `units` of those `expire` removed today (they stay on sale until the close).
  void restore_last_day(int item, int units) { slots(item)[0] += units; }
  /// Overnight: every unit has one day less to live (call after expire).
  void age(int item) {
    std::int32_t* s = slots(item);
    const int l = life(item);
    if (l == 1) return;  // slot 0 was emptied by expire
    for (int a = 0; a + 1 < l; ++a) s[a] = s[a + 1];
    s[l - 1] = 0;
  }
  /// Heap bytes held (for memory estimates).
  std::size_t bytes() const {
    return (life_.capacity() + offset_.capacity()) * sizeof(int) +
           stock_.capacity() * sizeof(std::int32_t);
  }

 private:
  std::int32_t* slots(int item) { return stock_.data() + offset_[static_cast<size_t>(item)]; }
  const std::int32_t* slots(int item) const {
    return stock_.data() + offset_[static_cast<size_t>(item)];
  }

  std::vector<int> life_;
  std::vector<int> offset_;
  std::vector<std::int32_t> stock_;
};

}  // namespace larder
