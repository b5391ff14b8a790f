#include "policies/registry.hpp"

namespace larder {

namespace {
PolicyRegistry build_registry() {
  PolicyRegistry r;
  register_oracle(r);
  register_ses_weekday(r);
  register_ignore(r);
  register_fixed(r);
  register_base_stock(r);
  register_critical_fractile(r);
  register_in_stock_target(r);
  return r;
}
}  // namespace

const PolicyRegistry& policy_registry() {
  static const PolicyRegistry registry = build_registry();
  return registry;
}

}  // namespace larder
