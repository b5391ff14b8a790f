// moving_average against the sample mean and sample variance (divisor n - 1) of the window,
// worked by hand, including the prior standing in for missing observations.

#include <fmt/format.h>

#include <catch2/catch.hpp>
#include <limits>

#include "policies/forecast/forecast_fixture.test.hpp"
#include "sim/engine/demand_model.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

/// One store open every day, one Poisson(10) item: the prior is mean 10, variance 10.
std::string scenario_yaml(const std::string& forecast, int days = 56) {
  return fmt::format(R"(
format: 1
name: ma
seed: 5
horizon: {{ days: {}, warmup_days: 0 }}
replications: 1
stores: [ {{ id: s }} ]
items:
  - {{ id: loaf, price: 3, unit_cost: 1, demand: {{ base: 10 }} }}
policies:
  - {{ name: p, forecast: {}, quantity: {{ rule: fixed, quantity: 1 }} }}
)",
                     days, forecast);
}

using forecast_test::observe_one;
using forecast_test::predict_one;

/// Builds the scenario's forecast for store 0 and runs `body` on it.
template <class Body>
void with_forecaster(const std::string& forecast, Body body, int days = 56) {
  const Scenario s = test::scenario_from(scenario_yaml(forecast, days));
  const DemandModel truth(s);
  const StoreView view{s, truth, 0};
  auto f = test::policies_for(s)[0].forecast->make(view);
  body(*f);
}

TEST_CASE("moving_average: the prior counts as the missing observations", "[policies][forecast]") {
  // Mondays 14, 6, 12, 8, 20 with weeks = 4 and prior (10, 10). Worked by hand:
  //  n=1: mean (3*10 + 14)/4 = 11, variance = prior 10 (one value has no spread)
  //  n=2: mean (2*10 + 20)/4 = 10, s^2{14, 6} = 32, variance (2*10 + 2*32)/4 = 21
  //  n=4: mean 40/4 = 10, s^2{14, 6, 12, 8} = (16 + 16 + 4 + 4)/3 = 40/3
  //  n=5: window {6, 12, 8, 20}: mean 11.5, s^2 = (30.25 + 0.25 + 12.25 + 72.25)/3 = 115/3
  with_forecaster("{ method: moving_average }", [](Forecaster& f) {
    CHECK(predict_one(f, 0).mean == Approx(10.0));
    CHECK(predict_one(f, 0).variance == Approx(10.0));
    observe_one(f, 0, 14.0);
    CHECK(predict_one(f, 7).mean == Approx(11.0));
    CHECK(predict_one(f, 7).variance == Approx(10.0));
    CHECK(predict_one(f, 1).mean == Approx(10.0));  // Tuesday: still the prior
    observe_one(f, 7, 6.0);
    CHECK(predict_one(f, 14).mean == Approx(10.0));
    CHECK(predict_one(f, 14).variance == Approx(21.0));
    observe_one(f, 14, 12.0);
    observe_one(f, 21, 8.0);
    CHECK(predict_one(f, 28).mean == Approx(10.0));
    CHECK(predict_one(f, 28).variance == Approx(40.0 / 3.0));
    observe_one(f, 28, 20.0);
    CHECK(predict_one(f, 35).mean == Approx(11.5));
    CHECK(predict_one(f, 35).variance == Approx(115.0 / 3.0));
    // A Monday without information is skipped: the window is unchanged.
    observe_one(f, 35, std::numeric_limits<double>::quiet_NaN());
    CHECK(predict_one(f, 42).mean == Approx(11.5));
    CHECK(predict_one(f, 42).variance == Approx(115.0 / 3.0));
  });
}

TEST_CASE("moving_average with initial: first_week uses the observations alone",
          "[policies][forecast]") {
  // weeks = 3, Mondays 5, 9, 4, 10. By hand: none -> 0; {5} -> mean 5, variance 5
  // (Poisson-like); {5, 9} -> 7, s^2 = 8; {5, 9, 4} -> 6, s^2 = (1 + 9 + 4)/2 = 7;
  // {9, 4, 10} -> 23/3, s^2 = ((4/3)^2 + (11/3)^2 + (7/3)^2)/2 = (16 + 121 + 49)/18 = 31/3.
  with_forecaster("{ method: moving_average, weeks: 3, initial: first_week }", [](Forecaster& f) {
    CHECK(predict_one(f, 0).mean == 0.0);
    CHECK(predict_one(f, 0).variance == 0.0);
    observe_one(f, 0, 5.0);
    CHECK(predict_one(f, 7).mean == Approx(5.0));
    CHECK(predict_one(f, 7).variance == Approx(5.0));
    observe_one(f, 7, 9.0);
    CHECK(predict_one(f, 14).mean == Approx(7.0));
    CHECK(predict_one(f, 14).variance == Approx(8.0));
    observe_one(f, 14, 4.0);
    CHECK(predict_one(f, 21).mean == Approx(6.0));
    CHECK(predict_one(f, 21).variance == Approx(7.0));
    observe_one(f, 21, 10.0);
    CHECK(predict_one(f, 28).mean == Approx(23.0 / 3.0));
    CHECK(predict_one(f, 28).variance == Approx(31.0 / 3.0));
  });
}

TEST_CASE("moving_average with weeks = 1 is the last value; a long window fits a short horizon",
          "[policies][forecast]") {
  // weeks = 1: mean = last Monday, variance = prior (one value has no spread).
  with_forecaster("{ method: moving_average, weeks: 1 }", [](Forecaster& f) {
    observe_one(f, 0, 14.0);
    observe_one(f, 7, 6.0);
    CHECK(predict_one(f, 14).mean == Approx(6.0));
    CHECK(predict_one(f, 14).variance == Approx(10.0));
  });
  // weeks = 52 over 14 days: two Mondays 14, 6 of 52 -> mean (50*10 + 20)/52 = 10,
  // variance (50*10 + 2*32)/52 = 564/52. The ring holds only the horizon's 2 weeks.
  with_forecaster(
      "{ method: moving_average, weeks: 52 }",
      [](Forecaster& f) {
        observe_one(f, 0, 14.0);
        observe_one(f, 7, 6.0);
        CHECK(predict_one(f, 13).mean == Approx(10.0));  // a Sunday: the prior
        CHECK(predict_one(f, 7).mean == Approx(10.0));
        CHECK(predict_one(f, 7).variance == Approx(564.0 / 52.0));
        CHECK(f.bytes_per_item() == 7 * (2 * sizeof(double) + 4 + sizeof(DemandForecast)));
      },
      14);
}

TEST_CASE("moving_average parameters are validated with the path in the message",
          "[policies][forecast]") {
  // weeks is an integer >= 1 (the brief).
  for (const auto& [value, message] :
       {std::pair<std::string, std::string>{"0", "policies[0].forecast.weeks must be >= 1 (got 0)"},
        {"2.5", "policies[0].forecast.weeks must be a whole number (got 2.5)"}}) {
    const Scenario s =
        test::scenario_from(scenario_yaml("{ method: moving_average, weeks: " + value + " }"));
    Diagnostics diag;
    build_policies(s, diag);
    INFO(diag.format());
    CHECK(diag.items().size() == 1);
    CHECK_THAT(diag.format(), Catch::Matchers::Contains(message));
  }
}

}  // namespace
}  // namespace larder
