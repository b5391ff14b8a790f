#include "reports/csv.hpp"

#include <catch2/catch.hpp>
#include <cmath>
#include <limits>

#include "reports/sample_run.test.hpp"

TEST_CASE("csv_field quotes only when it must (RFC 4180)", "[reports]") {
  using larder::csv_field;
  // Worked by hand from RFC 4180, section 2, rules 6 and 7.
  CHECK(csv_field("newsvendor") == "newsvendor");
  CHECK(csv_field("") == "");
  CHECK(csv_field("with space") == "with space");
  CHECK(csv_field("cautious, v2") == "\"cautious, v2\"");
  CHECK(csv_field("say \"hi\"") == "\"say \"\"hi\"\"\"");
  CHECK(csv_field("two\nlines") == "\"two\nlines\"");
  CHECK(csv_field("cr\rhere") == "\"cr\rhere\"");
}

TEST_CASE("csv_field reads back through an RFC 4180 parser", "[reports]") {
  const std::string awkward = "a \"quoted\", two-line\nname";
  const auto rows = larder::test::parse_csv(larder::csv_field(awkward) + ",x\n");
  REQUIRE(rows.size() == 1);
  REQUIRE(rows[0].size() == 2);
  CHECK(rows[0][0] == awkward);
  CHECK(rows[0][1] == "x");
}

TEST_CASE("csv_number is short and reads back to the same double", "[reports]") {
  using larder::csv_number;
  // Worked by hand: the shortest decimal that reads back to each double.
  CHECK(csv_number(0.1) == "0.1");
  CHECK(csv_number(250.0) == "250");
  CHECK(csv_number(-2.5) == "-2.5");
  CHECK(csv_number(0.1 + 0.2) == "0.30000000000000004");
  // Not available (e.g. the interval of one replication): an empty field, never "nan".
  CHECK(csv_number(std::numeric_limits<double>::quiet_NaN()).empty());
  CHECK(csv_number(std::numeric_limits<double>::infinity()).empty());
  CHECK(csv_number(-std::numeric_limits<double>::infinity()).empty());

  for (double v : {1.0 / 3.0, 2.0 / 3.0, 123456789.123456789, -2.5e17, 1e-300, 5e-324,
                   std::numeric_limits<double>::max(), 0.0, -0.0, 2569.6}) {
    INFO(v);
    const double back = larder::test::parse_double(csv_number(v));
    CHECK(back == v);
    CHECK(std::signbit(back) == std::signbit(v));
  }
}
