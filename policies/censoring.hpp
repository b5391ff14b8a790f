#pragma once
// Censoring treatment: turns what a store observed (sales cut off at the stock it had) into the
// demand estimates a forecast learns from.

#include <memory>
#include <span>

#include "policies/forecast.hpp"
#include "policies/observation.hpp"

namespace larder {

/// Mutable censoring state of one store, all items.
class CensoringState {
 public:
  virtual ~CensoringState() = default;
  /// Whether `treat` reads the forecast made for the day (otherwise it is not computed).
  virtual bool needs_forecast() const { return false; }
  /// Demand estimates for open day `day` (NaN = skip the day), given the day's observations and
  /// the forecast that was made for it.
  virtual void treat(int day, std::span<const Observation> observed,
                     std::span<const DemandForecast> predicted, std::span<double> out) = 0;
  /// May replace the forecast of `day` that the quantity rule will use (a treatment that
  /// estimates the distribution itself, e.g. product-limit). Default: unchanged.
  virtual void refine(int /*day*/, std::span<DemandForecast> /*forecast*/) const {}
};

/// A configured censoring treatment (immutable, shared by threads).
class CensoringMethod {
 public:
  virtual ~CensoringMethod() = default;
  virtual std::unique_ptr<CensoringState> make(const StoreView& store) const = 0;
};

}  // namespace larder
