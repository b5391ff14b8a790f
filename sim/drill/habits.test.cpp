// Habit readings against known parameters (checks.md 7.2, Schweitzer and Cachon 2000) and the
// slope through the origin against statsmodels.

#include "sim/drill/habits.hpp"

#include <boost/math/distributions/poisson.hpp>
#include <catch2/catch.hpp>
#include <cmath>
#include <pcg_random.hpp>
#include <vector>

namespace larder {
namespace {

/// A Poisson count by inversion of a uniform with Boost.Math's quantile (round up).
int poisson_draw(double mean, double u) {
  using namespace boost::math::policies;
  using P = policy<discrete_quantile<integer_round_up>>;
  return static_cast<int>(
      boost::math::quantile(boost::math::poisson_distribution<double, P>(mean), u));
}

double uniform(pcg32& g) {
  return (static_cast<double>(g()) + 0.5) / 4294967296.0;
}

TEST_CASE("slope through the origin matches statsmodels OLS without a constant", "[drill]") {
  // /usr/bin/python3: sm.OLS([2.1, 3.9, 6.2, 7.8], [1, 2, 3, 4]).fit() -> params
  // 1.9899999999999998, bse 0.03282952600598708.
  const std::vector<double> x{1, 2, 3, 4};
  const std::vector<double> y{2.1, 3.9, 6.2, 7.8};
  const SlopeFit f = slope_through_origin(x, y);
  CHECK(f.value == Approx(1.9899999999999998).epsilon(1e-12));
  CHECK(f.std_error == Approx(0.03282952600598708).epsilon(1e-9));
  CHECK(f.n == 4);
  // Too few points or no spread: not a number.
  CHECK(
      std::isnan(slope_through_origin(std::vector<double>{1, 2}, std::vector<double>{1, 2}).value));
  CHECK(std::isnan(
      slope_through_origin(std::vector<double>{0, 0, 0}, std::vector<double>{1, 2, 3}).value));
}

TEST_CASE("a decision series smoothed with weight 0.6 reads about 0.6", "[drill]") {
  // Rule (iii) of checks.md 7.2: Q_t = Q_{t-1} + theta (S_{t-1} - Q_{t-1}), with S the sales
  // (demand cut at the stock) and whole-unit orders; the rounding is the noise of the fit. In
  // the second series the planner also follows a weekly pattern of the mean (+ mu_t - mu_{t-1}).
  for (const bool weekly : {false, true}) {
    for (const double theta : {0.6, 0.2}) {
      pcg32 g(42, 7);
      std::vector<double> q_prev, s_prev, q, mu_prev, mu_now;
      double order = 20.0;
      double mean = 20.0;
      for (int t = 0; t < 200; ++t) {
        const double next_mean = weekly ? 20.0 + 6.0 * std::sin(2.0 * 3.14159265 * t / 7.0) : 20.0;
        const int demand = poisson_draw(mean, uniform(g));
        const double sales = std::min<double>(demand, order);
        const double next = std::round(order + theta * (sales - order) + (next_mean - mean));
        q_prev.push_back(order);
        s_prev.push_back(sales);
        q.push_back(next);
        mu_prev.push_back(mean);
        mu_now.push_back(next_mean);
        order = next;
        mean = next_mean;
      }
      const SlopeFit f = chasing_weight(q_prev, s_prev, q, mu_prev, mu_now);
      INFO("weekly " << weekly << ", theta " << theta << " read " << f.value << " +- "
                     << f.std_error);
      REQUIRE(f.std_error < 0.05);  // small enough for the check to fail on a wrong reading
      CHECK(std::abs(f.value - theta) < 4.0 * f.std_error);
    }
  }
}

TEST_CASE("a constant order does not read as chasing, whatever the weekday pattern", "[drill]") {
  std::vector<double> q_prev, s_prev, q, mu_prev, mu_now;
  pcg32 g(8, 1);
  for (int t = 0; t < 100; ++t) {
    const double m0 = 20.0 + 8.0 * (t % 7 == 5);
    const double m1 = 20.0 + 8.0 * ((t + 1) % 7 == 5);
    q_prev.push_back(24);
    s_prev.push_back(std::min(24, poisson_draw(m0, uniform(g))));
    q.push_back(24);
    mu_prev.push_back(m0);
    mu_now.push_back(m1);
  }
  const SlopeFit f = chasing_weight(q_prev, s_prev, q, mu_prev, mu_now);
  CHECK(f.value == 0.0);
  CHECK(f.std_error == 0.0);
}

TEST_CASE("orders set at w of the way from Q* to the mean read about w", "[drill]") {
  // Rule (i) of checks.md 7.2: Q = (1 - w) Q* + w mu. Q* is the Poisson newsvendor quantity
  // (Boost.Math quantile at the critical fractile 0.8); orders are whole units with a planner's
  // jitter of -1, 0 or +1.
  for (const double w : {0.3, 0.7}) {
    pcg32 g(5, 11);
    std::vector<double> mu, q_star, q;
    for (int t = 0; t < 140; ++t) {
      const double m = 8.0 + 30.0 * uniform(g);  // means of every size: rounding averages out
      const double star = poisson_draw(m, 0.8);
      const double jitter = static_cast<double>(g(3)) - 1.0;
      mu.push_back(m);
      q_star.push_back(star);
      q.push_back(std::round((1.0 - w) * star + w * m) + jitter);
    }
    const SlopeFit f = pull_to_center_weight(mu, q_star, q);
    INFO("w " << w << " read " << f.value << " +- " << f.std_error);
    REQUIRE(f.std_error < 0.1);
    CHECK(std::abs(f.value - w) < 4.0 * f.std_error);
  }
}

}  // namespace
}  // namespace larder
