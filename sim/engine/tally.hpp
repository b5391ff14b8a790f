#pragma once
// Integer counts of one store-item (or any sum of them) over the scored days. Money is derived
// from counts and item prices only when metrics are computed, so the hot loop adds integers
// and sums are exact whatever the order of merging.

#include <cstdint>
#include <span>

#include "sim/engine/metric.hpp"
#include "sim/scenario/scenario.hpp"

namespace larder {

struct Tally {
  std::int64_t demand = 0;            ///< primary customers
  std::int64_t served_by_item = 0;    ///< primary customers served by the item itself
  std::int64_t substitute = 0;        ///< units sold to customers whose first choice was out
  std::int64_t bargain = 0;           ///< units sold to bargain-only customers
  std::int64_t sold_next_day = 0;     ///< units sold at the next-day price (any customer)
  std::int64_t sold_markdown = 0;     ///< units sold at the markdown price (any customer)
  std::int64_t lost = 0;              ///< customers who left without buying
  std::int64_t wasted = 0;            ///< units discarded
  std::int64_t salvaged = 0;          ///< units salvaged
  std::int64_t donated = 0;           ///< units donated
  std::int64_t delivered = 0;         ///< units delivered
  std::int64_t open_days = 0;         ///< open store-item-days
  std::int64_t in_stock_days = 0;     ///< open days with a unit left at close
  std::int64_t no_stockout_days = 0;  ///< open days with every primary customer served by the item

  void add(const Tally& o);
  /// Units sold to anyone at any price.
  std::int64_t sold() const { return served_by_item + substitute + bargain; }
};

/// The metrics of model.md from per-item totals (index = item index in `items`).
MetricVector compute_metrics(std::span<const Tally> per_item, std::span<const Item> items);

}  // namespace larder
