// binomial_inverse against Boost.Math's binomial CDF: the returned k is the smallest with
// P(X <= k) >= u, on both of its paths (a walk from 0 for small means, a search from the mode
// otherwise). A 1e-12 slack allows for rounding in the two CDF computations at the boundary.

#include "sim/stats/binomial.hpp"

#include <boost/math/distributions/binomial.hpp>
#include <catch2/catch.hpp>

namespace larder {
namespace {

TEST_CASE("binomial_inverse is the smallest k with P(X <= k) >= u", "[stats][binomial]") {
  const int ns[] = {1, 2, 7, 20, 60, 200, 1000, 5000};
  const double ps[] = {0.001, 0.05, 0.3, 0.5, 0.77, 0.999};
  const double us[] = {1e-9, 0.001, 0.1, 0.37, 0.5, 0.9, 0.999, 1 - 1e-9};
  for (const int n : ns) {
    for (const double p : ps) {
      const boost::math::binomial_distribution<double> d(n, p);
      for (const double u : us) {
        const int k = binomial_inverse(u, n, p);
        INFO("n=" << n << " p=" << p << " u=" << u << " k=" << k);
        REQUIRE(k >= 0);
        REQUIRE(k <= n);
        CHECK(cdf(d, k) >= u - 1e-12);
        if (k > 0) CHECK(cdf(d, k - 1) < u + 1e-12);
      }
    }
  }
}

TEST_CASE("binomial_inverse edge cases", "[stats][binomial]") {
  CHECK(binomial_inverse(0.5, 0, 0.3) == 0);
  CHECK(binomial_inverse(0.5, 10, 0.0) == 0);
  CHECK(binomial_inverse(0.5, 10, 1.0) == 10);
}

}  // namespace
}  // namespace larder

namespace larder {
namespace {
TEST_CASE("binomial_pmf: the textbook formula C(n, k) p^k (1 - p)^(n - k), by hand", "[stats]") {
  const auto row = binomial_pmf(5, 0.3);
  REQUIRE(row.size() == 6);
  CHECK(row[2] == Approx(10 * 0.09 * 0.343).epsilon(1e-12));  // 0.3087
  CHECK(row[0] == Approx(0.16807).epsilon(1e-12));            // 0.7^5
  CHECK(binomial_pmf(4, 1.0)[4] == 1.0);
  CHECK(binomial_pmf(4, 0.0)[0] == 1.0);
}
}  // namespace
}  // namespace larder
