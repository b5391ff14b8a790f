#include "reports/replications_csv.hpp"

#include <catch2/catch.hpp>

#include "reports/sample_run.test.hpp"

using larder::test::parse_csv;
using larder::test::parse_double;

TEST_CASE("replications.csv has the exact header and one row per policy and replication",
          "[reports]") {
  const larder::RunResult r = larder::test::sample_run();
  const std::string text = larder::replications_csv(r);
  CHECK(text.substr(0, text.find('\n')) ==
        "policy,replication,sold_units,lost_units,waste_units,waste_share,fill_rate,profit");
  const auto rows = parse_csv(text);
  REQUIRE(rows.size() == 1 + 3 * 5);  // header + 3 policies x 5 replications
  for (const auto& row : rows) CHECK(row.size() == 8);
  CHECK(rows[1][0] == "fixed_order");
  CHECK(rows[1][1] == "0");
  CHECK(rows[5][1] == "4");
  CHECK(rows[6][0] == "newsvendor");
  CHECK(rows[6][1] == "0");
  CHECK(rows[15][0] == "cautious, v2");
  CHECK(rows[15][1] == "4");
  // Worked by hand: the sample's values as they were typed in.
  CHECK(text.find("\nfixed_order,1,910,72,131,0.126,0.91,2610.25\n") != std::string::npos);
  CHECK(text.find("\n\"cautious, v2\",4,909,79,139,0.133,0.91,2690.5\n") != std::string::npos);
}

TEST_CASE("replications.csv values read back bit for bit", "[reports]") {
  larder::RunResult r = larder::test::sample_run();
  at(r.values[2][3], larder::Metric::profit) = 1.0 / 3.0;
  at(r.values[0][0], larder::Metric::waste_share) = 0.1 + 0.2;
  const auto rows = parse_csv(larder::replications_csv(r));
  for (size_t i = 1; i < rows.size(); ++i) {
    const size_t policy = (i - 1) / 5;
    const size_t rep = (i - 1) % 5;
    CHECK(rows[i][1] == std::to_string(rep));
    for (size_t k = 0; k < r.metrics.size(); ++k) {
      INFO(rows[i][0] << " " << rep << " " << larder::metric_name(r.metrics[k]));
      CHECK(parse_double(rows[i][2 + k]) == at(r.values[policy][rep], r.metrics[k]));
    }
  }
}
