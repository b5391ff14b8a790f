#pragma once
// What a policy part may see when it is created (its own parameters and the scenario) and when
// it runs for one store (the store index and the demand model, which only `oracle` may read).

#include "sim/scenario/params.hpp"
#include "sim/scenario/scenario.hpp"

namespace larder {

class DemandModel;

/// Creation context: the part reads and validates its own keys from `params`.
struct PartContext {
  Params& params;
  const Scenario& scenario;
  /// The policy has `observe: intraday` (sales by hour and sell-out times in its observations),
  /// so parts that need intraday detail can refuse to be created without it.
  bool observe_intraday = false;
};

/// Run context of one store: parts build their per-store state from it.
struct StoreView {
  const Scenario& scenario;
  const DemandModel& truth;  ///< the true demand distributions; only the oracle may use it
  int store = 0;

  int item_count() const { return static_cast<int>(scenario.items.size()); }
};

}  // namespace larder
