#pragma once
// Grouping of store-items for network service-level targets (policies.md, "Network
// service-level targets and grouping"): `network_in_stock` chooses one service level per group,
// and `larder allocate` reports the levels per group. This file only says which group every
// store-item belongs to; it knows nothing of levels or forecasts.

#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

#include "sim/scenario/scenario.hpp"

namespace larder {

/// How store-items share a service level: each its own, per item, one for all, per value of an
/// item attribute, or per ABC class.
enum class GroupingKind : unsigned char { store_item, item, all, attribute, abc };

/// A grouping as written in a policy's `groups` parameter.
struct Grouping {
  GroupingKind kind = GroupingKind::item;
  std::string attribute;  ///< the key, for GroupingKind::attribute
};

/// Parses `store_item`, `item`, `all`, `attribute:<key>` (key non-empty) or `abc`.
std::optional<Grouping> parse_grouping(std::string_view text);

/// The text form (inverse of parse_grouping).
std::string to_string(const Grouping& g);

/// ABC class of each item (0 = A, 1 = B, 2 = C) from its expected sales value: items ranked by
/// value, highest first (ties by item id when `ids` is given, checks.md 9, else by index); rank r
/// is A when r < round(0.2 n), B when r < round(0.5 n), else C, rounding halves up, and at least
/// one A when n >= 1.
///
/// This is the 20/30/50 split of the items by count (the top 20% of items by expected sales
/// value are A, the next 30% B, the remaining 50% C), a rule of thumb of inventory practice
/// (common practice; ABC analysis goes back to H. F. Dickie, 1951). The cut is by share of
/// items, not by cumulative share of value, so the classes do not move when one item's value
/// changes without changing the ranking. Values are expected to be finite.
std::vector<int> abc_classes(std::span<const double> sales_value,
                             std::span<const std::string> ids = {});

/// Every item's expected sales value over the network per open day: price x base demand x
/// (sum of store sizes) x (mean of the weekday multipliers). Calendar events and closed
/// weekdays are ignored: the value only ranks items for ABC.
std::vector<double> expected_sales_value(const Scenario& s);

/// The group of every store-item, index [store * items + item], and each group's name.
struct GroupMap {
  std::vector<int> of_store_item;
  std::vector<std::string> names;  ///< "all"; an item id; "store/item"; an attribute value
                                   ///< ("(none)" for items without the attribute); "A"/"B"/"C"
  int count() const { return static_cast<int>(names.size()); }
};

/// The groups of grouping `g` on scenario `s`. Numbering: store_item in store-major order; item
/// in item order; attribute values in order of first appearance over items, with "(none)" where
/// the first item without the key appears (an item whose value is literally "(none)" shares
/// that group); abc: only the classes that occur, in order A, B, C.
GroupMap make_groups(const Grouping& g, const Scenario& s);

}  // namespace larder
