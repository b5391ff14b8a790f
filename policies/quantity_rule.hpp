#pragma once
// Quantity rule: turns the forecast of the days a delivery serves into an order quantity.

#include <memory>
#include <span>

#include "policies/forecast.hpp"

namespace larder {

/// What a rule knows about one item when it orders after close on day `order_day`.
struct OrderInput {
  DemandForecast forecast;  ///< demand of the arrival day
  int usable_stock = 0;     ///< units on hand that can still be sold on the arrival day
  int on_order = 0;         ///< units ordered earlier that arrive before the arrival day
  int sold_today = 0;       ///< today's full-price sales (0 on closed days)
};

/// The store and days a batch of decisions is for.
struct OrderContext {
  const StoreView& store;
  int order_day = 0;
  int arrival_day = 0;
};

/// Mutable rule state of one store, all items.
class OrderRule {
 public:
  virtual ~OrderRule() = default;
  /// Writes one non-negative order quantity per item (before adjustments and pack rounding).
  virtual void decide(const OrderContext& ctx, std::span<const OrderInput> in,
                      std::span<int> out) = 0;
};

/// A configured quantity rule (immutable, shared by threads).
class QuantityMethod {
 public:
  virtual ~QuantityMethod() = default;
  virtual std::unique_ptr<OrderRule> make(const StoreView& store) const = 0;
};

}  // namespace larder
