#pragma once
// `fill_rate_target`: the smallest stock with an expected fill rate (type 2 service)
// E[min(D, Q)] / E[D] of at least `level` (Silver, Pyke and Thomas 2017, P2 service; checks.md 2).

#include "policies/forecast.hpp"
#include "sim/stats/count_law.hpp"

namespace larder {

/// Expected fill rate E[min(D, q)] / E[D] of the count `law` stocked with q units (1 when the
/// mean is 0: there is no demand to miss).
double expected_fill_rate(const CountLaw& law, int q);

/// Smallest q >= 0 with expected_fill_rate(law, q) >= level, for level in (0, 1).
int fill_rate_quantity(const CountLaw& law, double level);

}  // namespace larder
