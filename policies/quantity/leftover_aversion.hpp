#pragma once
// `leftover_aversion`: the critical ratio with psychological costs of leftovers and stockouts
// (Ho, Lim and Cui 2010).

#include "sim/scenario/scenario.hpp"

namespace larder {

/// (cu + stockout_cost) / (cu + co + stockout_cost + leftover_cost), with cu = p - c + g and
/// co = c - s (s = leftover_recovery, critical_fractile.hpp; g = penalty): the
/// newsvendor ratio when each leftover unit costs leftover_cost more and each unit short
/// stockout_cost more. 0 when there is nothing to gain, at most 1.
double leftover_aversion_ratio(const Scenario& scenario, const Item& item, double penalty,
                               double leftover_cost, double stockout_cost);

}  // namespace larder
