#pragma once
// Stock of one store under one policy, by item and remaining shelf life (model.md, steps 1-5).
// Slot a of an item holds units that can be sold today and on the a following days; slot 0 is
// the oldest (last sellable day), slot life-1 the freshest.

#include <cstdint>
#include <span>
#include <vector>

namespace larder {

class Shelf {
 public:
  /// One entry per item: its shelf life in days (>= 1).
  explicit Shelf(std::span<const int> shelf_life_days);

  int life(int item) const { return life_[static_cast<size_t>(item)]; }
  /// Units of an item on the shelf.
  int total(int item) const;
  /// Units with `a` or more further days to live (slots a..life-1).
  int at_least(int item, int a) const;
  /// Morning delivery: units arrive as the freshest.
  void receive(int item, int units) { slot(item, life(item) - 1) += units; }
  /// Sells `sold` units (<= total): `oldest` of them from the oldest end, the rest from the
  /// freshest end (exact: the two ends only meet when the shelf runs out).
  void take(int item, int sold, int oldest);
  /// Removes and returns the units whose last sellable day is today.
  int expire(int item);
  /// Overnight: every unit has one day less to live (call after expire).
  void age(int item);

 private:
  std::int32_t& slot(int item, int a) {
    return stock_[static_cast<size_t>(offset_[static_cast<size_t>(item)] + a)];
  }
  std::int32_t slot(int item, int a) const {
    return stock_[static_cast<size_t>(offset_[static_cast<size_t>(item)] + a)];
  }

  std::vector<int> life_;
  std::vector<int> offset_;
  std::vector<std::int32_t> stock_;
};

}  // namespace larder
