#include "policies/policy.hpp"

#include <fmt/format.h>

#include <memory>

namespace larder {

namespace {

/// Creates one part: finds its factory by name, lets it read its parameters, then reports keys
/// it did not read. `name_key` is the key that holds the method name ("method" or "rule").
template <class Method>
std::unique_ptr<Method> create_part(const Catalogue<Method>& catalogue, const PartSpec& spec,
                                    const char* kind, const char* name_key,
                                    const Scenario& scenario, bool observe_intraday,
                                    Diagnostics& diag) {
  const PartFactory<Method>* factory = catalogue.find(spec.method);
  if (factory == nullptr) {
    diag.error(spec.where, fmt::format("{}: unknown {} '{}'", spec.path, kind, spec.method),
               fmt::format("known: {}", catalogue.names()));
    return nullptr;
  }
  Params params(spec.params, spec.path, scenario.file, diag);
  params.has(name_key);
  PartContext ctx{params, scenario, observe_intraday};
  auto part = factory->create(ctx);
  params.finish();
  return part;
}

}  // namespace

std::vector<Policy> build_policies(const Scenario& scenario, Diagnostics& diag) {
  const PolicyRegistry& reg = policy_registry();
  std::vector<Policy> out;
  for (const PolicySpec& spec : scenario.policies) {
    Policy p;
    p.name = spec.name;
    if (!spec.items.empty()) {
      auto own = std::make_shared<Scenario>(scenario);
      own->items = spec.items;
      p.own_scenario = std::move(own);
    }
    const Scenario& seen = p.seen(scenario);
    p.forecast = create_part(reg.forecasts, spec.forecast, "forecast method", "method", seen,
                             spec.observe_intraday, diag);
    p.censoring = create_part(reg.censorings, spec.censoring, "censoring treatment", "method", seen,
                              spec.observe_intraday, diag);
    p.quantity = create_part(reg.quantities, spec.quantity, "quantity rule", "rule", seen,
                             spec.observe_intraday, diag);
    for (const PartSpec& a : spec.adjustments) {
      p.adjustments.push_back(create_part(reg.adjustments, a, "adjustment", "method", seen,
                                          spec.observe_intraday, diag));
    }
    out.push_back(std::move(p));
  }
  return out;
}

}  // namespace larder
