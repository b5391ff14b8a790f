// The rollout table of `larder allocate` (rollout_csv.hpp).

#include "reports/rollout_csv.hpp"

#include <fmt/format.h>

#include <set>

#include "reports/csv.hpp"

namespace larder {

namespace {

template <class Things>
std::vector<std::string> keys_of(const Things& things, const std::set<std::string>& taken,
                                 std::string_view prefix) {
  std::set<std::string> keys;
  for (const auto& t : things) {
    for (const auto& kv : t.attributes) {
      if (taken.count(fmt::format("{}{}", prefix, kv.first)) == 0) keys.insert(kv.first);
    }
  }
  return {keys.begin(), keys.end()};
}

std::string value_of(const std::map<std::string, std::string>& attrs, const std::string& key) {
  const auto found = attrs.find(key);
  return found == attrs.end() ? std::string() : csv_field(found->second);
}

}  // namespace

std::string rollout_csv(const Scenario& s, const Grouping& g, const AveragedPlan& plan) {
  const std::vector<Grouping> keys = grouping_keys(g);
  std::set<std::string> taken;
  std::string csv = "store,item,group";
  for (const Grouping& k : keys) {
    taken.insert(to_string(k));
    csv += fmt::format(",{}", csv_field(to_string(k)));
  }
  const std::vector<std::string> item_keys = keys_of(s.items, taken, "attribute:");
  const std::vector<std::string> store_keys = keys_of(s.stores, taken, "store_attribute:");
  for (const std::string& k : item_keys)
    csv += fmt::format(",{}", csv_field(fmt::format("attribute:{}", k)));
  for (const std::string& k : store_keys)
    csv += fmt::format(",{}", csv_field(fmt::format("store_attribute:{}", k)));
  csv += ",level,expected_in_stock";
  for (const char* wd : kWeekdayNames) csv += fmt::format(",order_{}", wd);
  csv += "\n";
  const size_t n_items = s.items.size();
  for (size_t st = 0; st < s.stores.size(); ++st) {
    for (size_t i = 0; i < n_items; ++i) {
      const size_t k = st * n_items + i;
      const auto group = static_cast<size_t>(plan.groups.of_store_item[k]);
      csv += fmt::format("{},{},{}", csv_field(s.stores[st].id), csv_field(s.items[i].id),
                         csv_field(plan.groups.names[group]));
      for (const std::string& name : plan.groups.key_names[group])
        csv += fmt::format(",{}", csv_field(name));
      for (const std::string& key : item_keys)
        csv += fmt::format(",{}", value_of(s.items[i].attributes, key));
      for (const std::string& key : store_keys) {
        csv += fmt::format(",{}", value_of(s.stores[st].attributes, key));
      }
      csv += fmt::format(",{},{}", csv_number(plan.level[k]),
                         csv_number(plan.days[k] > 0 ? plan.in_stock[k] / plan.days[k] : 0.0));
      for (double q : plan.weekday_quantity[k]) csv += fmt::format(",{}", csv_number(q));
      csv += "\n";
    }
  }
  return csv;
}

}  // namespace larder
