#pragma once
// Forecast part: estimates the demand distribution of a future day for every item of a store
// from demand estimates (sales, after the censoring treatment).

#include <memory>
#include <span>
#include <string>

#include "policies/part_context.hpp"

namespace larder {

/// Mean and variance of one day's demand.
struct DemandForecast {
  double mean = 0.0;
  double variance = 0.0;
};

/// Mutable forecast state of one store, all items.
class Forecaster {
 public:
  virtual ~Forecaster() = default;
  /// Learns from open day `day`: one demand estimate per item; NaN means "no information".
  virtual void observe(int day, std::span<const double> demand) = 0;
  /// The demand distribution of day `day`, per item.
  virtual void predict(int day, std::span<DemandForecast> out) const = 0;
  /// Bytes of state per item, for memory estimates.
  virtual std::size_t bytes_per_item() const = 0;
};

/// A configured forecast method (immutable, shared by threads).
class ForecastMethod {
 public:
  virtual ~ForecastMethod() = default;
  virtual std::unique_ptr<Forecaster> make(const StoreView& store) const = 0;
};

}  // namespace larder
