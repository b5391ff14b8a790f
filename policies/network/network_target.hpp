#pragma once
// What a network-planned quantity rule (`network_in_stock`, policies.md) asks of the runner:
// every `replan_days` days, one in-stock level per group of store-items, chosen across the
// whole network to maximise expected profit subject to an average in-stock target, from the
// policy's own forecasts. The runner gathers the forecasts (network_plan.hpp) and hands each
// store's rule its levels (OrderRule::set_levels).

#include <vector>

#include "policies/network/groups.hpp"
#include "sim/scenario/scenario.hpp"

namespace larder {

struct NetworkTarget {
  double target = 0.7;               ///< required share of store-item-days in stock at close
  Grouping grouping;                 ///< one level per group
  int replan_days = 28;              ///< days between plans
  std::vector<DemandFamily> family;  ///< per item: the law the plan assumes for forecasts
};

/// Days of forecasts a plan looks ahead (one week: every weekday once).
inline constexpr int kPlanDays = 7;

}  // namespace larder
