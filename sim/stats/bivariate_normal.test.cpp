// The bivariate normal distribution function against SciPy 1.10.1 (Debian's python3-scipy):
// /usr/bin/python3: scipy.stats.multivariate_normal.cdf([h, k], mean=[0, 0],
// cov=[[1, r], [r, 1]], abseps=1e-12, releps=1e-12), printed to 12 decimals.

#include "sim/stats/bivariate_normal.hpp"

#include <catch2/catch.hpp>
#include <cmath>

#include "sim/stats/normal.hpp"

namespace larder {
namespace {

TEST_CASE("bivariate normal cdf matches SciPy", "[fit][stats]") {
  struct Case {
    double h, k, rho, scipy;
  };
  const Case cases[] = {
      {0.3, -0.5, 0.4, 0.243575889201}, {-1.2, -0.7, -0.3, 0.012075100299},
      {1.5, 2.0, 0.8, 0.926948596281},  {-2.5, 1.0, 0.1, 0.005595870750},
      {0.7, 0.7, 0.0, 0.574619104551},  {-0.4, 0.9, -0.85, 0.178103918239},
  };
  for (const Case& c : cases) {
    INFO(c.h << " " << c.k << " " << c.rho);
    // SciPy's integration is asked for 1e-12; Owen's T in Boost is accurate to about 1e-15.
    CHECK(std::abs(bivariate_normal_cdf(c.h, c.k, c.rho) - c.scipy) < 1e-9);
  }
}

TEST_CASE("bivariate normal rectangles: margins and independence", "[fit][stats]") {
  // Infinite bounds give the margins; rho = 0 gives the product (textbook identities).
  CHECK(std::abs(bivariate_normal_cdf(0.4, INFINITY, 0.6) - normal_cdf(0.4)) < 1e-15);
  CHECK(bivariate_normal_cdf(-INFINITY, 1.0, 0.6) == 0.0);
  const double p = bivariate_normal_rectangle(-0.3, 0.8, 0.1, INFINITY, 0.0);
  CHECK(std::abs(p - (normal_cdf(0.8) - normal_cdf(-0.3)) * normal_sf(0.1)) < 1e-12);
  CHECK(std::abs(bivariate_normal_rectangle(-INFINITY, INFINITY, -INFINITY, INFINITY, 0.5) - 1.0) <
        1e-15);
}

}  // namespace
}  // namespace larder
