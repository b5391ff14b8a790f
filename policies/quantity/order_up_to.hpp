#pragma once
// `order_up_to` for perishables: an order-up-to level over the protection period, corrected
// for the stock expected to outdate before it can be sold (the estimated-withdrawals-and-ageing
// idea of Broekmeulen and van Donselaar 2009; checks.md 5.3).

#include <cstdint>
#include <span>

namespace larder {

/// Estimated outdating (EWA): runs expected withdrawals through the stock by age, day by day.
///
/// Day 0 is the day after the order is placed. `stock_by_age[k]` units can be sold on days
/// 0..k; `arrivals[d]` units arrive on the morning of day d as the freshest and can be sold
/// for `life` days. On each day d, withdrawals[d] (the mean demand) take
/// sold = min(withdrawals[d], stock) units: a share `fifo_share` of them from the oldest end,
/// the rest from the freshest end (as the engine's picking does on average); then the units
/// on their last day leave and the rest age by a day. Returns the units that leave at the
/// closes of days 0..n-2 (n = withdrawals.size()): units leaving at the close of the last
/// day have served the whole period and do not count. Amounts are expectations (not
/// rounded).
double expected_outdating(std::span<const std::int32_t> stock_by_age,
                          std::span<const std::int32_t> arrivals, int life,
                          std::span<const double> withdrawals, double fifo_share);

}  // namespace larder
