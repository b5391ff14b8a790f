// same_day_last_week against the seasonal naive forecast y_hat(t) = y(t - 7) (Hyndman and
// Athanasopoulos, Forecasting: Principles and Practice, simple forecasting methods) and its
// smoothed squared error, worked by hand.

#include <fmt/format.h>

#include <catch2/catch.hpp>
#include <limits>

#include "policies/forecast/forecast_fixture.test.hpp"
#include "sim/engine/demand_model.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

/// One store open every day, one Poisson(10) item: the prior is mean 10, variance 10.
std::string scenario_yaml(const std::string& forecast) {
  return fmt::format(R"(
format: 1
name: naive
seed: 5
horizon: {{ days: 56, warmup_days: 0 }}
replications: 1
stores: [ {{ id: s }} ]
items:
  - {{ id: loaf, price: 3, unit_cost: 1, demand: {{ base: 10 }} }}
policies:
  - {{ name: p, forecast: {}, quantity: {{ rule: fixed, quantity: 1 }} }}
)",
                     forecast);
}

using forecast_test::observe_one;
using forecast_test::predict_one;

template <class Body>
void with_forecaster(const std::string& forecast, Body body) {
  const Scenario s = test::scenario_from(scenario_yaml(forecast));
  const DemandModel truth(s);
  const StoreView view{s, truth, 0};
  auto f = test::policies_for(s)[0].forecast->make(view);
  body(*f);
}

TEST_CASE("same_day_last_week forecasts last week's value with its smoothed squared error",
          "[policies][forecast]") {
  // alpha = 0.2 [default], prior (10, 10). Worked by hand:
  //  Mon 14: e = 14 - 10 = 4, v = 0.8*10 + 0.2*16 = 11.2, forecast 14
  //  Mon 8:  e = 8 - 14 = -6, v = 0.8*11.2 + 0.2*36 = 16.16, forecast 8
  with_forecaster("{ method: same_day_last_week }", [](Forecaster& f) {
    CHECK(predict_one(f, 0).mean == Approx(10.0));
    CHECK(predict_one(f, 0).variance == Approx(10.0));
    observe_one(f, 0, 14.0);
    CHECK(predict_one(f, 7).mean == Approx(14.0));
    CHECK(predict_one(f, 7).variance == Approx(11.2));
    CHECK(predict_one(f, 1).mean == Approx(10.0));  // Tuesday: still the prior
    observe_one(f, 7, 8.0);
    CHECK(predict_one(f, 14).mean == Approx(8.0));
    CHECK(predict_one(f, 14).variance == Approx(16.16));
    CHECK(predict_one(f, 21).mean == Approx(8.0));  // two weeks ahead: the same value
    // A Monday without information is skipped: the last observed Monday stays.
    observe_one(f, 14, std::numeric_limits<double>::quiet_NaN());
    CHECK(predict_one(f, 21).mean == Approx(8.0));
    CHECK(predict_one(f, 21).variance == Approx(16.16));
  });
}

TEST_CASE("same_day_last_week with initial: first_week starts at the first observation",
          "[policies][forecast]") {
  // alpha = 0.5. By hand: none -> 0; Mon 5 -> forecast 5, variance 5 (Poisson-like);
  // Mon 9: e = 4, v = 0.5*5 + 0.5*16 = 10.5, forecast 9.
  with_forecaster("{ method: same_day_last_week, alpha: 0.5, initial: first_week }",
                  [](Forecaster& f) {
                    CHECK(predict_one(f, 0).mean == 0.0);
                    observe_one(f, 0, 5.0);
                    CHECK(predict_one(f, 7).mean == Approx(5.0));
                    CHECK(predict_one(f, 7).variance == Approx(5.0));
                    CHECK(predict_one(f, 8).mean == 0.0);  // no Tuesday seen yet
                    observe_one(f, 7, 9.0);
                    CHECK(predict_one(f, 14).mean == Approx(9.0));
                    CHECK(predict_one(f, 14).variance == Approx(10.5));
                  });
}

TEST_CASE("same_day_last_week parameters are validated with the path in the message",
          "[policies][forecast]") {
  // alpha in (0, 1] (the brief).
  const Scenario s = test::scenario_from(scenario_yaml("{ method: same_day_last_week, alpha: 0 }"));
  Diagnostics diag;
  build_policies(s, diag);
  INFO(diag.format());
  CHECK(diag.items().size() == 1);
  CHECK_THAT(diag.format(),
             Catch::Matchers::Contains("policies[0].forecast.alpha must be in (0, 1] (got 0)"));
}

}  // namespace
}  // namespace larder
