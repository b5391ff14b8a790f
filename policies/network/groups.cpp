// Grouping of store-items for network service-level targets: parsing the `groups` parameter
// (one key, or two or three combined), the ABC classes (20/30/50 split by expected sales value,
// a rule of thumb of inventory practice), the map from store-item to group, and the hints for
// misspelt keys and missing attributes. See groups.hpp.

#include "policies/network/groups.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <cstddef>
#include <map>
#include <numeric>

#include "sim/scenario/params.hpp"

namespace larder {

namespace {

constexpr std::string_view kAttributePrefix = "attribute:";
constexpr std::string_view kStoreAttributePrefix = "store_attribute:";
constexpr std::string_view kJoin = " + ";
constexpr std::string_view kNameJoin = " / ";
constexpr std::array<const char*, 3> kClassNames = {"A", "B", "C"};

std::optional<Grouping> parse_key(std::string_view text) {
  Grouping g;
  if (text == "store_item") {
    g.kind = GroupingKind::store_item;
  } else if (text == "item") {
    g.kind = GroupingKind::item;
  } else if (text == "all") {
    g.kind = GroupingKind::all;
  } else if (text == "abc") {
    g.kind = GroupingKind::abc;
  } else if (text.starts_with(kAttributePrefix) && text.size() > kAttributePrefix.size()) {
    g.kind = GroupingKind::attribute;
    g.attribute = std::string(text.substr(kAttributePrefix.size()));
  } else if (text.starts_with(kStoreAttributePrefix) &&
             text.size() > kStoreAttributePrefix.size()) {
    g.kind = GroupingKind::store_attribute;
    g.attribute = std::string(text.substr(kStoreAttributePrefix.size()));
  } else {
    return std::nullopt;
  }
  return g;
}

/// The keys of a " + "-joined text, as written.
std::vector<std::string> split_keys(std::string_view text) {
  std::vector<std::string> out;
  std::size_t from = 0;
  for (std::size_t at = text.find(kJoin); at != std::string_view::npos;
       at = text.find(kJoin, from)) {
    out.emplace_back(text.substr(from, at - from));
    from = at + kJoin.size();
  }
  out.emplace_back(text.substr(from));
  return out;
}

/// Every distinct attribute key of the items (or the stores), sorted.
template <class Things>
std::vector<std::string> attribute_keys(const Things& things) {
  std::vector<std::string> keys;
  for (const auto& t : things) {
    for (const auto& kv : t.attributes) keys.push_back(kv.first);
  }
  std::sort(keys.begin(), keys.end());
  keys.erase(std::unique(keys.begin(), keys.end()), keys.end());
  return keys;
}

bool contains(const std::vector<std::string>& v, std::string_view x) {
  return std::find(v.begin(), v.end(), x) != v.end();
}

/// The hint for one key of a grouping text; empty when the key parses and is known.
std::string key_suggestion(std::string_view key, const std::vector<std::string>& item_keys,
                           const std::vector<std::string>& store_keys) {
  if (const auto g = parse_key(key)) {
    const bool item_attr = g->kind == GroupingKind::attribute;
    const bool store_attr = g->kind == GroupingKind::store_attribute;
    if (item_attr && !contains(item_keys, g->attribute) && contains(store_keys, g->attribute)) {
      return fmt::format("'{}' is a store attribute: did you mean 'store_attribute:{}'?",
                         g->attribute, g->attribute);
    }
    if (store_attr && !contains(store_keys, g->attribute) && contains(item_keys, g->attribute)) {
      return fmt::format("'{}' is an item attribute: did you mean 'attribute:{}'?", g->attribute,
                         g->attribute);
    }
    if ((!item_attr || contains(item_keys, g->attribute)) &&
        (!store_attr || contains(store_keys, g->attribute))) {
      return {};
    }
  }
  std::vector<std::string> valid = {"store_item", "item", "all", "abc"};
  for (const auto& k : item_keys) valid.push_back(std::string(kAttributePrefix) + k);
  for (const auto& k : store_keys) valid.push_back(std::string(kStoreAttributePrefix) + k);
  std::string best;
  int best_distance = 3;  // suggest within edit distance 2
  for (const auto& v : valid) {
    const int d = edit_distance(key, v);
    if (d < best_distance) {
      best_distance = d;
      best = v;
    }
  }
  return best.empty() ? std::string{} : fmt::format("did you mean '{}'?", best);
}

/// The group of each value of an attribute over `things` (items or stores): values numbered by
/// first appearance, "(none)" for those without the key.
template <class Things>
std::vector<int> attribute_groups(const Things& things, const std::string& key,
                                  std::vector<std::string>& names) {
  std::map<std::string, int, std::less<>> index;
  std::vector<int> of(things.size(), 0);
  for (std::size_t i = 0; i < things.size(); ++i) {
    const auto& attrs = things[i].attributes;
    const auto found = attrs.find(key);
    const std::string value = found == attrs.end() ? std::string(kNoAttributeGroup) : found->second;
    const auto [pos, inserted] = index.try_emplace(value, static_cast<int>(names.size()));
    if (inserted) names.push_back(value);
    of[i] = pos->second;
  }
  return of;
}

/// The groups of one key that is not combined.
GroupMap single_key_groups(const Grouping& g, const Scenario& s) {
  const std::size_t stores = s.stores.size();
  const std::size_t items = s.items.size();
  GroupMap map;
  map.of_store_item.assign(stores * items, 0);
  // The group of each item, for the kinds that do not depend on the store.
  std::vector<int> of_item(items, 0);

  switch (g.kind) {
    case GroupingKind::store_item:
      map.names.reserve(stores * items);
      for (std::size_t st = 0; st < stores; ++st) {
        for (std::size_t it = 0; it < items; ++it) {
          map.of_store_item[st * items + it] = static_cast<int>(map.names.size());
          map.names.push_back(s.stores[st].id + "/" + s.items[it].id);
        }
      }
      return map;
    case GroupingKind::store_attribute: {
      const std::vector<int> of_store = attribute_groups(s.stores, g.attribute, map.names);
      for (std::size_t st = 0; st < stores; ++st) {
        std::fill_n(map.of_store_item.begin() + static_cast<std::ptrdiff_t>(st * items), items,
                    of_store[st]);
      }
      return map;
    }
    case GroupingKind::item:
      for (std::size_t it = 0; it < items; ++it) {
        of_item[it] = static_cast<int>(it);
        map.names.push_back(s.items[it].id);
      }
      break;
    case GroupingKind::all:
    case GroupingKind::combined:  // not a single key; make_groups never asks
      map.names.emplace_back("all");
      break;
    case GroupingKind::attribute:
      of_item = attribute_groups(s.items, g.attribute, map.names);
      break;
    case GroupingKind::abc: {
      const std::vector<double> value = expected_sales_value(s);
      std::vector<std::string> ids;
      for (const Item& it : s.items) ids.push_back(it.id);
      const std::vector<int> cls = abc_classes(value, ids);
      std::array<int, 3> group_of_class = {-1, -1, -1};
      for (int c : cls) group_of_class[static_cast<std::size_t>(c)] = 0;
      for (std::size_t c = 0; c < kClassNames.size(); ++c) {
        if (group_of_class[c] < 0) continue;
        group_of_class[c] = static_cast<int>(map.names.size());
        map.names.emplace_back(kClassNames[c]);
      }
      for (std::size_t it = 0; it < items; ++it) {
        of_item[it] = group_of_class[static_cast<std::size_t>(cls[it])];
      }
      break;
    }
  }
  for (std::size_t st = 0; st < stores; ++st) {
    std::copy(of_item.begin(), of_item.end(),
              map.of_store_item.begin() + static_cast<std::ptrdiff_t>(st * items));
  }
  return map;
}

}  // namespace

std::optional<Grouping> parse_grouping(std::string_view text) {
  if (text.find(kJoin) == std::string_view::npos) return parse_key(text);
  const std::vector<std::string> keys = split_keys(text);
  return parse_grouping(std::span<const std::string>(keys));
}

std::optional<Grouping> parse_grouping(std::span<const std::string> keys) {
  if (keys.empty() || keys.size() > kMaxGroupKeys) return std::nullopt;
  if (keys.size() == 1) return parse_key(keys[0]);
  Grouping g;
  g.kind = GroupingKind::combined;
  for (std::size_t k = 0; k < keys.size(); ++k) {
    auto part = parse_key(keys[k]);
    if (!part || part->kind == GroupingKind::store_item || part->kind == GroupingKind::all) {
      return std::nullopt;
    }
    const auto before = keys.first(k);
    if (std::find(before.begin(), before.end(), keys[k]) != before.end()) return std::nullopt;
    g.parts.push_back(std::move(*part));
  }
  return g;
}

std::string to_string(const Grouping& g) {
  switch (g.kind) {
    case GroupingKind::store_item:
      return "store_item";
    case GroupingKind::item:
      return "item";
    case GroupingKind::all:
      return "all";
    case GroupingKind::attribute:
      return std::string(kAttributePrefix) + g.attribute;
    case GroupingKind::store_attribute:
      return std::string(kStoreAttributePrefix) + g.attribute;
    case GroupingKind::abc:
      return "abc";
    case GroupingKind::combined: {
      std::string out;
      for (const Grouping& p : g.parts) {
        out += (out.empty() ? std::string() : std::string(kJoin)) + to_string(p);
      }
      return out;
    }
  }
  return "item";
}

std::vector<Grouping> grouping_keys(const Grouping& g) {
  return g.kind == GroupingKind::combined ? g.parts : std::vector<Grouping>{g};
}

std::string grouping_suggestion(std::string_view text, const Scenario& s) {
  const std::vector<std::string> item_keys = attribute_keys(s.items);
  const std::vector<std::string> store_keys = attribute_keys(s.stores);
  for (const std::string& key : split_keys(text)) {
    std::string hint = key_suggestion(key, item_keys, store_keys);
    if (!hint.empty()) return hint;
  }
  return {};
}

std::optional<MissingAttribute> first_missing_attribute(const Grouping& g, const Scenario& s) {
  for (const Grouping& key : grouping_keys(g)) {
    const bool store = key.kind == GroupingKind::store_attribute;
    if (key.kind != GroupingKind::attribute && !store) continue;
    std::optional<MissingAttribute> found;
    const auto visit = [&](const auto& things) {
      for (std::size_t i = 0; i < things.size(); ++i) {
        if (things[i].attributes.count(key.attribute) > 0) continue;
        if (!found) found = MissingAttribute{store, i, key.attribute, 0};
        ++found->count;
      }
    };
    if (store) {
      visit(s.stores);
    } else {
      visit(s.items);
    }
    if (found) return found;
  }
  return std::nullopt;
}

std::vector<int> abc_classes(std::span<const double> sales_value,
                             std::span<const std::string> ids) {
  const std::size_t n = sales_value.size();
  std::vector<std::size_t> order(n);
  std::iota(order.begin(), order.end(), std::size_t{0});
  std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) {
    if (sales_value[a] != sales_value[b]) return sales_value[a] > sales_value[b];
    if (!ids.empty() && ids[a] != ids[b]) return ids[a] < ids[b];
    return a < b;
  });
  // round(0.2 n) and round(0.5 n) with halves up, in integers so no product lands a hair below
  // a half: floor((2 n + 5) / 10) and floor((n + 1) / 2).
  std::size_t a_count = (2 * n + 5) / 10;
  if (n >= 1) a_count = std::max<std::size_t>(a_count, 1);
  const std::size_t b_end = std::max(a_count, (n + 1) / 2);
  std::vector<int> cls(n, 2);
  for (std::size_t r = 0; r < n; ++r) {
    cls[order[r]] = r < a_count ? 0 : (r < b_end ? 1 : 2);
  }
  return cls;
}

std::vector<double> expected_sales_value(const Scenario& s) {
  double total_size = 0.0;
  for (const Store& store : s.stores) total_size += store.size;
  std::vector<double> value;
  value.reserve(s.items.size());
  for (const Item& item : s.items) {
    double weekday_sum = 0.0;
    for (double m : item.demand.weekday) weekday_sum += m;
    value.push_back(item.price * item.demand.base * total_size * (weekday_sum / kDaysPerWeek));
  }
  return value;
}

GroupMap make_groups(const Grouping& g, const Scenario& s) {
  if (g.kind != GroupingKind::combined) {
    GroupMap map = single_key_groups(g, s);
    map.key_names.reserve(map.names.size());
    for (const std::string& n : map.names) map.key_names.push_back({n});
    return map;
  }
  std::vector<GroupMap> parts;
  for (const Grouping& p : g.parts) parts.push_back(single_key_groups(p, s));
  GroupMap map;
  const std::size_t n = s.stores.size() * s.items.size();
  map.of_store_item.assign(n, 0);
  std::map<std::vector<int>, int> index;
  std::vector<int> combination(parts.size());
  for (std::size_t k = 0; k < n; ++k) {
    for (std::size_t p = 0; p < parts.size(); ++p) combination[p] = parts[p].of_store_item[k];
    const auto [pos, inserted] = index.try_emplace(combination, static_cast<int>(map.names.size()));
    if (inserted) {
      std::vector<std::string> names;
      std::string joined;
      for (std::size_t p = 0; p < parts.size(); ++p) {
        names.push_back(parts[p].names[static_cast<std::size_t>(combination[p])]);
        joined += (p == 0 ? std::string() : std::string(kNameJoin)) + names.back();
      }
      map.names.push_back(std::move(joined));
      map.key_names.push_back(std::move(names));
    }
    map.of_store_item[k] = pos->second;
  }
  return map;
}

}  // namespace larder
