// product_limit: the moments of the Kaplan-Meier distribution with each tail, and the rolling
// window of one weekday's observations.

#include "policies/censoring/product_limit.hpp"

#include <catch2/catch.hpp>
#include <cmath>

#include "sim/engine/demand_model.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

/// checks.md 3(b) tiny data set with sold-out days at sales - 0.5.
KaplanMeier tiny_fixed() {
  const int sales[] = {12, 15, 15, 9, 20, 18, 15, 11, 20, 14};
  const bool out[] = {false, false, true, false, true, false, false, false, true, false};
  std::vector<SurvivalObservation> d;
  for (int i = 0; i < 10; ++i) d.push_back({out[i] ? sales[i] - 0.5 : sales[i], out[i]});
  return kaplan_meier(d);
}

TEST_CASE("product_limit moments with the restricted tail equal checks.md's restricted mean",
          "[policies][censoring]") {
  // checks.md 3(b): restricted mean sum_{k<20} S(k) = 15.16 with the discrete fix; it is the
  // mean with the unplaced 0.24 at 20. Second moment by hand from the masses 0.1 at 9, 11, 12,
  // 14, 0.24 at 15, 0.12 at 18, 0.24 at 20: E[D^2] = 243.08, variance 243.08 - 15.16^2 =
  // 13.2544, times (n + 1) / (n - 1) = 11 / 9 for n = 10.
  const DemandForecast f =
      product_limit_moments(tiny_fixed(), 10, {0.0, 0.0}, ProductLimitTail::restricted);
  CHECK(f.mean == Approx(15.16).epsilon(1e-12));
  CHECK(f.variance == Approx(13.2544 * 11.0 / 9.0).epsilon(1e-12));
}

TEST_CASE("product_limit moments with the self-consistent normal tail", "[policies][censoring]") {
  // The unplaced 0.24 goes to D >= 20, i.e. X >= 19.5, under the normal whose mean and
  // variance are those of the completed distribution. Reference: the same fixed point computed
  // with scipy 1.10.1 (/usr/bin/python3): starting from the checks.md 3(a) Tobit MLE
  // (15.790915, 4.575836^2), iterate t = scipy.stats.truncnorm((19.5 - mu) / sd, numpy.inf,
  // loc=mu, scale=sd); mu = m1 + 0.24 * t.mean(); var = m2 + 0.24 * (t.var() + t.mean()^2) -
  // mu^2 (m1, m2 the body moments) until it stops moving (31 steps): mu = 15.620701837159995,
  // var = 19.379381833859952, reported variance var * 11 / 9 = 23.685911130273276. Agreement to
  // 1e-8: our iteration stops once a step moves less than 1e-9 relative, and contracting by
  // about 0.35 a step (31 steps to 1e-14 above), what is left is smaller than that last step.
  const DemandForecast f = product_limit_moments(tiny_fixed(), 10, {15.790915, 4.575836 * 4.575836},
                                                 ProductLimitTail::normal);
  CHECK(f.mean == Approx(15.620701837159995).epsilon(1e-8));
  CHECK(f.variance == Approx(23.685911130273276).epsilon(1e-8));
  // The same fixed point from a poor start (the parametric forecast only starts the iteration).
  const DemandForecast g =
      product_limit_moments(tiny_fixed(), 10, {5.0, 1.0}, ProductLimitTail::normal);
  CHECK(g.mean == Approx(f.mean).epsilon(1e-8));
  CHECK(g.variance == Approx(f.variance).epsilon(1e-8));
  // Above the restricted mean 15.16 (all of the 0.24 at 20) of checks.md 3(b).
  CHECK(f.mean > 15.16);
  // Every day sold out: no body to fit, the parametric forecast's tail D >= 20 (scipy
  // truncnorm mean 26.075872841186914 and variance 4.599324161881458 for N(20, 4.5^2) beyond
  // 23.5 at s = 24, see normal_tail.test.cpp), variance times (2 + 1) / (2 - 1).
  const KaplanMeier all_out = kaplan_meier({{23.5, true}, {17.5, true}});
  const DemandForecast h =
      product_limit_moments(all_out, 2, {20.0, 4.5 * 4.5}, ProductLimitTail::normal);
  CHECK(h.mean == Approx(26.075872841186914).epsilon(1e-12));
  CHECK(h.variance == Approx(4.599324161881458 * 3.0).epsilon(1e-9));
  // Nothing censored at the top: the tail is unused and the parametric forecast ignored.
  const KaplanMeier plain = kaplan_meier({{10, false}, {12, false}, {9, true}, {14, false}});
  const DemandForecast k = product_limit_moments(plain, 4, {99.0, 99.0}, ProductLimitTail::normal);
  CHECK(k.mean == Approx(12.0).epsilon(1e-12));  // by hand: 1/3 each at 10, 12, 14
  CHECK(k.variance == Approx(8.0 / 3.0 * 5.0 / 3.0).epsilon(1e-12));
  // One observation: its value, with the parametric forecast's variance.
  const DemandForecast one =
      product_limit_moments(kaplan_meier({{17, false}}), 1, {20.0, 9.0}, ProductLimitTail::normal);
  CHECK(one.mean == 17.0);
  CHECK(one.variance == 9.0);
}

const char* kScenario = R"(
format: 1
name: product-limit-unit
seed: 1
horizon: { days: 70, warmup_days: 0, start_weekday: mon }
replications: 1
stores: [ { id: s } ]
items:
  - { id: loaf, price: 3, unit_cost: 1, demand: { base: 20 } }
  - { id: roll, price: 1, unit_cost: 0.3, demand: { base: 5 } }
policies:
  - name: km
    forecast: { method: oracle }
    censoring: { method: product_limit, weeks: 3, tail: restricted }
    quantity: { rule: fixed, quantity: 1 }
)";

TEST_CASE("product_limit keeps the last `weeks` observations of each weekday",
          "[policies][censoring]") {
  const Scenario sc = test::scenario_from(kScenario);
  const auto policies = test::policies_for(sc);
  const DemandModel truth(sc);
  auto state = policies[0].censoring->make({sc, truth, 0});
  CHECK_FALSE(state->needs_forecast());
  const DemandForecast prior{50.0, 7.0};
  auto refined = [&](int day) {
    std::vector<DemandForecast> f(2, prior);
    state->refine(day, f);
    return f;
  };
  auto feed = [&](int day, int sold, bool sold_out) {
    std::vector<Observation> o(2);
    o[0] = {.delivered = sold_out ? sold : sold + 5,
            .sold = sold,
            .leftover = sold_out ? 0 : 5,
            .open = true,
            .sold_out = sold_out};
    o[1] = {.delivered = 9, .sold = 4, .leftover = 5, .open = true};
    std::vector<double> out(2);
    state->treat(day, o, {}, out);
    CHECK(out[0] == sold);  // the parametric forecast learns from sales, as with `ignore`
  };
  // Mondays are days 0, 7, 14, ...; refine for a Monday reads only Mondays.
  CHECK(refined(0)[0].mean == prior.mean);  // no data: the parametric forecast stays
  feed(0, 100, false);
  // One observation: its value, with the parametric variance.
  CHECK(refined(7)[0].mean == 100.0);
  CHECK(refined(7)[0].variance == prior.variance);
  feed(7, 0, true);  // an empty shelf: not recorded
  CHECK(refined(14)[0].mean == 100.0);
  feed(14, 10, false);
  feed(21, 12, false);
  feed(28, 14, false);  // the window (3 weeks) now holds 10, 12, 14: 100 has left it
  const auto f = refined(35);
  CHECK(f[0].mean == Approx(12.0).epsilon(1e-12));
  // By hand: plug-in variance 8/3, times (3 + 1) / (3 - 1).
  CHECK(f[0].variance == Approx(8.0 / 3.0 * 2.0).epsilon(1e-12));
  CHECK(f[1].mean == 4.0);  // the second item: four Mondays of 4, none sold out
  CHECK(f[1].variance == 0.0);
  CHECK(refined(36)[0].mean == prior.mean);  // Tuesday: no Tuesday data
  // A sold-out Monday at 13 replaces 10: event 12 (3 at risk, S = 2/3), censored at 12.5,
  // event 14 (1 at risk, S = 0). By hand: masses 1/3 at 12 and 2/3 at 14 (the censored day's
  // mass moves to the right, to 14), nothing unplaced.
  feed(35, 13, true);
  CHECK(refined(42)[0].mean == Approx(12.0 / 3.0 + 28.0 / 3.0).epsilon(1e-12));
}

}  // namespace
}  // namespace larder
