// The exact round trip of doubles through JSON text that shard files rely on. The check is
// bit identity (std::bit_cast), not closeness: 17 significant digits identify every double
// (IEEE 754-2008, clause 5.12.2), and nlohmann::json 3.11 prints the shortest such decimal
// (Grisu2) and reads numbers back with strtod.

#include "reports/exact_json_number.hpp"

#include <bit>
#include <catch2/catch.hpp>
#include <cmath>
#include <cstdint>
#include <limits>
#include <random>

namespace {

/// `v` through exact_json_number, compact JSON text, parsing and exact_json_number_value.
double round_trip(double v) {
  const nlohmann::json array = nlohmann::json::array({larder::exact_json_number(v)});
  return larder::exact_json_number_value(nlohmann::json::parse(array.dump()).at(0));
}

bool same_bits(double a, double b) {
  return std::bit_cast<std::uint64_t>(a) == std::bit_cast<std::uint64_t>(b);
}

}  // namespace

TEST_CASE("exact_json_number reads back bit for bit: edge values", "[shard]") {
  using L = std::numeric_limits<double>;
  volatile double zero = 0.0;
  const double default_nan = zero / zero;  // the hardware's NaN, sign bit set on x86-64
  for (double v : {0.0,
                   -0.0,
                   1.0,
                   -1.0,
                   0.1,
                   0.1 + 0.2,
                   1.0 / 3.0,
                   250.0,
                   1e300,
                   -2.5e17,
                   L::min(),
                   L::denorm_min(),
                   -L::denorm_min(),
                   L::max(),
                   L::lowest(),
                   L::epsilon(),
                   9007199254740993.0,
                   L::infinity(),
                   -L::infinity(),
                   L::quiet_NaN(),
                   -L::quiet_NaN(),
                   default_nan}) {
    INFO(v);
    CHECK(same_bits(round_trip(v), v));
  }
}

TEST_CASE("exact_json_number reads back bit for bit: a million random bit patterns", "[shard]") {
  std::mt19937_64 bits(20240607);
  int mismatches = 0;
  for (int i = 0; i < 1000000; ++i) {
    const double v = std::bit_cast<double>(bits());
    if (!same_bits(round_trip(v), v)) ++mismatches;
  }
  CHECK(mismatches == 0);
}

TEST_CASE("exact_json_number writes numbers as JSON numbers and the rest as marked strings",
          "[shard]") {
  CHECK(larder::exact_json_number(0.5).is_number_float());
  CHECK(larder::exact_json_number(std::numeric_limits<double>::infinity()) == "inf");
  CHECK(larder::exact_json_number(-std::numeric_limits<double>::infinity()) == "-inf");
  CHECK(larder::exact_json_number(std::numeric_limits<double>::quiet_NaN()) ==
        "nan:7ff8000000000000");
  CHECK(larder::exact_json_number_value(nlohmann::json(3)) == 3.0);
  CHECK_THROWS_WITH(larder::exact_json_number_value(nlohmann::json("nan:3ff0000000000000")),
                    Catch::Contains("not the bit pattern of a NaN"));
  CHECK_THROWS_WITH(larder::exact_json_number_value(nlohmann::json("many")),
                    Catch::Contains("expected a number"));
  CHECK_THROWS(larder::exact_json_number_value(nlohmann::json(nullptr)));
}
