#include "sim/drill/drill_spec.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <optional>

#include "sim/scenario/params.hpp"
#include "sim/scenario/scenario.hpp"

namespace larder {

namespace {

/// "did you mean 'x'?" for the closest of `known` (edit distance below 3), else "".
std::string hint_for(const std::string& name, const std::vector<std::string>& known) {
  std::string best;
  int best_d = 3;
  for (const auto& k : known) {
    const int d = edit_distance(name, k);
    if (d < best_d) best_d = d, best = k;
  }
  return best.empty() ? std::string{} : fmt::format("did you mean '{}'?", best);
}

std::string joined(const std::vector<std::string>& names) {
  std::string out;
  for (const auto& n : names) {
    if (!out.empty()) out += ", ";
    out += n;
  }
  return out;
}

/// Reads a list of names from `key` into indices of `known` (each at most once).
std::vector<int> read_names(Params& p, std::string_view key, const std::vector<std::string>& known,
                            std::string_view what, const std::string& example) {
  std::vector<int> out;
  const YAML::Node list = p.raw(key);
  Diagnostics& diag = p.diagnostics();
  if (!list.IsSequence() || list.size() == 0) {
    p.error(key,
            fmt::format("{} must be a list of {} ids (got {})", p.path_of(key), what,
                        describe_value(list)),
            example);
    return out;
  }
  for (size_t k = 0; k < list.size(); ++k) {
    const YAML::Node n = list[k];
    const Location at = location_of(n, p.file());
    if (!n.IsScalar()) {
      diag.error(at, fmt::format("{}[{}] must be a {} id (got {})", p.path_of(key), k, what,
                                 describe_value(n)));
      continue;
    }
    const std::string name = n.Scalar();
    const auto it = std::find(known.begin(), known.end(), name);
    if (it == known.end()) {
      std::string hint = hint_for(name, known);
      if (hint.empty()) hint = fmt::format("{}s: {}", what, joined(known));
      diag.error(at, fmt::format("{}[{}]: unknown {} '{}'", p.path_of(key), k, what, name),
                 std::move(hint));
      continue;
    }
    const int index = static_cast<int>(it - known.begin());
    if (std::find(out.begin(), out.end(), index) != out.end()) {
      diag.error(at, fmt::format("{}[{}]: {} '{}' is listed twice", p.path_of(key), k, what, name));
      continue;
    }
    out.push_back(index);
  }
  return out;
}

std::vector<DrillEvent> read_events(Params& p, int days) {
  std::vector<DrillEvent> out;
  if (!p.has("events")) return out;
  const YAML::Node list = p.raw("events");
  if (!list.IsSequence()) {
    p.error("events",
            fmt::format("{} must be a list (got {})", p.path_of("events"), describe_value(list)),
            "e.g. events: [{ day: 12, demand: 1.6, announced: false }]");
    return out;
  }
  for (size_t k = 0; k < list.size(); ++k) {
    const std::string path = fmt::format("{}[{}]", p.path_of("events"), k);
    if (!list[k].IsMap()) {
      p.diagnostics().error(location_of(list[k], p.file()),
                            fmt::format("{} must be a mapping such as {{ day: 12, demand: 1.6 }} "
                                        "(got {})",
                                        path, describe_value(list[k])));
      continue;
    }
    Params ep(list[k], path, p.file(), p.diagnostics());
    DrillEvent e;
    if (!ep.has("day")) {
      ep.error("day", fmt::format("{} needs 'day' (the drill day, 1 to {})", path, days));
    }
    e.day = ep.integer("day", 1, Range::between(1, std::max(days, 1)));
    if (!ep.has("demand")) {
      ep.error("demand", fmt::format("{} needs 'demand' (a multiplier of the day's mean, e.g. "
                                     "1.6)",
                                     path));
    }
    e.demand = ep.number("demand", 1.0, Range::between(0.0, 20.0));
    e.announced = ep.boolean("announced", false);
    ep.finish();
    out.push_back(e);
  }
  return out;
}

}  // namespace

DrillSpec read_drill(Params& p, const Scenario& scenario) {
  DrillSpec d;
  d.where = p.location();
  std::vector<std::string> stores;
  std::vector<std::string> items;
  std::vector<std::string> policies;
  for (const auto& s : scenario.stores) stores.push_back(s.id);
  for (const auto& i : scenario.items) items.push_back(i.id);
  for (const auto& q : scenario.policies) policies.push_back(q.name);

  if (const auto store = p.optional_text("store")) {
    const auto it = std::find(stores.begin(), stores.end(), *store);
    if (it == stores.end()) {
      std::string hint = hint_for(*store, stores);
      if (hint.empty() && stores.size() <= 12) hint = fmt::format("stores: {}", joined(stores));
      p.error("store", fmt::format("{}: unknown store '{}'", p.path_of("store"), *store),
              std::move(hint));
    } else {
      d.store = static_cast<int>(it - stores.begin());
    }
  } else if (!p.has("store")) {
    p.error("store", fmt::format("{} needs 'store': the store the trainee orders for", p.path()));
  }

  if (p.has("items")) {
    d.items = read_names(p, "items", items, "item", "e.g. items: [rye, croissant]");
    if (static_cast<int>(d.items.size()) > kMaxDrillItems) {
      p.error("items",
              fmt::format("{} lists {} items; a drill shows at most {}", p.path_of("items"),
                          d.items.size(), kMaxDrillItems),
              "a few items teach more than many: make several exercises");
    }
  } else {
    p.error("items", fmt::format("{} needs 'items': the few items the trainee orders", p.path()),
            "e.g. items: [rye, croissant]");
  }
  d.days = p.integer("days", d.days, Range::between(1, kMaxDrillDays));
  if (p.has("compare")) {
    d.compare = read_names(p, "compare", policies, "policy", "e.g. compare: [newsvendor, habit]");
  } else {
    for (size_t k = 0; k < policies.size(); ++k) d.compare.push_back(static_cast<int>(k));
  }
  d.events = read_events(p, d.days);
  p.finish();
  return d;
}

}  // namespace larder
