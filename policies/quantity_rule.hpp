#pragma once
// Quantity rule: turns the forecast of the days a delivery serves into an order quantity.

#include <cstdint>
#include <memory>
#include <span>

#include "policies/forecast.hpp"
#include "policies/observation.hpp"

namespace larder {

struct NetworkTarget;

/// What a rule knows about one item when it orders after close on day `order_day`.
struct OrderInput {
  /// Demand over the days this delivery serves: from the arrival day until the next delivery
  /// arrives or the units expire (open days only; one day with daily deliveries).
  DemandForecast forecast;
  int cover_days = 1;    ///< calendar days that window spans
  int usable_stock = 0;  ///< units on hand that can still be sold on the arrival day
  int on_order =
      0;  ///< units ordered earlier, arriving before the arrival day and still sellable on it
  int sold_today = 0;  ///< today's full-price sales (0 on closed days)
  /// Units on their discounted extra day tomorrow (next-day discount): shown beside tomorrow's
  /// full-price stock, they take some of its customers.
  int discounted = 0;
  /// Units on hand after tonight's ageing by remaining life: stock_by_age[a] can be sold from
  /// tomorrow on for a + 1 more days (size = the item's shelf life; the last slot is empty).
  std::span<const std::int32_t> stock_by_age;
  /// Units already ordered by arrival day: pipeline[d] arrives on order_day + 1 + d
  /// (size = lead time; the last slot, the arrival day itself, is 0 before this order).
  std::span<const std::int32_t> pipeline;
};

/// The store and days a batch of decisions is for.
struct OrderContext {
  const StoreView& store;
  int order_day = 0;
  int arrival_day = 0;
  /// The policy's forecast, for rules that need days other than the arrival day (shelf life
  /// above one day, coverage until the next delivery).
  const Forecaster* forecaster = nullptr;
};

/// Mutable rule state of one store, all items.
class OrderRule {
 public:
  virtual ~OrderRule() = default;
  /// Sees every day's observations after close (before any order that day); rules with a
  /// memory (replayed history, behaviour) keep what they need.
  virtual void observe(int /*day*/, std::span<const Observation> /*observed*/) {}
  /// Writes one non-negative order quantity per item (before adjustments and pack rounding).
  virtual void decide(const OrderContext& ctx, std::span<const OrderInput> in,
                      std::span<int> out) = 0;
  /// Network-planned rules only: the in-stock level of every item at this store, set by the
  /// runner at each re-plan (network_target.hpp).
  virtual void set_levels(std::span<const double> /*level_per_item*/) {}
};

/// A configured quantity rule (immutable, shared by threads).
class QuantityMethod {
 public:
  virtual ~QuantityMethod() = default;
  virtual std::unique_ptr<OrderRule> make(const StoreView& store) const = 0;
  /// The network target when the rule's levels are planned across the network, else null.
  virtual const NetworkTarget* network() const { return nullptr; }
};

}  // namespace larder
