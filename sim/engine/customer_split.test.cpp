// Conditional binomial splitting against the multinomial distribution's moments: for n
// customers and category probabilities p_k, E[N_k] = n p_k, Var[N_k] = n p_k (1 - p_k) and
// Cov[N_j, N_k] = -n p_j p_k (any probability text, e.g. Feller, vol. 1, ch. VI.9; from memory).
// Tolerances are 4 standard errors of the simulated means.

#include "sim/engine/customer_split.hpp"

#include <array>
#include <catch2/catch.hpp>
#include <cmath>
#include <numeric>

#include "sim/random/stream.hpp"

namespace larder {
namespace {

TEST_CASE("split_count draws a multinomial split that adds up", "[engine][intraday]") {
  constexpr int kN = 40;
  constexpr int kDraws = 40000;
  const std::array<double, 4> shares = {0.1, 0.2, 0.3, 0.4};
  pcg32 g = make_stream({7, 0, 0, 0, Purpose::intraday});
  std::array<double, 4> sum{};
  std::array<double, 4> sum_sq{};
  double sum_cross = 0.0;  // N_0 * N_3
  for (int d = 0; d < kDraws; ++d) {
    std::array<double, 3> u{};
    for (double& x : u) x = to_unit(g());
    std::array<int, 4> out{};
    REQUIRE(split_count(kN, shares, u, out, true) == 0);
    REQUIRE(std::accumulate(out.begin(), out.end(), 0) == kN);  // hourly counts sum to the day
    for (size_t k = 0; k < 4; ++k) {
      sum[k] += out[k];
      sum_sq[k] += static_cast<double>(out[k]) * out[k];
    }
    sum_cross += static_cast<double>(out[0]) * out[3];
  }
  for (size_t k = 0; k < 4; ++k) {
    const double p = shares[k];
    const double var = kN * p * (1.0 - p);
    const double mean = sum[k] / kDraws;
    CHECK(std::abs(mean - kN * p) <= 4.0 * std::sqrt(var / kDraws));
    const double sample_var = sum_sq[k] / kDraws - mean * mean;
    // Var of a squared deviation is about 2 var^2 for a near-normal count.
    CHECK(std::abs(sample_var - var) <= 4.0 * std::sqrt(2.0 * var * var / kDraws));
  }
  const double cov = sum_cross / kDraws - (sum[0] / kDraws) * (sum[3] / kDraws);
  const double exact = -kN * shares[0] * shares[3];
  const double sd0 = std::sqrt(kN * 0.1 * 0.9);
  const double sd3 = std::sqrt(kN * 0.4 * 0.6);
  CHECK(std::abs(cov - exact) <= 4.0 * sd0 * sd3 / std::sqrt(kDraws));
}

TEST_CASE("split_count leaves the remainder of an incomplete split in none", "[engine][intraday]") {
  // Substitutes with shares 0.25 and 0.15: E[none] = n * 0.6.
  constexpr int kN = 30;
  constexpr int kDraws = 40000;
  const std::array<double, 2> shares = {0.25, 0.15};
  pcg32 g = make_stream({8, 0, 0, 0, Purpose::substitution});
  double none = 0.0;
  for (int d = 0; d < kDraws; ++d) {
    const std::array<double, 2> u = {to_unit(g()), to_unit(g())};
    std::array<int, 2> out{};
    const int left = split_count(kN, shares, u, out, false);
    REQUIRE(left + out[0] + out[1] == kN);
    none += left;
  }
  CHECK(std::abs(none / kDraws - kN * 0.6) <= 4.0 * std::sqrt(kN * 0.6 * 0.4 / kDraws));
}

TEST_CASE("split_count with one category or no customers", "[engine][intraday]") {
  const std::array<double, 1> one = {1.0};
  std::array<int, 1> out{};
  CHECK(split_count(17, one, {}, out, true) == 0);
  CHECK(out[0] == 17);
  const std::array<double, 3> three = {0.2, 0.3, 0.5};
  std::array<int, 3> zero{9, 9, 9};
  const std::array<double, 2> u = {0.5, 0.5};
  split_count(0, three, u, zero, true);
  CHECK(zero == std::array<int, 3>{0, 0, 0});
}

}  // namespace
}  // namespace larder
