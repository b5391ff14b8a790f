// Grouping of store-items for network service-level targets: parsing the `groups` parameter,
// the ABC classes (20/30/50 split by expected sales value, a rule of thumb of inventory
// practice) and the map from store-item to group. See groups.hpp.

#include "policies/network/groups.hpp"

#include <algorithm>
#include <array>
#include <cstddef>
#include <map>
#include <numeric>

namespace larder {

namespace {

constexpr std::string_view kAttributePrefix = "attribute:";
constexpr std::string_view kNoValue = "(none)";
constexpr std::array<const char*, 3> kClassNames = {"A", "B", "C"};

}  // namespace

std::optional<Grouping> parse_grouping(std::string_view text) {
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
  } else {
    return std::nullopt;
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
    case GroupingKind::abc:
      return "abc";
  }
  return "item";
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
    case GroupingKind::item:
      for (std::size_t it = 0; it < items; ++it) {
        of_item[it] = static_cast<int>(it);
        map.names.push_back(s.items[it].id);
      }
      break;
    case GroupingKind::all:
      map.names.emplace_back("all");
      break;
    case GroupingKind::attribute: {
      std::map<std::string, int, std::less<>> index;
      for (std::size_t it = 0; it < items; ++it) {
        const auto& attrs = s.items[it].attributes;
        const auto found = attrs.find(g.attribute);
        const std::string value = found == attrs.end() ? std::string(kNoValue) : found->second;
        const auto [pos, inserted] = index.try_emplace(value, static_cast<int>(map.names.size()));
        if (inserted) map.names.push_back(value);
        of_item[it] = pos->second;
      }
      break;
    }
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

}  // namespace larder
