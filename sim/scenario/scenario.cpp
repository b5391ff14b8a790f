#include "sim/scenario/scenario.hpp"

#include <algorithm>

namespace larder {

const char* to_string(DemandFamily f) {
  switch (f) {
    case DemandFamily::poisson:
      return "poisson";
    case DemandFamily::negative_binomial:
      return "negative_binomial";
    case DemandFamily::normal:
      return "normal";
  }
  return "?";
}

const char* to_string(Leftovers l) {
  switch (l) {
    case Leftovers::discard:
      return "discard";
    case Leftovers::salvage:
      return "salvage";
    case Leftovers::donate:
      return "donate";
    case Leftovers::discount_next_day:
      return "discount_next_day";
  }
  return "?";
}

namespace {
bool applies(const CalendarEvent& e, const std::string& store_id) {
  return e.stores.empty() ||
         std::find(e.stores.begin(), e.stores.end(), store_id) != e.stores.end();
}
}  // namespace

const std::vector<Item>& Scenario::items_of(int policy) const {
  if (policy < 0 || static_cast<size_t>(policy) >= policies.size()) return items;
  const std::vector<Item>& own = policies[static_cast<size_t>(policy)].items;
  return own.empty() ? items : own;
}

bool Scenario::is_open(int store, int day) const {
  const Store& s = stores[static_cast<size_t>(store)];
  if (!s.open_weekdays[static_cast<size_t>(weekday_of(day))]) return false;
  for (const auto& e : calendar.events) {
    if (e.day == day && e.closed && applies(e, s.id)) return false;
  }
  return true;
}

double Scenario::event_multiplier(int store, int day) const {
  double m = 1.0;
  const Store& s = stores[static_cast<size_t>(store)];
  for (const auto& e : calendar.events) {
    if (e.day == day && applies(e, s.id)) m *= e.demand;
  }
  return m;
}

}  // namespace larder
