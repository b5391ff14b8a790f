#pragma once
// Adjustment: changes the rule's order quantities (applied in the order listed; the engine then
// rounds up to pack size).

#include <memory>
#include <span>

#include "policies/observation.hpp"
#include "policies/quantity_rule.hpp"

namespace larder {

/// Mutable adjustment state of one store, all items.
class Adjuster {
 public:
  virtual ~Adjuster() = default;
  /// Sees every day's observations after close (before any order that day).
  virtual void observe(int /*day*/, std::span<const Observation> /*observed*/) {}
  virtual void adjust(const OrderContext& ctx, std::span<const OrderInput> in,
                      std::span<const Observation> observed, std::span<int> orders) = 0;
};

/// A configured adjustment (immutable, shared by threads).
class AdjustmentMethod {
 public:
  virtual ~AdjustmentMethod() = default;
  virtual std::unique_ptr<Adjuster> make(const StoreView& store) const = 0;
};

}  // namespace larder
