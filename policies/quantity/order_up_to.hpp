#pragma once
// `order_up_to` for perishables: an order-up-to level over the protection period, corrected
// for the stock expected to outdate before it can be sold (the estimated-withdrawals-and-ageing
// idea of Broekmeulen and van Donselaar 2009; checks.md 5.3). The machinery is shared with the
// quantile rules: protection_period.hpp.

#include "policies/quantity/protection_period.hpp"
