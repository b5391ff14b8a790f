#include "sim/scenario/generated_stores.hpp"

#include <catch2/catch.hpp>
#include <cmath>
#include <numeric>

#include "sim/random/stream.hpp"
#include "sim/stats/normal.hpp"

namespace {

double mean(const std::vector<double>& v) {
  return std::accumulate(v.begin(), v.end(), 0.0) / static_cast<double>(v.size());
}

double sd(const std::vector<double>& v) {
  const double m = mean(v);
  double ss = 0;
  for (double x : v) ss += (x - m) * (x - m);
  return std::sqrt(ss / static_cast<double>(v.size() - 1));
}

}  // namespace

TEST_CASE("generated store ids: s001, s002, ... padded to the width of the count", "[scenario]") {
  // scenario.md: "generated: { count: 40, ... } with ids s001..."
  CHECK(larder::generated_store_id(0, 40) == "s001");
  CHECK(larder::generated_store_id(39, 40) == "s040");
  CHECK(larder::generated_store_id(998, 999) == "s999");
  // Wider counts keep ids sorting in store order (our choice: pad to the width of the count).
  CHECK(larder::generated_store_id(0, 1000) == "s0001");
  CHECK(larder::generated_store_id(999, 1000) == "s1000");
}

TEST_CASE("generated store sizes: lognormal with mean 1 and the given cv", "[scenario]") {
  SECTION("cv 0 gives size 1 everywhere") {
    CHECK(larder::generated_store_sizes(5, 4, 0.0) == std::vector<double>(4, 1.0));
  }
  SECTION("the same seed gives the same network, another seed another one") {
    CHECK(larder::generated_store_sizes(11, 50, 0.3) == larder::generated_store_sizes(11, 50, 0.3));
    CHECK(larder::generated_store_sizes(11, 50, 0.3) != larder::generated_store_sizes(12, 50, 0.3));
  }
  SECTION("store i is drawn by inversion from its generation stream") {
    // Loader contract (lead's brief): u_i = to_unit(first draw of make_stream({seed, 0, i,
    // kNoItem, generation})), size = exp(sigma z - sigma^2 / 2), z = Phi^-1(u), sigma^2 =
    // log(1 + cv^2).
    const auto sizes = larder::generated_store_sizes(20261202, 3, 0.3);
    const double sigma2 = std::log(1 + 0.09);
    for (std::uint32_t i = 0; i < 3; ++i) {
      pcg32 g = larder::make_stream({20261202, 0, i, larder::kNoItem, larder::Purpose::generation});
      const double z = larder::normal_quantile(larder::to_unit(g()));
      CHECK(sizes[i] == Approx(std::exp(std::sqrt(sigma2) * z - sigma2 / 2)).epsilon(1e-14));
    }
  }
  SECTION("moments of many stores") {
    // Lognormal exp(N(mu, s^2)): mean exp(mu + s^2 / 2), CV sqrt(exp(s^2) - 1) (Johnson, Kotz
    // and Balakrishnan, Continuous Univariate Distributions vol. 1, ch. 14). Mean 1 and CV 0.3
    // give mu = -s^2 / 2 and s^2 = log(1.09). With 20000 stores the standard error of the mean
    // is 0.3 / sqrt(20000) = 0.0021 and that of the sd about 0.002: tolerances are ~5 SE.
    const auto sizes = larder::generated_store_sizes(99, 20000, 0.3);
    CHECK(mean(sizes) == Approx(1.0).margin(0.01));
    CHECK(sd(sizes) == Approx(0.3).margin(0.01));
    std::vector<double> logs;
    for (double s : sizes) logs.push_back(std::log(s));
    const double s2 = std::log(1.09);
    CHECK(mean(logs) == Approx(-s2 / 2).margin(0.01));
    CHECK(sd(logs) == Approx(std::sqrt(s2)).margin(0.01));
  }
}
