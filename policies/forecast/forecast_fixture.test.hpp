#pragma once
// Test helpers for forecast methods: one-item observe and predict calls.

#include <span>

#include "policies/forecast.hpp"

namespace larder::forecast_test {

/// The forecast of day `day` for a one-item forecaster.
inline DemandForecast predict_one(const Forecaster& f, int day) {
  DemandForecast out;
  f.predict(day, std::span<DemandForecast>(&out, 1));
  return out;
}

/// Feeds one observation `y` of day `day` to a one-item forecaster.
inline void observe_one(Forecaster& f, int day, double y) {
  f.observe(day, std::span<const double>(&y, 1));
}

}  // namespace larder::forecast_test
