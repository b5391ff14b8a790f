#pragma once
// The critical ratio of an item whose leftovers are not simply lost: items that keep for more
// than a day, lead times above one, and leftovers sold at a next-day discount. The newsvendor
// ratio (p - c + g) / (p - s + g) holds with s the recovery value of a leftover, and for these
// items s is not a price on a label: a carried unit saves buying one tomorrow if it sells in
// time, a discounted unit earns the discount price but takes a full-price sale from a customer
// who would have bought (model.md, step 3). The recovery value is therefore measured on the
// item's own exact chain (item_chain.hpp): the quantile rule (protection_period.hpp) is
// evaluated at a grid of ratios on the item's typical day (base demand times the mean store
// size and the mean weekday multiplier) and the ratio that earns the most is kept; s is the
// value it implies (marginal analysis on the chain, as the newsvendor is marginal analysis on
// one day). Where the chain is too large (item_chain.hpp, kMaxChainStates), or the scenario is
// outside the chain's model (deliveries not daily, an evening markdown), a documented
// approximation is used instead (approximate_recovery).

#include <optional>

#include "policies/quantity/item_chain.hpp"
#include "sim/scenario/scenario.hpp"

namespace larder {

/// Whether an item's leftovers are only recovered at their salvage value the day they are left
/// (shelf life 1, lead time 1, no discounted tier): the plain newsvendor, no chain needed.
bool plain_newsvendor(const Scenario& scenario, const Item& item);

/// The chain of one item on its typical day (see above), when the scenario fits the chain's
/// model and the state space is small enough; nullopt otherwise. `penalty` is the stockout
/// penalty g, `family` the demand family the rule assumes.
std::optional<ChainSpec> typical_chain(const Scenario& scenario, int item, double penalty,
                                       DemandFamily family);

/// The ratio the rule earns most with, measured on the chain (a grid of ratios in (0, 1)).
/// `extra` is the rule's extra unit (in_stock_target adds 1).
double best_chain_ratio(const Scenario& scenario, int item, const ChainSpec& chain,
                        DemandFamily family, int extra);

/// Without a chain: a leftover carried into a next day is sold first by the share fifo_share of
/// customers who take the oldest unit and saves buying one, so it recovers about
/// fifo_share * c * (1 - 1 / life); a discounted unit sells at the discount price to the share
/// take_rate of customers, of whom about the ratio itself would otherwise have bought at full
/// price (the fixed point of the ratio is taken); the fallback disposition's value for the
/// rest. Common practice as a rule of thumb; the chain replaces it where it fits.
double approximate_recovery(const Scenario& scenario, const Item& item, double penalty);

}  // namespace larder
