#include "sim/runner/breakdown.hpp"

#include <algorithm>
#include <set>

namespace larder {

BreakdownDimensions breakdown_dimensions(const Scenario& scenario, const Grouping* plan) {
  BreakdownDimensions d;
  const size_t n_items = scenario.items.size();
  GroupMap stores;
  for (size_t s = 0; s < scenario.stores.size(); ++s) {
    stores.names.push_back(scenario.stores[s].id);
    for (size_t i = 0; i < n_items; ++i) stores.of_store_item.push_back(static_cast<int>(s));
  }
  d.names.push_back("store");
  d.maps.push_back(std::move(stores));
  d.names.push_back("item");
  d.maps.push_back(make_groups({GroupingKind::item, {}}, scenario));
  std::set<std::string> keys;
  for (const Item& it : scenario.items) {
    for (const auto& [k, v] : it.attributes) keys.insert(k);
  }
  for (const std::string& k : keys) {
    d.names.push_back(k);
    d.maps.push_back(make_groups({GroupingKind::attribute, k}, scenario));
  }
  // Store attributes, as `store:<key>`: values in order of first appearance over the stores,
  // "(none)" for stores without the key (as make_groups does for item attributes).
  std::set<std::string> store_keys;
  for (const Store& st : scenario.stores) {
    for (const auto& [k, v] : st.attributes) store_keys.insert(k);
  }
  for (const std::string& k : store_keys) {
    GroupMap m;
    for (const Store& st : scenario.stores) {
      const auto found = st.attributes.find(k);
      const std::string value = found == st.attributes.end() ? "(none)" : found->second;
      auto at = std::find(m.names.begin(), m.names.end(), value);
      if (at == m.names.end()) at = m.names.insert(m.names.end(), value);
      const int g = static_cast<int>(at - m.names.begin());
      for (size_t i = 0; i < n_items; ++i) m.of_store_item.push_back(g);
    }
    d.names.push_back("store:" + k);
    d.maps.push_back(std::move(m));
  }
  if (plan != nullptr) {
    d.names.push_back("plan_group");
    d.maps.push_back(make_groups(*plan, scenario));
  }
  return d;
}

std::vector<BreakdownKey> breakdown_keys(const BreakdownDimensions& d) {
  std::vector<BreakdownKey> out;
  for (size_t k = 0; k < d.names.size(); ++k) {
    for (const std::string& name : d.maps[k].names) out.push_back({d.names[k], name});
  }
  return out;
}

std::vector<MetricVector> breakdown_values(const Scenario& scenario, std::span<const Item> items,
                                           const BreakdownDimensions& d,
                                           std::span<const StoreTallies> stores, size_t policy) {
  const size_t n_items = scenario.items.size();
  std::vector<MetricVector> out;
  for (const GroupMap& map : d.maps) {
    // Per group, per item: the tallies of the group's store-items, summed in store order.
    std::vector<Tally> sums(static_cast<size_t>(map.count()) * n_items);
    for (size_t s = 0; s < stores.size(); ++s) {
      const std::vector<Tally>& t = stores[s].items[policy];
      for (size_t i = 0; i < n_items; ++i) {
        const auto g = static_cast<size_t>(map.of_store_item[s * n_items + i]);
        sums[g * n_items + i].add(t[i]);
      }
    }
    for (size_t g = 0; g < static_cast<size_t>(map.count()); ++g) {
      out.push_back(
          compute_metrics(std::span<const Tally>(sums).subspan(g * n_items, n_items), items));
    }
  }
  return out;
}

}  // namespace larder
