// Tests of the standard normal functions against checks.md 1.2 (values tagged [C]: SciPy 1.10.1
// and Boost 1.74, cross-checked) and against Boost.Math's normal_distribution as a reference.

#include "sim/stats/normal.hpp"

#include <boost/math/distributions/normal.hpp>
#include <catch2/catch.hpp>
#include <cmath>
#include <limits>
#include <vector>

namespace {

using larder::normal_cdf;
using larder::normal_loss;
using larder::normal_pdf;
using larder::normal_quantile;
using larder::normal_sf;

/// |a - b| <= rel * |b| (or <= rel when b == 0).
bool close_rel(double a, double b, double rel) {
  return std::fabs(a - b) <= rel * std::max(std::fabs(b), std::numeric_limits<double>::min());
}

struct TableRow {
  double z, pdf, cdf, loss;
};

// checks.md 1.2, "Exact values [C]" (scipy.stats.norm, Boost normal, scipy.integrate.quad agree to
// 10 decimals), so the tolerance is 1e-10 absolute (half a unit of the last printed digit).
const std::vector<TableRow> kTable12 = {
    {-2.0, 0.0539909665, 0.0227501319, 2.0084907026},
    {-1.5, 0.1295175957, 0.0668072013, 1.5293067938},
    {-1.0, 0.2419707245, 0.1586552539, 1.0833154706},
    {-0.5, 0.3520653268, 0.3085375387, 0.6977965574},
    {0.0, 0.3989422804, 0.5000000000, 0.3989422804},
    {0.5, 0.3520653268, 0.6914624613, 0.1977965574},
    {1.0, 0.2419707245, 0.8413447461, 0.0833154706},
    {1.5, 0.1295175957, 0.9331927987, 0.0293067938},
    {2.0, 0.0539909665, 0.9772498681, 0.0084907026},
    {2.5, 0.0175283005, 0.9937903347, 0.0020041372},
    {3.0, 0.0044318484, 0.9986501020, 0.0003821543},
};

}  // namespace

TEST_CASE("normal pdf, cdf and loss match the table of checks.md 1.2", "[stats]") {
  for (const TableRow& row : kTable12) {
    CAPTURE(row.z);
    CHECK(normal_pdf(row.z) == Approx(row.pdf).margin(1e-10).epsilon(0));
    CHECK(normal_cdf(row.z) == Approx(row.cdf).margin(1e-10).epsilon(0));
    CHECK(normal_sf(row.z) == Approx(1.0 - row.cdf).margin(1e-10).epsilon(0));
    CHECK(normal_loss(row.z) == Approx(row.loss).margin(1e-10).epsilon(0));
  }
}

TEST_CASE("normal loss matches the 4-digit textbook table", "[stats]") {
  // Unit normal loss tables as printed in inventory textbooks (Nahmias, Production and
  // Operations Analysis, appendix table; Silver-Pyke-Thomas's G_u(k) table): L(0) = .3989,
  // L(1) = .0833, L(2) = .0085. These three 4-digit values are from memory (checks.md 1.2 also
  // says it did not compare them against a scanned table [M]); the 10-digit [C] values above
  // are the binding check.
  CHECK(normal_loss(0.0) == Approx(0.3989).margin(0.5e-4).epsilon(0));
  CHECK(normal_loss(1.0) == Approx(0.0833).margin(0.5e-4).epsilon(0));
  CHECK(normal_loss(2.0) == Approx(0.0085).margin(0.5e-4).epsilon(0));
}

TEST_CASE("normal loss identities of checks.md 1.2", "[stats]") {
  for (double z = -6.0; z <= 6.0; z += 0.125) {
    CAPTURE(z);
    // L(-z) = L(z) + z [checks.md 1.2, C].
    CHECK(normal_loss(-z) == Approx(normal_loss(z) + z).margin(1e-14).epsilon(1e-14));
    // L'(z) = -(1 - Phi(z)) [checks.md 1.2, C], by a central difference (error ~ h^2 phi / 6).
    const double h = 1e-4;
    const double slope = (normal_loss(z + h) - normal_loss(z - h)) / (2.0 * h);
    CHECK(slope == Approx(-normal_sf(z)).margin(1e-8).epsilon(0));
    // L(z) >= max(0, -z), since E[(Z - z)+] >= (E[Z] - z)+.
    CHECK(normal_loss(z) >= std::max(0.0, -z));
  }
  // The optimum of worked example B (checks.md 1.5 [C]): mu = 100, sigma = 30, z* = 0.6045853466
  // gives E[lost] = 5.022561, E[leftover] = 23.160121, E[sales] = 94.977439.
  const double z = normal_quantile(8.0 / 11.0);
  CHECK(z == Approx(0.6045853466).margin(1e-10).epsilon(0));
  CHECK(30.0 * normal_loss(z) == Approx(5.022561).margin(1e-6).epsilon(0));
  CHECK(30.0 * normal_loss(-z) == Approx(23.160121).margin(1e-6).epsilon(0));
  CHECK(100.0 - 30.0 * normal_loss(z) == Approx(94.977439).margin(1e-6).epsilon(0));
}

TEST_CASE("normal upper tail and loss keep precision for large z", "[stats]") {
  // scipy.stats.norm.sf(10) = 7.619853024160527e-24, norm.sf(30) = 4.906713927148187e-198:
  // 1 - Phi(z) would give 0 for both.
  CHECK(close_rel(normal_sf(10.0), 7.619853024160527e-24, 1e-13));
  CHECK(close_rel(normal_sf(30.0), 4.906713927148187e-198, 1e-12));
  // Boost: pdf(normal(), z) - z * cdf(complement(normal(), z)) (checks.md 1.2's Boost form).
  const boost::math::normal_distribution<double> n;
  for (double z : {3.5, 5.0, 7.0}) {
    CAPTURE(z);
    const double ref = boost::math::pdf(n, z) - z * boost::math::cdf(boost::math::complement(n, z));
    CHECK(close_rel(normal_loss(z), ref, 1e-11));
    CHECK(normal_loss(z) > 0.0);
  }
}

TEST_CASE("normal pdf, cdf and sf match Boost", "[stats]") {
  // Reference: boost::math::normal_distribution<double> pdf, cdf and cdf(complement(...)).
  const boost::math::normal_distribution<double> n;
  for (double z = -12.0; z <= 12.0; z += 0.0625) {
    CAPTURE(z);
    CHECK(close_rel(normal_pdf(z), boost::math::pdf(n, z), 1e-14));
    CHECK(close_rel(normal_cdf(z), boost::math::cdf(n, z), 1e-14));
    CHECK(close_rel(normal_sf(z), boost::math::cdf(boost::math::complement(n, z)), 1e-14));
  }
}

TEST_CASE("normal_quantile (AS 241) matches Boost to double precision", "[stats]") {
  // Reference: boost::math::quantile(normal_distribution<double>(), p). Relative tolerance
  // 1e-14; absolute 1e-15 near p = 1/2 where z crosses 0.
  const boost::math::normal_distribution<double> n;
  std::vector<double> grid;
  for (int i = 1; i < 1000; ++i) grid.push_back(i / 1000.0);
  for (double p = 1e-12; p < 0.01; p *= 1.7) {
    grid.push_back(p);
    grid.push_back(1.0 - p);
  }
  grid.insert(grid.end(), {1e-12, 1.0 - 1e-12, 0.075, 0.925, 0.0749, 0.9251, 0.5, 0.425, 0.575,
                           1e-100, 1e-300, std::numeric_limits<double>::denorm_min()});
  for (double p : grid) {
    CAPTURE(p);
    const double ref = boost::math::quantile(n, p);
    const double z = normal_quantile(p);
    CHECK(std::fabs(z - ref) <= 1e-14 * std::fabs(ref) + 1e-15);
  }
}

TEST_CASE("normal_quantile inverts normal_cdf and handles the ends", "[stats]") {
  // Round trip through the tail that keeps its precision: Phi(z) for z <= 0, 1 - Phi(z) above.
  for (double z = -30.0; z <= 30.0; z += 0.25) {
    CAPTURE(z);
    const double back = z <= 0.0 ? normal_quantile(normal_cdf(z)) : -normal_quantile(normal_sf(z));
    CHECK(back == Approx(z).margin(1e-13).epsilon(1e-13));
  }
  CHECK(normal_quantile(0.5) == 0.0);
  CHECK(normal_quantile(0.0) == -std::numeric_limits<double>::infinity());
  CHECK(normal_quantile(1.0) == std::numeric_limits<double>::infinity());
  CHECK(std::isnan(normal_quantile(-0.1)));
  CHECK(std::isnan(normal_quantile(1.1)));
  CHECK(std::isnan(normal_quantile(std::numeric_limits<double>::quiet_NaN())));
  // Symmetry z_{1-p} = -z_p, exact in AS 241 when 1 - p is exact (dyadic p).
  for (double p : {1.0 / 1024, 1.0 / 64, 0.125, 0.25, 0.4375}) {
    CHECK(normal_quantile(1.0 - p) == -normal_quantile(p));
  }
  // scipy.stats.norm.ppf(0.975) = 1.959963984540054.
  CHECK(close_rel(normal_quantile(0.975), 1.959963984540054, 1e-15));
}
