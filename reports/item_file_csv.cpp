#include "reports/item_file_csv.hpp"

#include <set>

#include "reports/csv.hpp"

namespace larder {

std::string item_file_csv(const Scenario& scenario) {
  std::set<std::string> keys;
  for (const Item& it : scenario.items) {
    for (const auto& [k, v] : it.attributes) keys.insert(k);
  }
  std::string out = "item,price,unit_cost,shelf_life_days";
  for (const std::string& k : keys) {
    out += ',';
    out += csv_field(k);
  }
  out += '\n';
  for (const Item& it : scenario.items) {
    out += csv_field(it.id);
    out += ',';
    out += csv_number(it.price);
    out += ',';
    out += csv_number(it.unit_cost);
    out += ',';
    out += std::to_string(it.shelf_life_days);
    for (const std::string& k : keys) {
      out += ',';
      if (const auto a = it.attributes.find(k); a != it.attributes.end())
        out += csv_field(a->second);
    }
    out += '\n';
  }
  return out;
}

}  // namespace larder
