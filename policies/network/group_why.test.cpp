// Why a group got its level (group_why.hpp), against hand computation: the critical ratio is
// the newsvendor critical fractile (p - c + g) / (p - s + g) (any operations research text on
// the newsvendor, e.g. Nahmias, "Production and Operations Analysis", ch. 5; from memory),
// weighted by expected demand; the Poisson cv is 1 / sqrt(mean); what a level achieves comes
// from direct sums over Boost.Math's Poisson pmf; the cost of one more point of in-stock from
// the newsvendor's marginal unit (one more unit earns p P(D > Q) - c and adds P(D = Q) to the
// in-stock probability, from memory); the network's finite difference from brute force.

#include "policies/network/group_why.hpp"

#include <boost/math/distributions/poisson.hpp>
#include <catch2/catch.hpp>
#include <cmath>
#include <vector>

namespace larder {
namespace {

TEST_CASE("GroupMargins: the critical ratio and cv of a group by hand", "[allocation][why]") {
  // One item, p = 4, c = 1.2, nothing recovered, no penalty: (p - c) / p = 2.8 / 4 = 0.7.
  GroupMargins one;
  one.add(10.0, 10.0, {4.0, 1.2, 0.0, 0.0});
  CHECK(one.critical_ratio() == Approx(0.7).epsilon(1e-12));
  // Poisson(10): cv = 1 / sqrt(10).
  CHECK(one.cv() == Approx(1.0 / std::sqrt(10.0)).epsilon(1e-12));
  // A second item, p = 5, c = 3.5, s = 0.5, g = 1, mean 5 (variance 20): its own ratio is
  // (5 - 3.5 + 1) / (5 - 0.5 + 1) = 2.5 / 5.5. Weighted by expected demand:
  // (10 x 2.8 + 5 x 2.5) / (10 x 4 + 5 x 5.5) = 40.5 / 67.5 = 0.6.
  GroupMargins two = one;
  two.add(5.0, 20.0, {5.0, 3.5, 0.5, 1.0});
  CHECK(two.critical_ratio() == Approx(0.6).epsilon(1e-12));
  CHECK(two.cv() == Approx((std::sqrt(10.0) + std::sqrt(20.0)) / 15.0).epsilon(1e-12));
  // Nothing to gain, or no demand: 0.
  GroupMargins none;
  CHECK(none.critical_ratio() == 0.0);
  CHECK(none.cv() == 0.0);
}

/// Sums of f over Poisson(mean) up to where the tail is negligible.
template <class F>
double poisson_sum(double mean, F f) {
  const boost::math::poisson_distribution<double> law(mean);
  double s = 0;
  for (int d = 0; d < 200; ++d) s += boost::math::pdf(law, d) * f(d);
  return s;
}

TEST_CASE("group_why at the chosen level, against direct Poisson sums", "[allocation][why]") {
  // One group of 3 days of Poisson(4) demand, p = 3, c = 1, discarded, in 2 plans.
  const double mean = 4.0, p = 3.0, c = 1.0;
  const Economics e{p, c, 0.0, 0.0};
  const std::vector<double> levels = default_levels();
  std::vector<LevelPoint> points(levels.size());
  level_curve(CountLaw::from_moments(DemandFamily::poisson, mean, mean), e, levels, points);
  GroupCurve day;
  for (const LevelPoint& pt : points) {
    day.in_stock.push_back(pt.in_stock);
    day.profit.push_back(pt.profit);
    day.leftover.push_back(pt.leftover);
  }
  day.days = 1;
  std::vector<GroupCurve> sum;
  for (int k = 0; k < 6; ++k) add_curves(sum, std::vector<GroupCurve>{day});  // 3 days x 2 plans
  REQUIRE(sum[0].days == 6.0);
  GroupMargins m;
  for (int k = 0; k < 6; ++k) m.add(mean, mean, e);

  const double target = 0.85;
  const Allocation a = allocate_summed(sum, target);
  const std::vector<GroupWhy> why = group_why(sum, a, levels, std::vector<GroupMargins>{m}, 2.0);
  REQUIRE(why.size() == 1);
  const GroupWhy& w = why[0];
  // By hand: the smallest Q with P(D <= Q - 1) >= 0.85 for Poisson(4) is Q = 7
  // (P(D <= 5) = 0.7851, P(D <= 6) = 0.8893), and the critical ratio 2/3 is below 0.85, so the
  // plan takes the cheapest level that meets the target.
  const boost::math::poisson_distribution<double> law(mean);
  const int q = 7;
  CHECK(boost::math::cdf(law, q - 2) < target);
  CHECK(boost::math::cdf(law, q - 1) >= target);
  CHECK(w.in_stock == Approx(boost::math::cdf(law, q - 1)).epsilon(1e-9));
  CHECK(w.days == 3.0);
  const double leftover = poisson_sum(mean, [&](int d) { return std::max(q - d, 0); });
  const double profit =
      poisson_sum(mean, [&](int d) { return p * std::min(d, q); }) - c * static_cast<double>(q);
  CHECK(w.leftover == Approx(3.0 * leftover).epsilon(1e-9));
  CHECK(w.profit == Approx(3.0 * profit).epsilon(1e-9));
  CHECK(w.critical_ratio == Approx((p - c) / p).epsilon(1e-12));
  CHECK(w.cv == Approx(1.0 / std::sqrt(mean)).epsilon(1e-12));
  // One more point: the next grid level orders Q + 1, which earns p P(D > Q) - c more and is in
  // stock P(D = Q) more often; per point of in-stock over the group's 3 days of a plan.
  const double marginal = p * (1.0 - boost::math::cdf(law, q)) - c;
  const double gained = boost::math::pdf(law, q);
  CHECK(w.point_cost == Approx(-marginal / gained * 0.01 * 3.0).epsilon(1e-9));
  CHECK(w.point_cost > 0.0);
}

TEST_CASE("network_point_price: the finite difference is the brute-force best at +1 point",
          "[allocation][why]") {
  // Two groups of coarse curves; brute force over every pair of levels at each target.
  const std::vector<GroupCurve> curves = {
      {{0.50, 0.70, 0.85, 0.95}, {10.0, 9.0, 7.0, 3.0}, 1.0, {}},
      {{0.40, 0.75, 0.90, 0.99}, {8.0, 7.5, 6.0, 4.0}, 1.0, {}}};
  const auto best = [&](double target) {
    double b = -1e300;
    for (size_t i = 0; i < 4; ++i) {
      for (size_t j = 0; j < 4; ++j) {
        if (curves[0].in_stock[i] + curves[1].in_stock[j] < target * 2.0 - 1e-12) continue;
        b = std::max(b, curves[0].profit[i] + curves[1].profit[j]);
      }
    }
    return b;
  };
  for (double target : {0.6, 0.72, 0.8, 0.85, 0.9}) {
    CAPTURE(target);
    const Allocation a = allocate_summed(curves, target);
    const PointPrice price = network_point_price(curves, a, target, 1.0);
    // improve() finds the brute-force optimum on these small instances (allocation.test.cpp).
    CHECK(a.profit == Approx(best(target)));
    CHECK(price.finite_difference == Approx(best(target) - best(target + 0.01)));
    CHECK(price.multiplier == Approx(a.lambda * 0.01 * 2.0));
  }
  // Past the top: no finite difference.
  const Allocation top = allocate_summed(curves, 0.97);
  CHECK(std::isnan(network_point_price(curves, top, 0.97, 1.0).finite_difference));
}

}  // namespace
}  // namespace larder
