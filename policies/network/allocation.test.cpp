// The optimisation core of `network_in_stock` (policies.md, "Quantity rules" and "Network
// service-level targets and grouping"): level curves against Poisson(2) probabilities worked by
// hand and Boost.Math's Poisson and negative binomial pmf, the normal count's pmf from
// std::erfc, and the in_stock_target rule's own quantile; the Lagrangian allocation against
// brute-force enumeration of every level combination, and Everett's theorem (Everett 1963,
// generalized Lagrange multipliers; from memory) on the multiplier's choice.

#include "policies/network/allocation.hpp"

#include <algorithm>
#include <boost/math/distributions/negative_binomial.hpp>
#include <boost/math/distributions/poisson.hpp>
#include <catch2/catch.hpp>
#include <cmath>
#include <cstdint>
#include <limits>
#include <random>
#include <utility>
#include <vector>

#include "policies/forecast.hpp"
#include "policies/network/level_curve.hpp"
#include "policies/quantity/fractile_rule.hpp"
#include "sim/stats/count_law.hpp"

namespace larder {
namespace {

/// Expectations of a count with pmf `pmf` (k = 0 .. n - 1) at quantity q, by direct summation.
struct DirectValues {
  double sales = 0, leftover = 0, shortage = 0;
};
DirectValues direct_values(const std::vector<double>& pmf, int q) {
  DirectValues v;
  for (std::size_t k = 0; k < pmf.size(); ++k) {
    const int d = static_cast<int>(k);
    v.sales += pmf[k] * std::min(d, q);
    v.leftover += pmf[k] * std::max(q - d, 0);
    v.shortage += pmf[k] * std::max(d - q, 0);
  }
  return v;
}

/// The newsvendor profit of checks.md 1.1 from direct expectations.
double direct_profit(const Economics& e, const DirectValues& v, int q) {
  return e.price * v.sales + e.recovery * v.leftover - e.unit_cost * q - e.penalty * v.shortage;
}

std::vector<double> boost_poisson_pmf(double mean, int n) {
  const boost::math::poisson_distribution<double> d(mean);
  std::vector<double> out;
  for (int k = 0; k < n; ++k) out.push_back(boost::math::pdf(d, k));
  return out;
}

/// Negative binomial with this mean and variance in Boost's (r, p) form: r = mean^2 / (variance
/// - mean), success probability p = r / (r + mean).
std::vector<double> boost_nb_pmf(double mean, double variance, int n) {
  const double r = mean * mean / (variance - mean);
  const boost::math::negative_binomial_distribution<double> d(r, r / (r + mean));
  std::vector<double> out;
  for (int k = 0; k < n; ++k) out.push_back(boost::math::pdf(d, k));
  return out;
}

/// The normal count max(0, round(X)) of policies.md: P(D <= x) = Phi((x + 0.5 - mean) / sd),
/// with Phi from std::erfc (not larder's normal_cdf).
std::vector<double> erfc_normal_count_pmf(double mean, double sd, int n) {
  const auto phi = [&](double x) {
    return 0.5 * std::erfc(-(x + 0.5 - mean) / sd / std::sqrt(2.0));
  };
  std::vector<double> out;
  for (int k = 0; k < n; ++k) out.push_back(k == 0 ? phi(0) : phi(k) - phi(k - 1));
  return out;
}

std::vector<LevelPoint> curve(const CountLaw& law, const Economics& e,
                              const std::vector<double>& levels) {
  std::vector<LevelPoint> out(levels.size());
  level_curve(law, e, levels, out);
  return out;
}

/// The coarse grid of the brute-force checks: 0.05, 0.10, ..., 0.95.
std::vector<double> coarse_levels() {
  std::vector<double> out;
  for (int i = 1; i <= 19; ++i) out.push_back(i / 20.0);
  return out;
}

/// Uniform in [0, 1) from the raw 64-bit output of mt19937_64 (fixed by the standard, unlike
/// std:: distributions).
struct Uniform {
  std::mt19937_64 gen;
  explicit Uniform(std::uint64_t seed) : gen(seed) {}
  double operator()() { return static_cast<double>(gen() >> 11) * 0x1p-53; }
  double in(double lo, double hi) { return lo + (hi - lo) * (*this)(); }
};

/// A random store-item-day: a Poisson or negative binomial law and economics.
struct ItemDay {
  CountLaw law;
  Economics economics;
};
ItemDay random_item_day(Uniform& u) {
  ItemDay d;
  const double mean = u.in(0.3, 12.0);
  if (u() < 0.5) {
    d.law = CountLaw::from_moments(DemandFamily::poisson, mean, mean);
  } else {
    const double k = u.in(0.5, 5.0);
    d.law = CountLaw::from_moments(DemandFamily::negative_binomial, mean, mean + mean * mean / k);
  }
  d.economics.price = u.in(1.0, 5.0);
  d.economics.unit_cost = d.economics.price * u.in(0.2, 0.8);
  d.economics.recovery = d.economics.unit_cost * u.in(0.0, 0.5);
  d.economics.penalty = u.in(0.0, 1.0);
  return d;
}

/// A group's curve: its store-item-days' level curves summed, as network_plan does.
GroupCurve group_curve(const std::vector<ItemDay>& days, const std::vector<double>& levels) {
  GroupCurve c;
  c.in_stock.assign(levels.size(), 0.0);
  c.profit.assign(levels.size(), 0.0);
  for (const ItemDay& d : days) {
    const auto pts = curve(d.law, d.economics, levels);
    for (std::size_t l = 0; l < levels.size(); ++l) {
      c.in_stock[l] += pts[l].in_stock;
      c.profit[l] += pts[l].profit;
    }
    c.days += 1.0;
  }
  return c;
}

struct Brute {
  bool any = false;
  double profit = -std::numeric_limits<double>::infinity();
};

/// Every combination of levels; feasible when the in-stock sum (in group order, as allocate
/// sums) reaches `required`.
Brute brute_force(const std::vector<GroupCurve>& groups, double required) {
  const std::size_t n = groups.front().in_stock.size();
  std::vector<std::size_t> l(groups.size(), 0);
  Brute best;
  for (;;) {
    double in = 0.0;
    double pr = 0.0;
    for (std::size_t g = 0; g < groups.size(); ++g) {
      in += groups[g].in_stock[l[g]];
      pr += groups[g].profit[l[g]];
    }
    if (in >= required && pr > best.profit) {
      best.any = true;
      best.profit = pr;
    }
    std::size_t g = 0;
    while (g < groups.size() && ++l[g] == n) l[g++] = 0;
    if (g == groups.size()) return best;
  }
}

double total_days(const std::vector<GroupCurve>& groups) {
  double d = 0.0;
  for (const GroupCurve& c : groups) d += c.days;
  return d;
}

TEST_CASE("level_curve: Poisson(2) quantities and in-stock probabilities by hand", "[allocation]") {
  // By hand, P(D <= k) = exp(-2) sum_{j <= k} 2^j / j!: 0.1353352832, 0.4060058497,
  // 0.6766764162, 0.8571234605, 0.9473469827, 0.9834363915, 0.9954661945 for k = 0 .. 6.
  // Q(L) = 1 + the smallest k with P(D <= k) >= L.
  const CountLaw law = CountLaw::from_moments(DemandFamily::poisson, 2.0, 2.0);
  const Economics e{3.0, 1.0, 0.2, 0.5};
  const std::vector<double> levels = {0.1, 0.4, 0.41, 0.5, 0.9, 0.95, 0.99};
  const std::vector<int> q = {1, 2, 3, 3, 5, 6, 7};
  const std::vector<double> in_stock = {0.1353352832, 0.4060058497, 0.6766764162, 0.6766764162,
                                        0.9473469827, 0.9834363915, 0.9954661945};
  const auto pts = curve(law, e, levels);
  const boost::math::poisson_distribution<double> boost_law(2.0);
  for (std::size_t i = 0; i < levels.size(); ++i) {
    CAPTURE(levels[i]);
    CHECK(pts[i].quantity == q[i]);
    CHECK(pts[i].in_stock == Approx(in_stock[i]).epsilon(1e-9));
    // Boost.Math's Poisson cdf at Q - 1.
    CHECK(pts[i].in_stock == Approx(boost::math::cdf(boost_law, q[i] - 1)).epsilon(1e-13));
  }
  // Profit at Q = 3 by hand: E[min(D, 3)] = 3 - (F(0) + F(1) + F(2)) = 1.7819824509, leftover
  // 1.2180175491, shortage 2 - 1.7819824509; 3 x 1.78198 + 0.2 x 1.21802 - 3 - 0.5 x 0.21802
  // = 2.4805420879 (worked in Python with math.exp and math.factorial).
  CHECK(pts[3].profit == Approx(2.4805420879).epsilon(1e-9));
  CHECK(pts[3].leftover == Approx(1.2180175491).epsilon(1e-9));
  // Q = 7 loses money: -0.0045889083 by the same hand computation.
  CHECK(pts[6].profit == Approx(-0.0045889083).epsilon(1e-6));
}

TEST_CASE("level_curve: profit and leftover against direct summation over Boost pmfs",
          "[allocation]") {
  const Economics e{2.5, 1.1, 0.3, 0.4};
  const std::vector<double> levels = default_levels();
  SECTION("Poisson, Boost.Math pmf") {
    for (double mean : {0.4, 2.0, 7.5, 31.0}) {
      CAPTURE(mean);
      const auto pts = curve(CountLaw::from_moments(DemandFamily::poisson, mean, mean), e, levels);
      const auto pmf = boost_poisson_pmf(mean, 400);
      for (const LevelPoint& p : pts) {
        const DirectValues v = direct_values(pmf, p.quantity);
        CHECK(p.leftover == Approx(v.leftover).margin(1e-12).epsilon(1e-12));
        CHECK(p.profit == Approx(direct_profit(e, v, p.quantity)).margin(1e-12).epsilon(1e-12));
        double f = 0.0;  // P(D <= Q - 1) summed from the pmf
        for (int k = 0; k < p.quantity; ++k) f += pmf[static_cast<std::size_t>(k)];
        CHECK(p.in_stock == Approx(f).epsilon(1e-12));
      }
    }
  }
  SECTION("negative binomial, Boost.Math pmf") {
    for (auto [mean, variance] : {std::pair{3.0, 7.5}, {0.8, 2.0}, {12.0, 40.0}, {40.0, 400.0}}) {
      CAPTURE(mean, variance);
      const auto pts =
          curve(CountLaw::from_moments(DemandFamily::negative_binomial, mean, variance), e, levels);
      const auto pmf = boost_nb_pmf(mean, variance, 2000);
      for (const LevelPoint& p : pts) {
        const DirectValues v = direct_values(pmf, p.quantity);
        CHECK(p.leftover == Approx(v.leftover).margin(1e-11).epsilon(1e-11));
        CHECK(p.profit == Approx(direct_profit(e, v, p.quantity)).margin(1e-11).epsilon(1e-11));
      }
    }
  }
  SECTION("normal count, pmf from std::erfc") {
    for (auto [mean, sd] : {std::pair{5.0, 2.0}, {1.0, 1.5}, {60.0, 9.0}}) {
      CAPTURE(mean, sd);
      const auto pts =
          curve(CountLaw::from_moments(DemandFamily::normal, mean, sd * sd), e, levels);
      const auto pmf = erfc_normal_count_pmf(mean, sd, 400);
      for (const LevelPoint& p : pts) {
        const DirectValues v = direct_values(pmf, p.quantity);
        CHECK(p.leftover == Approx(v.leftover).margin(1e-10).epsilon(1e-10));
        CHECK(p.profit == Approx(direct_profit(e, v, p.quantity)).margin(1e-10).epsilon(1e-10));
      }
    }
  }
}

TEST_CASE("level_curve orders exactly what in_stock_target orders", "[allocation]") {
  // in_stock_target orders forecast_quantile(f, family, L) + 1 (fractile_rule.hpp, extra 1).
  const Economics e{2.0, 1.0, 0.0, 0.0};
  Uniform u(20240611);
  std::vector<double> levels = default_levels();
  std::vector<double> odd;  // ragged levels, some very close to each other and to 0 and 1
  for (double x :
       {1e-9, 0.0137, 0.0137, 0.3333333333333333, 0.5, 0.5000000000000001, 0.77, 0.999, 0.9999999})
    odd.push_back(x);
  const auto check = [&](DemandFamily family, double mean, double variance) {
    const CountLaw law = CountLaw::from_moments(family, mean, variance);
    const DemandForecast f{mean, variance};
    for (const auto* grid : {&levels, &odd}) {
      const auto pts = curve(law, e, *grid);
      for (std::size_t i = 0; i < grid->size(); ++i) {
        const double level = (*grid)[i];
        const int rule = forecast_quantile(f, family, level) + 1;
        if (pts[i].quantity != rule) {
          FAIL_CHECK("family " << to_string(family) << " mean " << mean << " variance " << variance
                               << " level " << level << ": " << pts[i].quantity << " vs " << rule);
        }
        // One level on its own gives the same point as the grid.
        const auto one = curve(law, e, std::vector<double>{level});
        CHECK(one[0].quantity == pts[i].quantity);
        CHECK(one[0].profit == Approx(pts[i].profit).epsilon(1e-12).margin(1e-12));
        if (family != DemandFamily::normal) {  // the walk's cdf is CountLaw's, to the bit
          CHECK(pts[i].in_stock == law.cdf(pts[i].quantity - 1));
          CHECK(pts[i].in_stock >= level);
        }
      }
    }
  };
  for (double mean : {0.0, 0.02, 0.3, 1.0, 2.0, 7.5, 40.0, 400.0, 5000.0}) {
    check(DemandFamily::poisson, mean, mean);
    check(DemandFamily::negative_binomial, mean, mean + mean * mean / 0.7);
    check(DemandFamily::negative_binomial, mean, mean * 1.05 + 1e-9);
    check(DemandFamily::normal, mean, mean);
    check(DemandFamily::normal, mean, 0.0);          // sd 0: a step cdf
    check(DemandFamily::normal, mean, 1e-6);         // sd 0.001: cdf ties are close
    check(DemandFamily::normal, mean, mean * mean);  // cv 1: mass below 0
  }
  check(DemandFamily::normal, 0.0, 4.0);  // mean 0: the law is 0, the rule still orders
  // The normal rule's formula at the exact half-integers where the walk and the formula meet.
  for (int k = 0; k < 40; ++k) check(DemandFamily::normal, k + 0.5, 1e-4);
  for (int n = 0; n < 400; ++n) {
    const double mean = std::exp(u.in(std::log(0.01), std::log(2000.0)));
    check(DemandFamily::poisson, mean, mean);
    check(DemandFamily::negative_binomial, mean, mean * (1.0 + u.in(0.0, 3.0)) + mean * mean * u());
    const double sd = mean * std::exp(u.in(std::log(1e-5), std::log(2.0)));
    check(DemandFamily::normal, mean, sd * sd);
  }
}

TEST_CASE("level_curve: a law with mean 0 orders one unit, always in stock", "[allocation]") {
  // P(D <= -1) = 0 < L and P(D <= 0) = 1: Q = 1 for every level, the unit is left over.
  const Economics e{3.0, 1.0, 0.25, 0.5};
  for (DemandFamily f : {DemandFamily::poisson, DemandFamily::negative_binomial}) {
    for (const LevelPoint& p : curve(CountLaw::from_moments(f, 0.0, 0.0), e, default_levels())) {
      CHECK(p.quantity == 1);
      CHECK(p.in_stock == 1.0);
      CHECK(p.leftover == 1.0);
      CHECK(p.profit == Approx(0.25 - 1.0));
    }
  }
}

TEST_CASE("level_curve rejects bad levels and sizes", "[allocation]") {
  const CountLaw law = CountLaw::from_moments(DemandFamily::poisson, 2.0, 2.0);
  std::vector<LevelPoint> out(2);
  CHECK_THROWS(level_curve(law, {}, std::vector<double>{0.5, 0.4}, out));
  CHECK_THROWS(level_curve(law, {}, std::vector<double>{0.0, 0.4}, out));
  CHECK_THROWS(level_curve(law, {}, std::vector<double>{0.5, 1.0}, out));
  CHECK_THROWS(level_curve(law, {}, std::vector<double>{0.5}, out));
  CHECK(default_levels().size() == 99);
  CHECK(default_levels().front() == 0.01);
  CHECK(default_levels()[49] == 0.5);
  CHECK(default_levels().back() == 0.99);
}

/// Each group's own choice for `lambda` by scanning every level (ties: the lower level), summed.
double lagrangian_in_stock(const std::vector<GroupCurve>& groups, double lambda) {
  double in = 0.0;
  for (const GroupCurve& c : groups) {
    std::size_t best = 0;
    for (std::size_t k = 1; k < c.profit.size(); ++k) {
      if (c.profit[k] + lambda * c.in_stock[k] > c.profit[best] + lambda * c.in_stock[best]) {
        best = k;
      }
    }
    in += c.in_stock[best];
  }
  return in;
}

/// The multiplier is the smallest that meets the target: a hair below it the groups' own
/// choices miss the target, a hair above they meet it.
void check_smallest_lambda(const std::vector<GroupCurve>& groups, const Allocation& a) {
  CHECK(lagrangian_in_stock(groups, a.lambda * (1.0 - 1e-9)) < a.required);
  CHECK(lagrangian_in_stock(groups, a.lambda * (1.0 + 1e-9)) >= a.required);
}

/// Checks one allocation against brute force; returns the brute-force best profit minus the
/// allocation's (0 when it is exactly optimal).
double check_against_brute_force(const std::vector<GroupCurve>& groups, double target) {
  const Allocation a = allocate(groups, target);
  const double required = target * total_days(groups);
  const Brute best = brute_force(groups, required);
  REQUIRE(best.any);
  REQUIRE(a.feasible);
  CHECK(a.required == required);
  // The reported sums are those of the reported levels.
  double in = 0.0;
  double pr = 0.0;
  for (std::size_t g = 0; g < groups.size(); ++g) {
    in += groups[g].in_stock[static_cast<std::size_t>(a.level[g])];
    pr += groups[g].profit[static_cast<std::size_t>(a.level[g])];
  }
  CHECK(a.in_stock == in);
  CHECK(a.profit == pr);
  CHECK(a.in_stock >= required);
  CHECK(a.profit <= best.profit + 1e-9);
  CHECK(best.profit - a.profit <= a.gap_bound + 1e-9);
  CHECK(a.gap_bound >= 0.0);
  CHECK(a.lambda >= 0.0);
  // Each group maximises profit + lambda * in_stock (the Lagrangian subproblem).
  for (std::size_t g = 0; g < groups.size(); ++g) {
    const auto l = static_cast<std::size_t>(a.level[g]);
    const double chosen = groups[g].profit[l] + a.lambda * groups[g].in_stock[l];
    for (std::size_t k = 0; k < groups[g].profit.size(); ++k) {
      CHECK(groups[g].profit[k] + a.lambda * groups[g].in_stock[k] <=
            chosen + 1e-9 * (1.0 + std::fabs(chosen)));
    }
  }
  // Everett: the choice is optimal when the right-hand side is its own in-stock sum.
  const Brute own = brute_force(groups, a.in_stock);
  CHECK(own.profit <= a.profit + 1e-9);
  if (a.lambda > 0.0) check_smallest_lambda(groups, a);
  return std::max(0.0, best.profit - a.profit);
}

/// One brute-force instance: groups of 1 to 3 random item-days on the coarse grid, a target.
struct Instance {
  std::vector<GroupCurve> groups;
  double target;
};

/// 12 instances each of 3 and 4 groups, at six targets (fixed seed).
std::vector<Instance> brute_force_instances() {
  const std::vector<double> levels = coarse_levels();
  Uniform u(7);
  std::vector<Instance> out;
  for (std::size_t n_groups : {3u, 4u}) {
    for (int instance = 0; instance < 12; ++instance) {
      std::vector<GroupCurve> groups;
      for (std::size_t g = 0; g < n_groups; ++g) {
        std::vector<ItemDay> days;
        const int n_days = 1 + static_cast<int>(u() * 3.0);
        for (int d = 0; d < n_days; ++d) days.push_back(random_item_day(u));
        groups.push_back(group_curve(days, levels));
      }
      for (double target : {0.5, 0.7, 0.8, 0.85, 0.9, 0.93}) out.push_back({groups, target});
    }
  }
  return out;
}

TEST_CASE("allocate matches brute force on 3 and 4 groups", "[allocation]") {
  int cases = 0;
  int exact = 0;
  int constrained = 0;
  for (const Instance& in : brute_force_instances()) {
    CAPTURE(in.groups.size(), in.target);
    ++cases;
    if (allocate(in.groups, in.target).lambda > 0.0) ++constrained;
    const double gap = check_against_brute_force(in.groups, in.target);
    if (gap <= 1e-9) ++exact;
  }
  INFO("exactly optimal in " << exact << " of " << cases << " cases (" << constrained
                             << " with lambda > 0)");
  CHECK(constrained >= cases / 2);  // the tests must mostly exercise the bisection
  // With 3 or 4 small groups the target usually binds between two Lagrangian choices, and the
  // exact optimum is a combination no multiplier reaches (observed: 75 of 144 exactly optimal,
  // the others within their gap bound). Many groups or smooth curves shrink the gap.
  CHECK(exact >= cases / 3);
  WARN("allocate exactly optimal in " << exact << " of " << cases << " brute-force cases ("
                                      << constrained << " with lambda > 0)");
}

TEST_CASE("improve closes most of the Lagrangian gap, checked by brute force", "[allocation]") {
  // Same instances as above. improve must stay feasible, never lose profit, never beat the
  // brute-force optimum, and keep its (shrunk) gap bound valid.
  int cases = 0;
  int exact_before = 0;
  int exact_after = 0;
  for (const Instance& inst : brute_force_instances()) {
    const std::vector<GroupCurve>& groups = inst.groups;
    CAPTURE(groups.size(), inst.target);
    ++cases;
    const Allocation a = allocate(groups, inst.target);
    const Allocation b = improve(groups, a);
    const Brute best = brute_force(groups, a.required);
    double in = 0.0;
    double pr = 0.0;
    for (std::size_t g = 0; g < groups.size(); ++g) {
      in += groups[g].in_stock[static_cast<std::size_t>(b.level[g])];
      pr += groups[g].profit[static_cast<std::size_t>(b.level[g])];
    }
    CHECK(std::fabs(b.in_stock - in) <= 1e-9 * (1.0 + in));
    CHECK(std::fabs(b.profit - pr) <= 1e-9 * (1.0 + std::fabs(pr)));
    CHECK(in >= a.required - 1e-9);
    CHECK(b.profit >= a.profit);
    CHECK(b.profit <= best.profit + 1e-9);
    CHECK(best.profit - b.profit <= b.gap_bound + 1e-9);
    if (best.profit - a.profit <= 1e-9) ++exact_before;
    if (best.profit - b.profit <= 1e-9) ++exact_after;
  }
  INFO("exactly optimal: " << exact_before << " before, " << exact_after << " after, of " << cases);
  CHECK(exact_after > exact_before);
  WARN("improve: exactly optimal in " << exact_after << " of " << cases
                                      << " brute-force cases (allocate alone: " << exact_before
                                      << ")");
}

TEST_CASE("allocate: a low target is met by the unconstrained optimum", "[allocation]") {
  const std::vector<double> levels = coarse_levels();
  Uniform u(11);
  std::vector<GroupCurve> groups;
  for (int g = 0; g < 4; ++g) groups.push_back(group_curve({random_item_day(u)}, levels));
  const Allocation a = allocate(groups, 0.3);
  CHECK(a.lambda == 0.0);
  CHECK(a.gap_bound == 0.0);
  CHECK(a.feasible);
  for (std::size_t g = 0; g < groups.size(); ++g) {  // the first level of largest profit
    const auto& p = groups[g].profit;
    CHECK(a.level[g] == std::max_element(p.begin(), p.end()) - p.begin());
  }
  check_against_brute_force(groups, 0.3);
  // Equal profits at several levels: the lowest of them.
  GroupCurve flat{{0.2, 0.5, 0.5, 0.9}, {1.0, 1.0, 1.0, 0.5}, 1.0};
  CHECK(allocate(std::vector<GroupCurve>{flat}, 0.1).level == std::vector<int>{0});
  // Any lambda > 0 takes the free in-stock gain at equal profit (level 1, not 2: same point).
  const Allocation b = allocate(std::vector<GroupCurve>{flat}, 0.4);
  CHECK(b.level == std::vector<int>{1});
  CHECK(b.lambda > 0.0);
  CHECK(b.lambda < 1e-300);
  CHECK(b.profit == 1.0);
}

TEST_CASE("allocate: an unreachable target puts every group at its highest level", "[allocation]") {
  const std::vector<double> levels = coarse_levels();
  Uniform u(13);
  std::vector<GroupCurve> groups;
  for (int g = 0; g < 3; ++g) groups.push_back(group_curve({random_item_day(u)}, levels));
  // P(in stock) < 1 for every day: a target of 1 cannot be met.
  const Allocation a = allocate(groups, 1.0);
  CHECK_FALSE(a.feasible);
  CHECK(a.level == std::vector<int>(3, static_cast<int>(levels.size()) - 1));
  CHECK_FALSE(brute_force(groups, a.required).any);
  double in = 0.0;
  for (const GroupCurve& c : groups) in += c.in_stock.back();
  CHECK(a.in_stock == in);
  CHECK(a.in_stock < a.required);
}

TEST_CASE("allocate: one level for all never beats per-item levels", "[allocation]") {
  // Pooling every store-item-day into one group restricts the choice to equal levels, so its
  // best profit is at most that of per-item groups at the same target.
  const std::vector<double> levels = coarse_levels();
  Uniform u(17);
  for (int instance = 0; instance < 8; ++instance) {
    std::vector<GroupCurve> items;
    for (int g = 0; g < 4; ++g) {
      items.push_back(group_curve({random_item_day(u), random_item_day(u)}, levels));
    }
    GroupCurve pooled{std::vector<double>(levels.size(), 0.0),
                      std::vector<double>(levels.size(), 0.0), 0.0};
    for (const GroupCurve& c : items) {
      for (std::size_t l = 0; l < levels.size(); ++l) {
        pooled.in_stock[l] += c.in_stock[l];
        pooled.profit[l] += c.profit[l];
      }
      pooled.days += c.days;
    }
    const std::vector<GroupCurve> all{pooled};
    for (double target : {0.6, 0.75, 0.85, 0.9}) {
      CAPTURE(instance, target);
      const double required = target * total_days(items);
      const Brute per_item = brute_force(items, required);
      const Brute one = brute_force(all, required);
      REQUIRE(one.any);
      CHECK(one.profit <= per_item.profit + 1e-9);
      const Allocation a_items = allocate(items, target);
      const Allocation a_all = allocate(all, target);
      CHECK(a_all.profit <= a_items.profit + a_items.gap_bound + 1e-9);
      CHECK(a_all.profit <= one.profit + 1e-9);
    }
  }
}

TEST_CASE("allocate is deterministic and rejects malformed curves", "[allocation]") {
  const std::vector<double> levels = coarse_levels();
  Uniform u(19);
  std::vector<GroupCurve> groups;
  for (int g = 0; g < 30; ++g) groups.push_back(group_curve({random_item_day(u)}, levels));
  const Allocation a = allocate(groups, 0.87);
  const Allocation b = allocate(groups, 0.87);
  CHECK(a.level == b.level);
  CHECK(a.lambda == b.lambda);
  CHECK(a.profit == b.profit);
  REQUIRE(a.lambda > 0.0);
  check_smallest_lambda(groups, a);
  CHECK(allocate(std::vector<GroupCurve>{}, 0.9).feasible);
  CHECK_THROWS(allocate(std::vector<GroupCurve>{{{0.5}, {1.0, 2.0}, 1.0}}, 0.5));
  CHECK_THROWS(allocate(std::vector<GroupCurve>{{{}, {}, 1.0}}, 0.5));
  CHECK_THROWS(
      allocate(std::vector<GroupCurve>{{{0.5, 0.6}, {1.0, 2.0}, 1.0}, {{0.5}, {1.0}, 1.0}}, 0.5));
  CHECK_THROWS(allocate(std::vector<GroupCurve>{{{0.5, NAN}, {1.0, 2.0}, 1.0}}, 0.5));
  CHECK_THROWS(allocate(groups, NAN));
}

}  // namespace
}  // namespace larder
