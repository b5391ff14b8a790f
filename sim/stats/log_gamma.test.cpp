// log_gamma against textbook values: Γ(n + 1) = n! and Γ(1/2) = √π (common practice).

#include "sim/stats/log_gamma.hpp"

#include <catch2/catch.hpp>
#include <cmath>
#include <numbers>

namespace larder {
namespace {

TEST_CASE("log_gamma: log of factorials and of Γ(1/2) = √π", "[stats]") {
  double factorial = 1.0;
  for (int n = 1; n <= 20; ++n) {
    factorial *= n;
    CHECK(log_gamma(n + 1.0) == Approx(std::log(factorial)).epsilon(1e-14));
  }
  CHECK(log_gamma(1.0) == 0.0);
  CHECK(log_gamma(0.5) == Approx(0.5 * std::log(std::numbers::pi)).epsilon(1e-14));
}

}  // namespace
}  // namespace larder
