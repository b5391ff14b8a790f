// The `intraday` treatment: sales scaled by the share of the intraday profile elapsed at the
// sell-out time, checked against values worked by hand from the profiles' definitions, and the
// message when the policy does not observe intraday.

#include <catch2/catch.hpp>
#include <cmath>
#include <limits>
#include <string>
#include <vector>

#include "sim/engine/demand_model.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

// Opening hours 8 to 20: twelve hourly buckets. Item 0 keeps the flat profile, item 1 gets
// morning_peak below. `intraday_scenario` sets the profile and `observe: intraday` on the typed
// scenario, so the hand-computed cases do not depend on the loader; one case reads them from
// the YAML.
const std::string kScenario = R"(format: 1
name: intraday
seed: 1
horizon: { days: 14, warmup_days: 0, start_weekday: mon }
replications: 1
calendar: { hours: { open: 8, close: 20 } }
stores: [ { id: s } ]
items:
  - { id: loaf, price: 3, unit_cost: 1, demand: { base: 20 } }
  - { id: roll, price: 1, unit_cost: 0.3, demand: { base: 30 } }
policies:
  - name: by_hour
    forecast: { method: oracle }
    censoring: intraday
    quantity: { rule: fixed, quantity: 1 }
)";

Scenario intraday_scenario() {
  Scenario sc = test::scenario_from(kScenario);
  sc.items[1].demand.intraday = "morning_peak";
  sc.policies[0].observe_intraday = true;
  return sc;
}

/// An open day's observation: `sold` units sold, sold out at `hour` (NaN: not sold out).
Observation seen(int sold, float hour) {
  Observation o;
  o.open = true;
  o.sold = sold;
  o.delivered = std::isnan(hour) ? sold + 3 : sold;
  o.leftover = std::isnan(hour) ? 3 : 0;
  o.sold_out = !std::isnan(hour);
  o.sellout_hour = hour;
  return o;
}

constexpr float kNotOut = std::numeric_limits<float>::quiet_NaN();

TEST_CASE("intraday: sales over the profile share elapsed at the sell-out, by hand",
          "[policies][censoring]") {
  const Scenario sc = intraday_scenario();
  REQUIRE(sc.hours() == 12);
  const auto policies = test::policies_for(sc);
  const DemandModel truth(sc);
  auto state = policies[0].censoring->make({sc, truth, 0});
  CHECK_FALSE(state->needs_forecast());
  auto treat = [&](Observation loaf, Observation roll) {
    const std::vector<Observation> o{loaf, roll};
    std::vector<double> out(2);
    state->treat(0, o, {}, out);
    return out;
  };

  // Flat profile, 12 hours: sold out 3 hours after opening with 6 sales, a quarter of the day's
  // customers had come (3 / 12), so the day would have brought 6 / 0.25 = 24.
  CHECK(treat(seen(6, 3.0f), seen(4, kNotOut))[0] == Approx(24.0).epsilon(1e-12));
  // Flat, sold out 4.5 hours in with 9 sales: 9 / (4.5 / 12) = 24 again.
  CHECK(treat(seen(9, 4.5f), seen(4, kNotOut))[0] == Approx(24.0).epsilon(1e-12));

  // morning_peak (intraday_profile.cpp): the hour starting at clock hour h weighs
  // 1 + 2 exp(-z^2 / 2), z = (h + 0.5 - 8.5) / 1.5. Hours 8 to 19 from that formula (by hand,
  // exp values from /usr/bin/python3 math.exp):
  //   h = 8: z = 0, 3; h = 9: z = 2/3, 1 + 2 exp(-2/9) = 2.6014748058336163;
  //   h = 10: z = 4/3, 1 + 2 exp(-8/9) = 1.822224581014375; h = 11: z = 2, 1 + 2 exp(-2) =
  //   1.2706705664732254; h = 12: 1 + 2 exp(-32/9) = 1.0571310015691007; h = 13: 1 + 2
  //   exp(-50/9) = 1.0077318402789457; h = 14: 1 + 2 exp(-8) = 1.000670925255805; h = 15..19:
  //   1.000037328938227, 1.000001331672294, 1.0000000304599594, 1.0000000004467262,
  //   1.0000000000042009. Total 16.759942411946472.
  // Sold out at 9:30 (1.5 hours in) with 10 sales: elapsed (3 + 0.5 * 2.6014748058336163) /
  // 16.759942411946472 = 0.2566081253269251, estimate 10 / 0.2566081253269251 =
  // 38.96992734450537 (a flat profile would say 10 / (1.5 / 12) = 80: with the morning rush,
  // selling out early says less about the day).
  {
    const auto out = treat(seen(5, kNotOut), seen(10, 1.5f));
    CHECK(out[0] == 5.0);
    CHECK(out[1] == Approx(38.96992734450537).epsilon(1e-12));
  }
  // Sold out at 10:15 (2.25 hours in) with 12 sales: elapsed (3 + 2.6014748058336163 + 0.25 *
  // 1.822224581014375) / 16.759942411946472 = 0.3613992698906748, estimate 12 / that =
  // 33.20427294617962.
  CHECK(treat(seen(5, kNotOut), seen(12, 2.25f))[1] == Approx(33.20427294617962).epsilon(1e-12));

  // Not sold out: the sales are the demand.
  {
    const auto out = treat(seen(7, kNotOut), seen(11, kNotOut));
    CHECK(out[0] == 7.0);
    CHECK(out[1] == 11.0);
  }
  // Sold out at the close (12 hours in): the whole day was seen, the sales.
  CHECK(treat(seen(13, 12.0f), seen(4, kNotOut))[0] == Approx(13.0).epsilon(1e-12));
  // Sold out with no sales (nothing on the shelf), or at the opening (no customer expected
  // yet): skipped, an empty shelf says nothing about demand.
  {
    const auto out = treat(seen(0, 0.0f), seen(3, 0.0f));
    CHECK(std::isnan(out[0]));
    CHECK(std::isnan(out[1]));
  }
  // Sold out but no time recorded: falls back to the sales.
  {
    Observation o = seen(8, 2.0f);
    o.sellout_hour = kNotOut;
    CHECK(treat(o, seen(4, kNotOut))[0] == 8.0);
  }
  // A closed day: skipped, whatever the rest of the record says.
  {
    Observation closed = seen(6, 3.0f);
    closed.open = false;
    const auto out = treat(closed, Observation{});
    CHECK(std::isnan(out[0]));
    CHECK(std::isnan(out[1]));
  }
}

TEST_CASE("intraday: profile and observe: intraday as written in a scenario",
          "[policies][censoring]") {
  // The same morning_peak case as above (10 sales, sold out 1.5 hours in: 38.96992734450537),
  // with the profile and the observation mode read from the YAML.
  std::string text = kScenario;
  const auto at = [&](const std::string& s) { return text.find(s); };
  text.replace(at("{ base: 30 }"), 12, "{ base: 30, intraday: morning_peak }");
  text.replace(at("    censoring: intraday\n"), 24,
               "    censoring: intraday\n    observe: intraday\n");
  const Scenario sc = test::scenario_from(text);
  REQUIRE(sc.policies[0].observe_intraday);
  const auto policies = test::policies_for(sc);
  const DemandModel truth(sc);
  auto state = policies[0].censoring->make({sc, truth, 0});
  const std::vector<Observation> o{seen(6, 3.0f), seen(10, 1.5f)};
  std::vector<double> out(2);
  state->treat(0, o, {}, out);
  CHECK(out[0] == Approx(24.0).epsilon(1e-12));
  CHECK(out[1] == Approx(38.96992734450537).epsilon(1e-12));
}

/// The diagnostics of building the policies of `kScenario` with its censoring line replaced by
/// `censoring` (line 14 of the file), without `observe: intraday`.
std::string problems_without_observe(const std::string& censoring) {
  std::string text = kScenario;
  const std::string line = "    censoring: intraday\n";
  text.replace(text.find(line), line.size(), censoring + "\n");
  Diagnostics diag;
  auto sc = parse_scenario(text, "p.yaml", diag);
  REQUIRE(sc.has_value());
  build_policies(*sc, diag);
  return diag.format();
}

TEST_CASE("intraday: refused without observe: intraday on the policy",
          "[policies][censoring][validation]") {
  CHECK(problems_without_observe("    censoring: intraday") ==
        "p.yaml:14:16: error: policies[0].censoring: intraday needs observe: intraday on the "
        "policy\n"
        "  hint: add observe: intraday to the policy\n");
  CHECK(problems_without_observe("    censoring: { method: intraday }") ==
        "p.yaml:14:26: error: policies[0].censoring: intraday needs observe: intraday on the "
        "policy\n"
        "  hint: add observe: intraday to the policy\n");
  // With the policy observing intraday it builds.
  Diagnostics diag;
  build_policies(intraday_scenario(), diag);
  CHECK(diag.ok());
}

}  // namespace
}  // namespace larder
