#include "reports/pairs_csv.hpp"

#include <catch2/catch.hpp>

#include "reports/sample_run.test.hpp"

using larder::test::parse_csv;
using larder::test::parse_double;

TEST_CASE("pairs.csv compares every pair of policies, later minus earlier", "[reports]") {
  const larder::RunResult r = larder::test::sample_run();
  const std::string text = larder::pairs_csv(r);
  const auto rows = parse_csv(text);
  REQUIRE(rows.size() == 1 + 3 * 6);  // header + 3 pairs x 6 reported metrics
  CHECK(text.substr(0, text.find('\n')) ==
        "policy,versus,metric,difference,stderr,ci_low,ci_high,replications,verdict");
  for (const auto& row : rows) CHECK(row.size() == 9);
  // Pairs in scenario order: (1, 0), (2, 0), (2, 1).
  CHECK((rows[1][0] == "newsvendor" && rows[1][1] == "fixed_order"));
  CHECK((rows[7][0] == "cautious, v2" && rows[7][1] == "fixed_order"));
  CHECK((rows[13][0] == "cautious, v2" && rows[13][1] == "newsvendor"));

  // The pair without the baseline, waste_units: cautious [121, 129, 120, 127, 139] minus
  // newsvendor [100, 112, 97, 108, 118]. /usr/bin/python3, scipy 1.10.1: z = a - b; z.mean()
  // = 20.2, scipy.stats.sem(z) = 1.0198039027185568, scipy.stats.t.interval(0.95, 4,
  // loc=z.mean(), scale=sem) = (17.36857044603545, 23.03142955396455).
  const auto& waste = rows[13 + 2];
  REQUIRE(waste[2] == "waste_units");
  CHECK(parse_double(waste[3]) == Approx(20.2).epsilon(1e-12));
  CHECK(parse_double(waste[4]) == Approx(1.0198039027185568).epsilon(1e-12));
  CHECK(parse_double(waste[5]) == Approx(17.36857044603545).epsilon(1e-12));
  CHECK(parse_double(waste[6]) == Approx(23.03142955396455).epsilon(1e-12));
  CHECK(waste[7] == "5");
  CHECK(waste[8] == "worse: higher waste_units (significant)");
  // sold_units, newsvendor [905, 918, 906, 902, 930] minus fixed_order [900, 910, 905, 895, 920]
  // = [5, 8, 1, 7, 10]; the same scipy calls give mean 6.2, sem 1.5297058540778354, interval
  // (1.952855669053176, 10.447144330946823).
  const auto& sold = rows[1];
  REQUIRE(sold[2] == "sold_units");
  CHECK(parse_double(sold[3]) == Approx(6.2).epsilon(1e-12));
  CHECK(parse_double(sold[4]) == Approx(1.5297058540778354).epsilon(1e-12));
  CHECK(parse_double(sold[5]) == Approx(1.952855669053176).epsilon(1e-12));
  CHECK(parse_double(sold[6]) == Approx(10.447144330946823).epsilon(1e-12));
  CHECK(sold[8] == "higher sold_units (significant)");
}

TEST_CASE("pairs.csv is empty for a run of one policy", "[reports]") {
  larder::RunResult r = larder::test::sample_run();
  r.policies.resize(1);
  r.values.resize(1);
  CHECK(larder::pairs_csv(r).empty());
}
