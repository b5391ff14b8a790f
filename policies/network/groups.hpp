#pragma once
// Grouping of store-items for network service-level targets (policies.md, "Network
// service-level targets and grouping"): `network_in_stock` chooses one service level per group,
// and `larder allocate` reports the levels per group. This file only says which group every
// store-item belongs to; it knows nothing of levels or forecasts.

#include <cstddef>
#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

#include "sim/scenario/scenario.hpp"

namespace larder {

/// How store-items share a service level: each its own, per item, one for all, per value of an
/// item attribute, per ABC class, per value of a store attribute, or per combination of two or
/// three of the keys before (one group per combination that occurs).
enum class GroupingKind : unsigned char {
  store_item,
  item,
  all,
  attribute,
  abc,
  store_attribute,
  combined
};

/// A grouping as written in a policy's `groups` parameter.
struct Grouping {
  GroupingKind kind = GroupingKind::item;
  std::string attribute;             ///< the key, for attribute and store_attribute
  std::vector<Grouping> parts = {};  ///< for combined: 2 or 3 single keys, as written
};

/// Most keys one combined grouping may join.
inline constexpr std::size_t kMaxGroupKeys = 3;

/// Parses one key: `store_item`, `item`, `all`, `attribute:<key>`, `store_attribute:<key>`
/// (key non-empty) or `abc`; or two or three of `item`, `attribute:<key>`,
/// `store_attribute:<key>` and `abc` joined by " + " (the text form of a combined grouping).
std::optional<Grouping> parse_grouping(std::string_view text);

/// A combined grouping from a YAML list of keys (`groups: [attribute:type,
/// store_attribute:format]`); a list of one key is that key. Nullopt when a key is malformed,
/// when there are more than three, when one repeats, or when `store_item` or `all` is combined
/// with another (store_item is already the finest grouping, all the coarsest).
std::optional<Grouping> parse_grouping(std::span<const std::string> keys);

/// The text form (inverse of parse_grouping): combined keys are joined by " + ".
std::string to_string(const Grouping& g);

/// The single keys of `g`: its parts when combined, else `g` itself.
std::vector<Grouping> grouping_keys(const Grouping& g);

/// "did you mean '...'?" for a grouping text that does not parse, naming the closest of the
/// valid keys of scenario `s` (store_item, item, all, abc, attribute:<k> for every item key,
/// store_attribute:<k> for every store key) within edit distance 2, per " + "-separated key;
/// a hint to write store_attribute: when the key is a store's and not an item's (and the other
/// way round); empty when nothing is close.
std::string grouping_suggestion(std::string_view text, const Scenario& s);

/// The first item (or store) that lacks an attribute the grouping uses, and how many do.
struct MissingAttribute {
  bool store = false;  ///< a store attribute: `index` is a store index, else an item index
  std::size_t index = 0;
  std::string key;
  std::size_t count = 0;  ///< items (or stores) lacking it
};

/// The first missing attribute of `g` on `s`, keys in the order written; nullopt when every
/// item has every item attribute used and every store every store attribute used.
std::optional<MissingAttribute> first_missing_attribute(const Grouping& g, const Scenario& s);

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
                                   ///< ("(none)" for items without the attribute); "A"/"B"/"C";
                                   ///< combined: the parts' names joined by " / "
  /// per group, per key of the grouping (grouping_keys): the name of that key's group
  std::vector<std::vector<std::string>> key_names;
  int count() const { return static_cast<int>(names.size()); }
};

/// The groups of grouping `g` on scenario `s`. Numbering: store_item in store-major order; item
/// in item order; attribute values in order of first appearance over items, with "(none)" where
/// the first item without the key appears (an item whose value is literally "(none)" shares
/// that group); abc: only the classes that occur, in order A, B, C; store_attribute: values in
/// order of first appearance over stores, "(none)" as for items; combined: the combinations
/// that occur, in order of first appearance over store-items in store-major order.
GroupMap make_groups(const Grouping& g, const Scenario& s);

/// The name of the group store-items lacking a grouping's attribute fall in (when the policy
/// allows it with `missing: none`).
inline constexpr std::string_view kNoAttributeGroup = "(none)";

}  // namespace larder
