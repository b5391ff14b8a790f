#include "policies/registry.hpp"

namespace larder {

namespace {
PolicyRegistry build_registry() {
  PolicyRegistry r;
  register_oracle(r);
  register_ses_weekday(r);
  register_moving_average(r);
  register_same_day_last_week(r);
  register_holt_winters(r);
  register_demand_chasing(r);
  register_ignore(r);
  register_drop(r);
  register_normal_tail(r);
  register_intraday(r);
  register_product_limit(r);
  register_fixed(r);
  register_base_stock(r);
  register_critical_fractile(r);
  register_in_stock_target(r);
  register_network_in_stock(r);
  register_fill_rate_target(r);
  register_order_up_to(r);
  register_replay(r);
  register_pull_to_center(r);
  register_leftover_aversion(r);
  register_pack_round(r);
  register_shelf_cap(r);
  register_min_display(r);
  register_waste_feedback(r);
  register_cap_growth(r);
  return r;
}
}  // namespace

const PolicyRegistry& policy_registry() {
  static const PolicyRegistry registry = build_registry();
  return registry;
}

}  // namespace larder
