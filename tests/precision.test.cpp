// --precision: replications are added until the 95% half-width meets the target; the result is
// the run of that many replications, bit for bit (batches continue the replication ids).

#include "sim/runner/precision.hpp"

#include <catch2/catch.hpp>

#include "tests/fixture.hpp"

namespace larder {
namespace {

TEST_CASE("parse_precision reads metric, value, percent and difference", "[precision]") {
  const auto a = parse_precision("profit=0.5%");
  REQUIRE(a);
  CHECK(a->metric == Metric::profit);
  CHECK(a->relative);
  CHECK(a->half_width == Approx(0.005).epsilon(1e-12));
  const auto b = parse_precision("difference:waste_units=20");
  REQUIRE(b);
  CHECK(b->difference);
  CHECK_FALSE(b->relative);
  CHECK(b->half_width == 20.0);
  CHECK_FALSE(parse_precision("profit"));
  CHECK_FALSE(parse_precision("profits=1%"));
  CHECK_FALSE(parse_precision("profit=-1"));
  CHECK_FALSE(parse_precision("profit=1%%"));
}

TEST_CASE("run_to_precision meets its target and equals one run of that size", "[precision]") {
  const Scenario s = test::scenario_from(R"(
format: 1
name: precision
seed: 5
horizon: { days: 56, warmup_days: 7 }
replications: 4
stores: [ { id: s } ]
items: [ { id: bun, price: 2, unit_cost: 0.8, demand: { base: 20, distribution: negative_binomial, cv: 0.5 } } ]
policies:
  - { name: a, forecast: { method: oracle }, quantity: { rule: critical_fractile } }
  - { name: b, forecast: { method: ses_weekday }, quantity: { rule: in_stock_target, level: 0.7 } }
)");
  const auto policies = test::policies_for(s);
  RunOptions o;
  o.threads = 2;
  const PrecisionTarget target = *parse_precision("waste_units=15");
  const RunResult r = run_to_precision(s, policies, o, target, 400);
  CHECK(r.info.replications > 4);
  CHECK(r.info.replications < 400);
  CHECK(precision_ratio(r, target) <= 1.0);
  Scenario same = s;
  same.replications = r.info.replications;
  CHECK(test::run_scenario(same, 1).values == r.values);
  // A cap stops it.
  const RunResult capped = run_to_precision(s, policies, o, *parse_precision("profit=0.0001%"), 9);
  CHECK(capped.info.replications == 9);
}

}  // namespace
}  // namespace larder
