// `network_in_stock`: per-group in-stock levels chosen across the whole network to maximise
// expected profit subject to an average in-stock target (policies.md). Between re-plans it
// orders like `in_stock_target` with its group's level: the smallest Q with
// P(D <= Q - 1) >= level. The levels come from the runner every `replan_days`
// (policies/network/network_plan.hpp: the policy's own forecasts of the coming week, a
// Lagrangian relaxation of the network constraint with bisection on the multiplier,
// policies/network/allocation.hpp).

#include <fmt/format.h>
#include <yaml-cpp/yaml.h>

#include <optional>
#include <string>
#include <vector>

#include "policies/network/network_target.hpp"
#include "policies/quantity/fractile_rule.hpp"
#include "policies/registry.hpp"

namespace larder {

namespace {

/// in_stock_target with levels the runner sets.
class NetworkInStockRule : public FractileRule {
 public:
  NetworkInStockRule(std::vector<double> level, std::vector<DemandFamily> family,
                     const Scenario& scenario)
      : FractileRule(std::move(level), std::move(family), 1, scenario) {}
  void set_levels(std::span<const double> level) override { set_probability(level); }
};

class NetworkInStock : public QuantityMethod {
 public:
  explicit NetworkInStock(NetworkTarget t) : target_(std::move(t)) {}
  std::unique_ptr<OrderRule> make(const StoreView& store) const override {
    // Until the first plan, every item at the target itself.
    return std::make_unique<NetworkInStockRule>(
        std::vector<double>(static_cast<size_t>(store.item_count()), target_.target),
        target_.family, store.scenario);
  }
  const NetworkTarget* network() const override { return &target_; }

 private:
  NetworkTarget target_;
};

/// The `groups` parameter: one key as text, or a list of two or three keys; nullopt (with an
/// error) when it does not parse.
std::optional<Grouping> parse_groups_param(Params& p, std::string& text) {
  if (!p.has("groups")) {
    text = "item";
    return parse_grouping(text);
  }
  const YAML::Node node = p.raw("groups");
  if (node.IsSequence()) {
    std::vector<std::string> keys;
    for (const YAML::Node& k : node) {
      keys.push_back(k.IsScalar() ? k.Scalar() : std::string("?"));
      text += (text.empty() ? "" : " + ") + keys.back();
    }
    return parse_grouping(std::span<const std::string>(keys));
  }
  text = p.text("groups", "item");
  return parse_grouping(text);
}

/// The grouping of the policy, checked against the scenario: misspelt keys get a suggestion,
/// and every item (store) must have the attributes the grouping uses unless `missing: none`
/// puts those without in a group named (none).
std::optional<Grouping> read_grouping(Params& p, const Scenario& scenario) {
  std::string text;
  const std::optional<Grouping> grouping = parse_groups_param(p, text);
  const bool none_allowed = p.choice("missing", "error", {"error", "none"}) == "none";
  const std::string suggestion = grouping_suggestion(text, scenario);
  if (!grouping) {
    p.error("groups",
            fmt::format("{} must be store_item, item, all, abc, attribute:<key> or "
                        "store_attribute:<key>, or a list of two or three of item, abc, "
                        "attribute:<key> and store_attribute:<key> (got '{}')",
                        p.path_of("groups"), text),
            suggestion);
    return std::nullopt;
  }
  for (const Grouping& key : grouping_keys(*grouping)) {
    if (key.kind != GroupingKind::attribute && key.kind != GroupingKind::store_attribute) continue;
    const bool store = key.kind == GroupingKind::store_attribute;
    bool any = false;
    if (store) {
      for (const Store& s : scenario.stores) any = any || s.attributes.count(key.attribute) > 0;
    } else {
      for (const Item& it : scenario.items) any = any || it.attributes.count(key.attribute) > 0;
    }
    if (!any) {
      p.error("groups",
              fmt::format("{}: no {} has the attribute '{}'", p.path_of("groups"),
                          store ? "store" : "item", key.attribute),
              !suggestion.empty() ? suggestion
              : store ? "give stores attributes: { key: value } (listed stores; generated "
                        "stores have none), or choose another grouping"
                      : "give items attributes: { key: value }, or choose another grouping");
      return std::nullopt;
    }
  }
  if (none_allowed) return grouping;
  if (const auto m = first_missing_attribute(*grouping, scenario)) {
    const std::string who =
        m->store ? fmt::format("store '{}' (stores[{}])", scenario.stores[m->index].id, m->index)
                 : fmt::format("item '{}' (items[{}])", scenario.items[m->index].id, m->index);
    const Location& where =
        m->store ? scenario.stores[m->index].where : scenario.items[m->index].where;
    const std::string others = m->count > 1
                                   ? fmt::format(" (and {} more {})", m->count - 1,
                                                 m->store ? (m->count > 2 ? "stores" : "store")
                                                          : (m->count > 2 ? "items" : "item"))
                                   : std::string();
    p.diagnostics().error(
        where.file.empty() ? p.location("groups") : where,
        fmt::format("{} has no attribute '{}'{}, which {} groups by", who, m->key, others,
                    p.path_of("groups")),
        fmt::format("give it attributes: {{ {}: ... }}, or add missing: none to {} to put "
                    "{} without it in a group named (none)",
                    m->key, p.path(), m->store ? "stores" : "items"));
    return std::nullopt;
  }
  return grouping;
}

}  // namespace

void register_network_in_stock(PolicyRegistry& r) {
  r.quantities.add(
      {"network_in_stock",
       "one in-stock level per group (groups: store_item, item, all, attribute:<key>, "
       "store_attribute:<key>, abc, or a list of two or three keys such as [attribute:type, "
       "store_attribute:format]; missing: error [default] or none), chosen network-wide for "
       "the most expected profit with an average in-stock of `target`; re-planned every "
       "replan_days [28] (assume: family)",
       [](PartContext& ctx) -> std::unique_ptr<QuantityMethod> {
         NetworkTarget t;
         Params& p = ctx.params;
         const auto target = p.optional_number("target", {0.0, 1.0, true, true});
         if (!target && !p.has("target")) {
           p.error({}, fmt::format("{} needs 'target'", p.path()),
                   "the average share of store-item-days in stock at close, e.g. target: 0.7");
         }
         const std::optional<Grouping> grouping = read_grouping(p, ctx.scenario);
         t.replan_days = p.integer("replan_days", t.replan_days, Range::between(1, 3650));
         t.family = read_assume(ctx);
         if (!target || !grouping) return nullptr;
         t.target = *target;
         t.grouping = *grouping;
         return std::make_unique<NetworkInStock>(std::move(t));
       }});
}

}  // namespace larder
