#pragma once
// Warnings for ordering rules known to be poor for a scenario's items (policies.md, quantity
// rules), printed by `larder check` and `larder run`; a warning never stops a run.

#include <string>
#include <vector>

#include "sim/scenario/scenario.hpp"

namespace larder {

/// One line per problem, `file: warning: ...`:
/// - `base_stock` for an item with a next-day discount: the fixed level does not net the
///   discounted units that take full-price customers;
/// - `critical_fractile` or `pull_to_center` for an item that keeps, with a lead time above one
///   or a discounted tier whose exact chain is too large (or outside the chain's model: an
///   evening markdown, deliveries not daily; one line per item naming the policies): the
///   leftover's recovery value is then the approximation of chain_ratio.hpp, not measured.
std::vector<std::string> rule_warnings(const Scenario& scenario);

}  // namespace larder
