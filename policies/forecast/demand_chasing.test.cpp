// demand_chasing: the weekday SES recursion of checks.md 7.1 with a high alpha, which
// overreacts to the last observation (Kremer, Moritz and Siemsen 2011, checks.md 7.2).

#include <fmt/format.h>

#include <catch2/catch.hpp>
#include <cmath>

#include "policies/forecast/forecast_fixture.test.hpp"
#include "sim/engine/demand_model.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

/// One store open every day, one Poisson(10) item (prior mean 10, variance 10); one policy per
/// forecast given.
std::string scenario_yaml(const std::vector<std::string>& forecasts) {
  std::string policies;
  for (size_t k = 0; k < forecasts.size(); ++k) {
    policies +=
        fmt::format("  - {{ name: p{}, forecast: {}, quantity: {{ rule: fixed, quantity: 1 }} }}\n",
                    k, forecasts[k]);
  }
  return fmt::format(R"(
format: 1
name: chasing
seed: 5
horizon: {{ days: 56, warmup_days: 0 }}
replications: 1
stores: [ {{ id: s }} ]
items:
  - {{ id: loaf, price: 3, unit_cost: 1, demand: {{ base: 10 }} }}
policies:
{})",
                     policies);
}

using forecast_test::observe_one;
using forecast_test::predict_one;

TEST_CASE("demand_chasing is the weekday SES recursion with its alpha (checks.md 7.1)",
          "[policies][forecast]") {
  // checks.md 7.1 [C, matched to statsmodels]: weekday SES, alpha = 0.4, l_0 = first value of
  // each weekday, next-week forecasts Mon..Sun.
  const double y[] = {23, 19, 20, 25, 31, 37, 12, 18, 15, 18, 20, 33, 38, 7,
                      20, 20, 16, 24, 27, 35, 12, 19, 17, 17, 24, 28, 38, 10};
  const double expected[] = {19.96, 17.864, 17.552, 23.64, 29.128, 37.064, 10.48};
  const Scenario s = test::scenario_from(
      scenario_yaml({"{ method: demand_chasing, alpha: 0.4, initial: first_week }"}));
  const DemandModel truth(s);
  const StoreView view{s, truth, 0};
  auto f = test::policies_for(s)[0].forecast->make(view);
  for (int t = 0; t < 28; ++t) observe_one(*f, t, y[t]);
  for (int w = 0; w < 7; ++w) CHECK(predict_one(*f, 28 + w).mean == Approx(expected[w]));
}

TEST_CASE("demand_chasing (alpha 0.8) follows a step in demand faster than ses_weekday 0.2",
          "[policies][forecast]") {
  // Prior 10, then every Monday 20. SES by hand: gap after k Mondays = 10 (1 - alpha)^k, so
  // alpha 0.8 gives 18, 19.6, 19.92 and alpha 0.2 gives 12, 13.6, 14.88.
  const Scenario s = test::scenario_from(
      scenario_yaml({"{ method: demand_chasing }", "{ method: ses_weekday, alpha: 0.2 }"}));
  const DemandModel truth(s);
  const StoreView view{s, truth, 0};
  const auto policies = test::policies_for(s);
  auto chasing = policies[0].forecast->make(view);
  auto ses = policies[1].forecast->make(view);
  const double chasing_levels[] = {18.0, 19.6, 19.92};
  const double ses_levels[] = {12.0, 13.6, 14.88};
  for (int k = 0; k < 3; ++k) {
    observe_one(*chasing, 7 * k, 20.0);
    observe_one(*ses, 7 * k, 20.0);
    CHECK(predict_one(*chasing, 7 * k + 7).mean == Approx(chasing_levels[k]));
    CHECK(predict_one(*ses, 7 * k + 7).mean == Approx(ses_levels[k]));
  }
  CHECK(std::abs(20.0 - predict_one(*chasing, 21).mean) <
        std::abs(20.0 - predict_one(*ses, 21).mean));
  // ...and overreacts to a one-off: after Mondays 20, 20, 20 one Monday of 5 pulls it to
  // 0.2*19.92 + 0.8*5 = 7.984 (ses: 0.8*14.88 + 0.2*5 = 12.904).
  observe_one(*chasing, 21, 5.0);
  observe_one(*ses, 21, 5.0);
  CHECK(predict_one(*chasing, 28).mean == Approx(7.984));
  CHECK(predict_one(*ses, 28).mean == Approx(12.904));
}

TEST_CASE("demand_chasing starts from the prior and its variance follows SES (policies.md)",
          "[policies][forecast]") {
  // Worked by hand with the default alpha 0.8 and prior (10, 10): Monday 20 gives
  // level 18 and variance 0.2*10 + 0.8*10^2 = 82; Tuesday is still the prior.
  const Scenario s = test::scenario_from(scenario_yaml({"{ method: demand_chasing }"}));
  const DemandModel truth(s);
  const StoreView view{s, truth, 0};
  auto f = test::policies_for(s)[0].forecast->make(view);
  CHECK(predict_one(*f, 0).mean == Approx(10.0));
  CHECK(predict_one(*f, 0).variance == Approx(10.0));
  observe_one(*f, 0, 20.0);
  CHECK(predict_one(*f, 7).mean == Approx(18.0));
  CHECK(predict_one(*f, 7).variance == Approx(82.0));
  CHECK(predict_one(*f, 8).mean == Approx(10.0));
}

TEST_CASE("demand_chasing parameters are validated with the path in the message",
          "[policies][forecast]") {
  // alpha in (0, 1] (the brief).
  const Scenario s = test::scenario_from(scenario_yaml({"{ method: demand_chasing, alpha: 1.5 }"}));
  Diagnostics diag;
  build_policies(s, diag);
  INFO(diag.format());
  CHECK(diag.items().size() == 1);
  CHECK_THAT(diag.format(),
             Catch::Matchers::Contains("policies[0].forecast.alpha must be in (0, 1] (got 1.5)"));
}

}  // namespace
}  // namespace larder
