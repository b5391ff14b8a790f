#include "reports/metrics_csv.hpp"

#include <catch2/catch.hpp>

#include "reports/comparison.hpp"
#include "reports/sample_run.test.hpp"

using larder::test::parse_csv;
using larder::test::parse_double;

TEST_CASE("metrics.csv has the exact header and one row per policy and metric", "[reports]") {
  const larder::RunResult r = larder::test::sample_run();
  const std::string text = larder::metrics_csv(r);
  CHECK(text.substr(0, text.find('\n')) == "policy,metric,mean,stderr,ci_low,ci_high,replications");
  REQUIRE(text.back() == '\n');

  const auto rows = parse_csv(text);
  REQUIRE(rows.size() == 1 + 3 * 6);  // header + 3 policies x 6 reported metrics
  for (const auto& row : rows) CHECK(row.size() == 7);
  // Policies in order, metrics in reported order within each policy.
  CHECK(rows[1][0] == "fixed_order");
  CHECK(rows[1][1] == "sold_units");
  CHECK(rows[6][1] == "profit");
  CHECK(rows[7][0] == "newsvendor");
  CHECK(rows[13][0] == "cautious, v2");  // quoted in the file, unquoted after parsing
  CHECK(text.find("\"cautious, v2\",sold_units,") != std::string::npos);
  CHECK(rows[18][1] == "profit");
  for (size_t i = 1; i < rows.size(); ++i) CHECK(rows[i][6] == "5");
}

TEST_CASE("metrics.csv values match scipy and read back bit for bit", "[reports]") {
  const larder::RunResult r = larder::test::sample_run();
  const auto rows = parse_csv(larder::metrics_csv(r));

  // Row 9 is newsvendor (policy 1), waste_units (metric 3 of 6).
  const auto& row = rows[1 + 6 + 2];
  REQUIRE(row[0] == "newsvendor");
  REQUIRE(row[1] == "waste_units");
  // /usr/bin/python3, scipy 1.10.1: x = [100, 112, 97, 108, 118]; x.mean(),
  // scipy.stats.sem(x), scipy.stats.t.interval(0.95, 4, loc=x.mean(), scale=sem).
  CHECK(parse_double(row[2]) == Approx(107.0).epsilon(1e-12));
  CHECK(parse_double(row[3]) == Approx(3.8470768123342687).epsilon(1e-12));
  CHECK(parse_double(row[4]) == Approx(96.31880241507457).epsilon(1e-12));
  CHECK(parse_double(row[5]) == Approx(117.68119758492543).epsilon(1e-12));

  // Every printed number is exactly the double computed for the report.
  for (size_t i = 1; i < rows.size(); ++i) {
    const int policy = static_cast<int>((i - 1) / 6);
    const larder::Metric m = r.metrics[(i - 1) % 6];
    const larder::Estimate e = larder::policy_estimate(r, policy, m);
    INFO(rows[i][0] << " " << rows[i][1]);
    CHECK(rows[i][1] == larder::metric_name(m));
    CHECK(parse_double(rows[i][2]) == e.mean);
    CHECK(parse_double(rows[i][3]) == e.stderr_);
    CHECK(parse_double(rows[i][4]) == e.ci_low);
    CHECK(parse_double(rows[i][5]) == e.ci_high);
  }
}
