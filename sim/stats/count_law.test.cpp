// Tests of the daily demand count law and its sampler. References: checks.md 1.4 worked
// example A (values tagged [C]: SciPy 1.10.1 / Boost 1.74), Boost.Math's poisson and
// negative_binomial distributions with the integer_round_up quantile policy (checks.md 1.6,
// pitfall), and SciPy 1.10.1 values pasted with the call that produced them.

#include "sim/stats/count_law.hpp"

#include <boost/math/distributions/negative_binomial.hpp>
#include <boost/math/distributions/poisson.hpp>
#include <catch2/catch.hpp>
#include <cmath>
#include <limits>
#include <stdexcept>
#include <type_traits>
#include <vector>

#include "sim/random/stream.hpp"
#include "sim/stats/normal.hpp"

namespace {

using larder::CountLaw;
using larder::CountSampler;
using larder::DemandFamily;

namespace bm = boost::math;
/// The newsvendor rule "smallest k with F(k) >= p" in Boost (checks.md 1.6: the default policy
/// integer_round_outwards rounds down for p < 0.5).
using RoundUp =
    bm::policies::policy<bm::policies::discrete_quantile<bm::policies::integer_round_up>>;

CountLaw poisson(double mean) {
  return CountLaw::from_moments(DemandFamily::poisson, mean, mean);
}

/// Negative binomial with the given mean and dispersion k (variance = mean + mean^2 / k).
CountLaw neg_binomial(double mean, double k) {
  return CountLaw::make(DemandFamily::negative_binomial, mean, std::nullopt, k);
}

/// Boost's size r and success probability r / (r + mean) for a negative binomial law.
bm::negative_binomial_distribution<double, RoundUp> boost_nb(const CountLaw& law) {
  const double r = law.mean * law.mean / (law.variance - law.mean);
  return {r, r / (r + law.mean)};
}

/// Some uniforms from a fixed pcg32 stream, plus the extremes a 32-bit draw can take.
std::vector<double> test_uniforms(int n) {
  pcg32 g(2024, 7);
  std::vector<double> u;
  for (int i = 0; i < n; ++i) u.push_back(larder::to_unit(g()));
  u.insert(u.end(), {larder::to_unit(0u), larder::to_unit(1u), larder::to_unit(0xfffffffeu),
                     larder::to_unit(0xffffffffu), 1e-300, 1e-17, 0.5, std::nextafter(1.0, 0.0)});
  return u;
}

/// sample(u) == quantile(u) bit for bit, and it is the smallest k with cdf(k) >= u.
void check_inversion(const CountLaw& law, const std::vector<double>& us) {
  const CountSampler sample(law);
  for (double u : us) {
    CAPTURE(law.mean, law.variance, u);
    const int k = sample(u);
    REQUIRE(k == law.quantile(u));
    REQUIRE(k >= 0);
    REQUIRE(k <= sample.cap());
    if (k < sample.cap()) REQUIRE(law.cdf(k) >= u);
    if (k > 0) REQUIRE(law.cdf(k - 1) < u);
  }
}

}  // namespace

TEST_CASE("count law: worked example A, Poisson(20)", "[stats]") {
  const CountLaw law = CountLaw::make(DemandFamily::poisson, 20.0, std::nullopt, std::nullopt);
  CHECK(law.variance == 20.0);
  // checks.md 1.4 [C]: Q* = 22 at CR = 2/3 (scipy.stats.poisson.ppf(2/3, 20) = 22).
  CHECK(law.quantile(2.0 / 3.0) == 22);
  // checks.md 1.4 [C], 10 decimals.
  CHECK(law.cdf(22) == Approx(0.7206113431).margin(1e-10).epsilon(0));
  CHECK(law.cdf(21) == Approx(0.6436976484).margin(1e-10).epsilon(0));
  CHECK(law.pmf(22) == Approx(0.0769136947).margin(1e-10).epsilon(0));
  CHECK(law.expected_sales(22) == Approx(19.0205034195).margin(1e-10).epsilon(0));
  CHECK(law.expected_leftover(22) == Approx(2.9794965805).margin(1e-10).epsilon(0));
  CHECK(law.expected_shortage(22) == Approx(0.9794965805).margin(1e-10).epsilon(0));
  CHECK(law.expected_sales(22) / 20.0 == Approx(0.9510251710).margin(1e-10).epsilon(0));
  // Expected profit with p = 3, c = 1: 3 E[sales] - Q = 35.0615102585 [checks.md 1.4, C].
  CHECK(3.0 * law.expected_sales(22) - 22.0 == Approx(35.0615102585).margin(1e-9).epsilon(0));

  // The table rows of checks.md 1.4 [C], 6 decimals.
  struct Row {
    int q;
    double f, f_below, sales, leftover, lost;
  };
  const Row rows[] = {{20, 0.559093, 0.470257, 18.223294, 1.776706, 1.776706},
                      {21, 0.643698, 0.559093, 18.664201, 2.335799, 1.335799},
                      {23, 0.787493, 0.720611, 19.299892, 3.700108, 0.700108},
                      {24, 0.843227, 0.787493, 19.512399, 4.487601, 0.487601}};
  for (const Row& r : rows) {
    CAPTURE(r.q);
    CHECK(law.cdf(r.q) == Approx(r.f).margin(1e-6).epsilon(0));
    CHECK(law.cdf(r.q - 1) == Approx(r.f_below).margin(1e-6).epsilon(0));
    CHECK(law.expected_sales(r.q) == Approx(r.sales).margin(1e-6).epsilon(0));
    CHECK(law.expected_leftover(r.q) == Approx(r.leftover).margin(1e-6).epsilon(0));
    CHECK(law.expected_shortage(r.q) == Approx(r.lost).margin(1e-6).epsilon(0));
  }

  // Variant A' (checks.md 1.4 [C]): CR = 5/6 gives Q* = 24.
  CHECK(law.quantile(5.0 / 6.0) == 24);
  CHECK(law.cdf(24) == Approx(0.8432273782).margin(1e-10).epsilon(0));
  CHECK(law.cdf(23) == Approx(0.7874928168).margin(1e-10).epsilon(0));
  CHECK(law.expected_sales(24) == Approx(19.5123992596).margin(1e-10).epsilon(0));
  CHECK(law.expected_leftover(24) == Approx(4.4876007404).margin(1e-10).epsilon(0));
  CHECK(law.expected_shortage(24) == Approx(0.4876007404).margin(1e-10).epsilon(0));

  // scipy.stats.poisson.ppf([0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9], 20) = 18, 19, 20, 21, 22, 24, 26.
  const double ps[] = {0.3, 0.4, 0.5, 0.6, 0.7, 0.8, 0.9};
  const int qs[] = {18, 19, 20, 21, 22, 24, 26};
  for (int i = 0; i < 7; ++i) CHECK(law.quantile(ps[i]) == qs[i]);
}

TEST_CASE("count law: the Boost discrete-quantile pitfall of checks.md 1.6", "[stats]") {
  // checks.md 1.6 [V+C]: Boost's default policy gives 18 for Poisson(20) at p = 0.4; the
  // newsvendor answer (and ours) is 19; integer_round_up gives 19.
  CHECK(bm::quantile(bm::poisson_distribution<double>(20.0), 0.4) == 18.0);
  CHECK(bm::quantile(bm::poisson_distribution<double, RoundUp>(20.0), 0.4) == 19.0);
  CHECK(poisson(20.0).quantile(0.4) == 19);
}

TEST_CASE("count law: Poisson pmf, cdf and quantile match Boost", "[stats]") {
  for (double mean : {0.05, 0.7, 1.0, 3.3, 20.0, 151.5, 5000.0}) {
    CAPTURE(mean);
    const CountLaw law = poisson(mean);
    const bm::poisson_distribution<double, RoundUp> ref(mean);
    const int top = static_cast<int>(mean + 15.0 * std::sqrt(mean) + 15.0);
    for (int k = 0; k <= top; ++k) {
      CAPTURE(k);
      const double p = bm::pdf(ref, k);
      if (p > 1e-300) CHECK(std::fabs(law.pmf(k) - p) <= 2e-12 * p);
      const double f = bm::cdf(ref, k);
      CHECK(std::fabs(law.cdf(k) - f) <= 1e-12 * f + 1e-14);
    }
    for (int i = 1; i < 400; ++i) {
      const double u = i / 400.0;
      CAPTURE(u);
      CHECK(law.quantile(u) == static_cast<int>(bm::quantile(ref, u)));
    }
    for (double u : {1e-9, 1e-6, 1.0 - 1e-6, 1.0 - 1e-9}) {
      CAPTURE(u);
      CHECK(law.quantile(u) == static_cast<int>(bm::quantile(ref, u)));
    }
  }
}

TEST_CASE("count law: a large mean (5000) still works", "[stats]") {
  const CountLaw law = poisson(5000.0);
  // scipy.stats.poisson.ppf([0.5, 0.99, 1e-6, 1 - 1e-9], 5000) = 5000, 5165, 4668, 5430.
  CHECK(law.quantile(0.5) == 5000);
  CHECK(law.quantile(0.99) == 5165);
  CHECK(law.quantile(1e-6) == 4668);
  CHECK(law.quantile(1.0 - 1e-9) == 5430);
  // scipy.stats.poisson.cdf(numpy.arange(5050), 5000).sum() = 60.0182366940771 = E[(5050 - D)+].
  CHECK(law.expected_leftover(5050) == Approx(60.0182366940771).epsilon(1e-11));
  CHECK(law.expected_sales(5050) + law.expected_shortage(5050) == Approx(5000.0).epsilon(1e-14));
  check_inversion(law, test_uniforms(2000));
  check_inversion(neg_binomial(5000.0, 20.0), test_uniforms(2000));
}

TEST_CASE("count law: negative binomial against SciPy and Boost", "[stats]") {
  // mean 10, dispersion k = 5: variance = 10 + 100 / 5 = 30, size r = 5, success prob 1/3.
  const CountLaw law = neg_binomial(10.0, 5.0);
  REQUIRE(law.family == DemandFamily::negative_binomial);
  CHECK(law.variance == Approx(30.0).epsilon(1e-15));
  // scipy.stats.nbinom.pmf / cdf (k, 5, 1/3) for k = 0, 5, 10, 30.
  const int ks[] = {0, 5, 10, 30};
  const double pmf[] = {0.004115226337448557, 0.06828227404359088, 0.07143568496192781,
                        0.0009952890867409951};
  const double cdf[] = {0.004115226337448558, 0.21312808006909525, 0.5959352165290355,
                        0.997075855428527};
  for (int i = 0; i < 4; ++i) {
    CAPTURE(ks[i]);
    CHECK(law.pmf(ks[i]) == Approx(pmf[i]).epsilon(1e-13));
    CHECK(law.cdf(ks[i]) == Approx(cdf[i]).epsilon(1e-13));
  }
  // scipy.stats.nbinom.ppf([0.1, 0.5, 2/3, 0.9, 0.99], 5, 1/3) = 4, 9, 12, 17, 26.
  const double ps[] = {0.1, 0.5, 2.0 / 3.0, 0.9, 0.99};
  const int qs[] = {4, 9, 12, 17, 26};
  for (int i = 0; i < 5; ++i) CHECK(law.quantile(ps[i]) == qs[i]);
  // scipy.stats.nbinom.cdf(numpy.arange(14), 5, 1/3).sum() = 4.88741268405141 = E[(14 - D)+].
  CHECK(law.expected_leftover(14) == Approx(4.88741268405141).epsilon(1e-12));
  CHECK(law.expected_sales(14) == Approx(14.0 - 4.88741268405141).epsilon(1e-12));

  // Size below 1 (mode 0): mean 4, k = 0.5, so r = 0.5 and success prob 1/9.
  // scipy.stats.nbinom.pmf([0, 1, 3, 20], 0.5, 1/9) and .ppf([0.3, 0.5, 0.9, 0.999], 0.5, 1/9).
  const CountLaw heavy = neg_binomial(4.0, 0.5);
  CHECK(heavy.pmf(0) == Approx(0.3333333333333333).epsilon(1e-14));
  CHECK(heavy.pmf(1) == Approx(0.14814814814814808).epsilon(1e-13));
  CHECK(heavy.pmf(3) == Approx(0.07315957933241879).epsilon(1e-13));
  CHECK(heavy.pmf(20) == Approx(0.003963002115571524).epsilon(1e-13));
  CHECK(heavy.quantile(0.3) == 0);
  CHECK(heavy.quantile(0.5) == 2);
  CHECK(heavy.quantile(0.9) == 11);
  CHECK(heavy.quantile(0.999) == 46);

  // Boost negative_binomial(r, r / (r + mean)) over a grid of means and dispersions. Boost 1.74's
  // pdf itself drifts by about 1e-12 relative when the size r is large (r = 1e4 below; our
  // saddle-point pmf agrees with an independent 40-digit evaluation there), hence 1e-10.
  for (double mean : {0.3, 2.0, 12.5, 80.0, 900.0}) {
    for (double k : {0.2, 1.0, 3.0, 50.0, 1e4}) {
      CAPTURE(mean, k);
      const CountLaw nb = neg_binomial(mean, k);
      REQUIRE(nb.family == DemandFamily::negative_binomial);
      const auto ref = boost_nb(nb);
      const int top = static_cast<int>(mean + 15.0 * std::sqrt(nb.variance) + 15.0);
      const int stride = 1 + top / 400;  // at most ~400 points per law
      for (int j = 0; j <= top; j += stride) {
        CAPTURE(j);
        const double p = bm::pdf(ref, j);
        if (p > 1e-300) CHECK(std::fabs(nb.pmf(j) - p) <= 1e-10 * p);
        const double f = bm::cdf(ref, j);
        CHECK(std::fabs(nb.cdf(j) - f) <= 1e-10 * f + 1e-14);
      }
      for (int i = 1; i < 200; ++i) {
        const double u = i / 200.0;
        CAPTURE(u);
        CHECK(nb.quantile(u) == static_cast<int>(bm::quantile(ref, u)));
      }
    }
  }
}

TEST_CASE("count law: the negative binomial falls back to Poisson when variance <= mean",
          "[stats]") {
  // model.md, Demand: (cv * mean)^2 <= mean cannot be reached by a negative binomial.
  const CountLaw low = CountLaw::make(DemandFamily::negative_binomial, 10.0, 0.2, std::nullopt);
  CHECK(low.family == DemandFamily::poisson);  // (0.2 * 10)^2 = 4 <= 10
  CHECK(low.variance == 10.0);
  const CountLaw equal = CountLaw::from_moments(DemandFamily::negative_binomial, 10.0, 10.0);
  CHECK(equal.family == DemandFamily::poisson);
  const CountLaw high = CountLaw::make(DemandFamily::negative_binomial, 10.0, 0.5, std::nullopt);
  CHECK(high.family == DemandFamily::negative_binomial);  // (0.5 * 10)^2 = 25 > 10
  CHECK(high.variance == 25.0);
  // The fallback law is exactly the Poisson law.
  for (int k = 0; k < 40; ++k) CHECK(low.cdf(k) == poisson(10.0).cdf(k));
  // A NB law built by hand with variance <= mean is sampled as Poisson too.
  const CountLaw raw{DemandFamily::negative_binomial, 10.0, 7.0};
  for (double u : test_uniforms(200)) CHECK(CountSampler(raw)(u) == poisson(10.0).quantile(u));
  // dispersion k is always valid: variance = mean + mean^2 / k.
  const CountLaw disp = CountLaw::make(DemandFamily::negative_binomial, 10.0, std::nullopt, 5.0);
  CHECK(disp.family == DemandFamily::negative_binomial);
  CHECK(disp.variance == Approx(30.0).epsilon(1e-15));
  // Poisson ignores any spread.
  const CountLaw pois = CountLaw::make(DemandFamily::poisson, 10.0, 0.9, std::nullopt);
  CHECK(pois.family == DemandFamily::poisson);
  CHECK(pois.variance == 10.0);
}

TEST_CASE("count law: invalid parameters are rejected", "[stats]") {
  using std::nullopt;
  const auto nb = DemandFamily::negative_binomial;
  CHECK_THROWS_AS(CountLaw::make(DemandFamily::poisson, -1.0, nullopt, nullopt),
                  std::invalid_argument);
  CHECK_THROWS_AS(CountLaw::make(DemandFamily::poisson, std::numeric_limits<double>::quiet_NaN(),
                                 nullopt, nullopt),
                  std::invalid_argument);
  CHECK_THROWS_AS(CountLaw::make(nb, 5.0, nullopt, nullopt), std::invalid_argument);
  CHECK_THROWS_AS(CountLaw::make(nb, 5.0, 0.3, 2.0), std::invalid_argument);
  CHECK_THROWS_AS(CountLaw::make(nb, 5.0, -0.3, nullopt), std::invalid_argument);
  CHECK_THROWS_AS(CountLaw::make(nb, 5.0, nullopt, 0.0), std::invalid_argument);
  CHECK_THROWS_AS(CountLaw::make(DemandFamily::normal, 5.0, nullopt, nullopt),
                  std::invalid_argument);
  CHECK_THROWS_AS(CountLaw::from_moments(nb, 5.0, std::numeric_limits<double>::infinity()),
                  std::invalid_argument);
  // A negative variance (a forecast's rounding) counts as 0.
  CHECK(CountLaw::from_moments(DemandFamily::normal, 5.0, -1e-12).variance == 0.0);
}

TEST_CASE("count law: the normal count is rounded and truncated at 0", "[stats]") {
  // policies.md / model.md: P(D <= x) = Phi((x + 0.5 - mean) / sd) for x >= 0, and
  // quantile(p) = max(0, ceil(mean + sd z_p - 0.5)).
  const CountLaw law = CountLaw::make(DemandFamily::normal, 100.0, 0.3, std::nullopt);
  CHECK(law.family == DemandFamily::normal);
  CHECK(law.variance == Approx(900.0).epsilon(1e-15));
  // Worked example B (checks.md 1.5 [C]): CR = 8/11, z* = 0.6045853466, continuous Q* = 118.14;
  // the count rule gives ceil(100 + 30 * 0.6045853466 - 0.5) = ceil(117.64) = 118.
  CHECK(law.quantile(8.0 / 11.0) == 118);
  // scipy.stats.norm.cdf((118 + 0.5 - 100) / 30) = 0.7312726940595604.
  CHECK(law.cdf(118) == Approx(0.7312726940595604).epsilon(1e-14));
  // Sums over k of scipy.stats.norm.cdf((k + 0.5 - mu) / sd) (leftover, k < q) and
  // scipy.stats.norm.sf((k + 0.5 - mu) / sd) (shortage, k >= q, up to k = 2000).
  const int q[] = {0, 50, 118, 200};
  const double left[] = {0.0, 0.5912982001930646, 23.05635895048805, 100.0};
  const double short_[] = {100.00336019521666, 50.59465839540973, 5.059719145704715,
                           0.003360195216663729};
  for (int i = 0; i < 4; ++i) {
    CAPTURE(q[i]);
    CHECK(law.expected_leftover(q[i]) == Approx(left[i]).epsilon(1e-12));
    CHECK(law.expected_shortage(q[i]) == Approx(short_[i]).epsilon(1e-12));
    CHECK(law.expected_sales(q[i]) == Approx(q[i] - left[i]).epsilon(1e-12));
  }

  // A small mean where the truncation at 0 matters: mu = 2, sd = 3.
  const CountLaw small = CountLaw::from_moments(DemandFamily::normal, 2.0, 9.0);
  // scipy.stats.norm.cdf((0.5 - 2) / 3) = 0.3085375387259869 (all of X < 0.5 is the count 0);
  // norm.cdf(1.5 / 3) - norm.cdf(0.5 / 3) = 0.12527862866310946.
  CHECK(small.pmf(0) == Approx(0.3085375387259869).epsilon(1e-14));
  CHECK(small.pmf(3) == Approx(0.12527862866310946).epsilon(1e-13));
  CHECK(small.cdf(0) == Approx(0.3085375387259869).epsilon(1e-14));
  CHECK(small.cdf(-1) == 0.0);
  // numpy.ceil(2 + 3 * scipy.stats.norm.ppf([0.1, 0.3, 0.5, 0.9]) - 0.5) = -2, -0, 2, 6.
  CHECK(small.quantile(0.1) == 0);
  CHECK(small.quantile(0.3) == 0);
  CHECK(small.quantile(0.5) == 2);
  CHECK(small.quantile(0.9) == 6);
  // E[D] = sum_k scipy.stats.norm.sf((k + 0.5 - 2) / 3) = 2.4489141535056533 > 2 (truncation).
  CHECK(small.expected_shortage(0) == Approx(2.4489141535056533).epsilon(1e-13));
  CHECK(small.expected_leftover(1) == Approx(0.3085375387259869).epsilon(1e-14));
  CHECK(small.expected_leftover(4) == Approx(2.0).epsilon(1e-14));  // symmetric terms
  // pmf sums to 1 and matches cdf differences.
  double total = 0.0;
  for (int k = 0; k < 60; ++k) {
    total += small.pmf(k);
    CHECK(total == Approx(small.cdf(k)).margin(1e-15));
  }
  CHECK(total == Approx(1.0).margin(1e-15));

  // Zero spread: the mean rounded (half down), truncated at 0.
  const CountLaw fixed = CountLaw::make(DemandFamily::normal, 7.4, 0.0, std::nullopt);
  CHECK(fixed.quantile(0.01) == 7);
  CHECK(fixed.quantile(0.99) == 7);
  CHECK(fixed.cdf(6) == 0.0);
  CHECK(fixed.cdf(7) == 1.0);
  CHECK(fixed.pmf(7) == 1.0);
  CHECK(fixed.expected_leftover(10) == 3.0);
  CHECK(fixed.expected_shortage(5) == 2.0);

  for (const CountLaw& l : {law, small}) {
    const CountSampler sample(l);
    for (double u : test_uniforms(2000)) {
      CAPTURE(l.mean, u);
      const int k = sample(u);
      REQUIRE(k == l.quantile(u));
      REQUIRE(k ==
              std::max(0.0, std::ceil(l.mean + std::sqrt(l.variance) * larder::normal_quantile(u) -
                                      0.5)));
    }
  }
}

TEST_CASE("count law: mean 0 is always 0", "[stats]") {
  for (const CountLaw& law :
       {poisson(0.0), CountLaw::make(DemandFamily::negative_binomial, 0.0, 0.4, std::nullopt),
        CountLaw::make(DemandFamily::negative_binomial, 0.0, std::nullopt, 2.0),
        CountLaw::make(DemandFamily::normal, 0.0, 0.4, std::nullopt),
        CountLaw::from_moments(DemandFamily::normal, 0.0, 4.0)}) {
    CAPTURE(static_cast<int>(law.family), law.variance);
    CHECK(law.pmf(0) == 1.0);
    CHECK(law.pmf(1) == 0.0);
    CHECK(law.cdf(0) == 1.0);
    CHECK(law.cdf(-1) == 0.0);
    CHECK(law.expected_leftover(5) == 5.0);
    CHECK(law.expected_sales(5) == 0.0);
    CHECK(law.expected_shortage(5) == 0.0);
    const CountSampler sample(law);
    for (double u : test_uniforms(50)) {
      CHECK(sample(u) == 0);
      CHECK(law.quantile(u) == 0);
    }
  }
}

TEST_CASE("count law: expectation identities", "[stats]") {
  for (const CountLaw& law : {poisson(0.3), poisson(20.0), poisson(250.0), neg_binomial(6.0, 0.7),
                              neg_binomial(40.0, 8.0)}) {
    for (int q = 0; q <= static_cast<int>(3.0 * law.mean) + 20; ++q) {
      CAPTURE(law.mean, law.variance, q);
      const double sales = law.expected_sales(q);
      const double left = law.expected_leftover(q);
      const double lost = law.expected_shortage(q);
      CHECK(sales + left == Approx(q).margin(1e-12));
      CHECK(sales + lost == Approx(law.mean).margin(1e-12));
      CHECK(left >= 0.0);
      CHECK(lost >= 0.0);
      // Brute force over the pmf: E[min(D, q)].
      double direct = 0.0;
      for (int k = 0; k < q; ++k) direct += k * law.pmf(k);
      direct += q * (1.0 - law.cdf(q - 1));
      CHECK(sales == Approx(direct).margin(1e-11));
      if (law.family == DemandFamily::poisson) {
        // checks.md 1.3 [C]: E[(D - Q)+] = (mu - Q)(1 - F(Q)) + mu p(Q).
        const double closed = (law.mean - q) * (1.0 - law.cdf(q)) + law.mean * law.pmf(q);
        CHECK(lost == Approx(closed).margin(1e-12));
      }
    }
  }
}

TEST_CASE("count sampler: sample(u) == quantile(u), the smallest k with cdf(k) >= u", "[stats]") {
  static_assert(std::is_trivially_copyable_v<CountSampler>, "a sampler holds no heap memory");
  const std::vector<double> us = test_uniforms(3000);
  for (double mean : {1e-9, 0.01, 0.5, 1.0, 2.0, 9.99, 20.0, 73.25, 400.0}) {
    check_inversion(poisson(mean), us);
    for (double k : {0.1, 1.0, 4.0, 1e3}) check_inversion(neg_binomial(mean, k), us);
  }
  // Exactly at the cdf values: u = F(k) gives k, the next double above gives k + 1.
  for (const CountLaw& law : {poisson(20.0), neg_binomial(15.0, 2.0), poisson(3000.0)}) {
    const CountSampler sample(law);
    const int lo = law.quantile(1e-12);
    const int hi = law.quantile(1.0 - 1e-12);
    for (int k = lo; k < hi; ++k) {
      CAPTURE(law.mean, k);
      const double f = law.cdf(k);
      if (f <= law.cdf(k - 1)) continue;  // a flat step (cannot be hit by any u)
      CHECK(sample(f) == k);
      CHECK(sample(std::nextafter(f, 2.0)) == k + 1);
    }
  }
}

TEST_CASE("count sampler: the far upper tail is capped", "[stats]") {
  for (const CountLaw& law : {poisson(20.0), neg_binomial(20.0, 0.5), poisson(5000.0)}) {
    const CountSampler sample(law);
    CAPTURE(law.mean, law.variance);
    // cap = floor(mean + 40 sd + 50)
    CHECK(sample.cap() ==
          static_cast<int>(std::floor(law.mean + 40.0 * std::sqrt(law.variance) + 50.0)));
    // A u the accumulated cdf can never reach stops at the cap instead of looping on.
    CHECK(sample(1.5) == sample.cap());
    CHECK(law.quantile(1.5) == sample.cap());
    CHECK(law.cdf(sample.cap()) == 1.0);
    const int top = sample(std::nextafter(1.0, 0.0));
    CHECK(top <= sample.cap());
    CHECK(top == law.quantile(std::nextafter(1.0, 0.0)));
  }
}

TEST_CASE("count sampler: counts rise with u and with the mean (common random numbers)",
          "[stats]") {
  // model.md: a change of mean (goodwill) changes the count monotonically, not the noise.
  std::vector<double> us;
  for (int i = 1; i < 500; ++i) us.push_back(i / 500.0);
  std::vector<int> previous(us.size(), 0);
  for (double mean = 0.5; mean <= 60.0; mean += 0.5) {
    const CountSampler pois(poisson(mean));
    int last = 0;
    for (std::size_t i = 0; i < us.size(); ++i) {
      const int k = pois(us[i]);
      CHECK(k >= last);
      CHECK(k >= previous[i]);
      last = k;
      previous[i] = k;
    }
  }
}
