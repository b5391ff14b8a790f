// Tests of the across-replication statistics (sim/stats/summary.hpp). Reference values are from
// checks.md section 8 [C] and from SciPy 1.10.1 (scipy.stats.t.ppf, scipy.stats.sem,
// scipy.stats.t.interval, scipy.stats.ttest_rel), pasted with the call used.

#include "sim/stats/summary.hpp"

#include <boost/math/distributions/students_t.hpp>
#include <catch2/catch.hpp>
#include <cmath>
#include <numbers>
#include <vector>

namespace {

using larder::Estimate;
using larder::estimate_mean;
using larder::estimate_paired_difference;
using larder::student_t_quantile;

// A small hand-made data set and a paired partner.
const std::vector<double> kX = {12.5, 9.75, 14.0, 11.25, 10.5, 13.75, 8.5, 12.0, 11.0, 13.25};
const std::vector<double> kY = {11.0, 9.5, 12.25, 10.75, 9.0, 12.5, 8.25, 10.5, 10.0, 12.0};

}  // namespace

TEST_CASE("student_t_quantile matches checks.md 8, Boost and the Cauchy closed form", "[stats]") {
  // checks.md 8 [C]: scipy.stats.t.ppf(0.975, 9) = 2.2621571627, t.ppf(0.975, 19) = 2.0930240544,
  // and Boost quantile(complement(students_t(9), 0.025)) agrees.
  CHECK(student_t_quantile(0.975, 9) == Approx(2.2621571627).margin(1e-10).epsilon(0));
  CHECK(student_t_quantile(0.975, 19) == Approx(2.0930240544).margin(1e-10).epsilon(0));
  const boost::math::students_t_distribution<double> t9(9.0);
  CHECK(student_t_quantile(0.975, 9) ==
        Approx(boost::math::quantile(boost::math::complement(t9, 0.025))).epsilon(1e-15));
  // SciPy 1.10.1's t.ppf is less accurate than Boost: (0.975, 9) gives 2.2621571627409915 where
  // Boost gives 2.2621571627982049 (3e-11 relative), and t.ppf(0.95, 4) = 2.13184678133629
  // where Boost gives 2.1318467863266 (2e-9; scipy's own t.cdf of Boost's value is 0.95 to the
  // last bit). So values taken from SciPy's t are checked to 1e-8 or 1e-10, and Boost is the
  // precise reference.
  CHECK(student_t_quantile(0.95, 4) == Approx(2.13184678133629).epsilon(1e-8));
  const boost::math::students_t_distribution<double> t4(4.0);
  CHECK(student_t_quantile(0.95, 4) == Approx(boost::math::quantile(t4, 0.95)).epsilon(1e-15));
  // One degree of freedom is the Cauchy law: t = tan(pi (p - 1/2)) (any probability textbook).
  for (double p : {0.6, 0.9, 0.975, 0.995}) {
    CAPTURE(p);
    CHECK(student_t_quantile(p, 1) ==
          Approx(std::tan(std::numbers::pi * (p - 0.5))).epsilon(1e-13));
  }
  // Symmetry about 0.
  CHECK(student_t_quantile(0.025, 9) == Approx(-student_t_quantile(0.975, 9)).epsilon(1e-14));
}

TEST_CASE("estimate_mean matches SciPy on a small data set", "[stats]") {
  const Estimate e = estimate_mean(kX);
  CHECK(e.n == 10);
  // numpy mean = 11.65; scipy.stats.sem(x) = 0.5654398484562458.
  CHECK(e.mean == Approx(11.65).epsilon(1e-15));
  CHECK(e.stderr_ == Approx(0.5654398484562458).epsilon(1e-14));
  // scipy.stats.t.interval(0.95, 9, loc=11.65, scale=sem) = (10.370886196715523,
  // 12.929113803284478).
  CHECK(e.ci_low == Approx(10.370886196715523).epsilon(1e-10));
  CHECK(e.ci_high == Approx(12.929113803284478).epsilon(1e-10));
  // scipy.stats.t.interval(0.90, 9, ...) = (10.613484901157145, 12.686515098842856).
  const Estimate e90 = estimate_mean(kX, 0.90);
  CHECK(e90.ci_low == Approx(10.613484901157145).epsilon(1e-10));
  CHECK(e90.ci_high == Approx(12.686515098842856).epsilon(1e-10));
  CHECK(e90.mean == e.mean);
  CHECK(e90.stderr_ == e.stderr_);
}

TEST_CASE("estimate_mean with few values", "[stats]") {
  // x = [4, 7]: scipy.stats.sem = 1.5, t.interval(0.95, 1, loc=5.5, scale=1.5) =
  // (-13.559307104648141, 24.55930710464814).
  const std::vector<double> two = {4.0, 7.0};
  const Estimate e2 = estimate_mean(two);
  CHECK(e2.n == 2);
  CHECK(e2.mean == 5.5);
  CHECK(e2.stderr_ == Approx(1.5).epsilon(1e-15));
  CHECK(e2.ci_low == Approx(-13.559307104648141).epsilon(1e-10));
  CHECK(e2.ci_high == Approx(24.55930710464814).epsilon(1e-10));
  // The same interval from the Cauchy closed form t_{1, 0.975} = tan(0.475 pi).
  CHECK(e2.ci_high - e2.mean == Approx(1.5 * std::tan(0.475 * std::numbers::pi)).epsilon(1e-13));
  // One value: no spread can be estimated; the documented result is stderr 0 and a point CI.
  const std::vector<double> one = {3.25};
  const Estimate e1 = estimate_mean(one);
  CHECK(e1.n == 1);
  CHECK(e1.mean == 3.25);
  CHECK(e1.stderr_ == 0.0);
  CHECK(e1.ci_low == 3.25);
  CHECK(e1.ci_high == 3.25);
  // No values.
  const Estimate e0 = estimate_mean(std::vector<double>{});
  CHECK(e0.n == 0);
  CHECK(e0.mean == 0.0);
  CHECK(e0.stderr_ == 0.0);
  // Constant values: zero spread, exact mean.
  const std::vector<double> flat(7, 2.5);
  const Estimate ef = estimate_mean(flat);
  CHECK(ef.mean == 2.5);
  CHECK(ef.stderr_ == 0.0);
  CHECK(ef.ci_low == 2.5);
  CHECK(ef.ci_high == 2.5);
}

TEST_CASE("estimate_paired_difference is the estimate of the differences", "[stats]") {
  const Estimate d = estimate_paired_difference(kX, kY);
  // d = x - y: mean 1.075, scipy.stats.sem(d) = 0.175, scipy.stats.t.interval(0.95, 9, loc=1.075,
  // scale=0.175) = (0.6791224965203264, 1.4708775034796735).
  CHECK(d.n == 10);
  CHECK(d.mean == Approx(1.075).epsilon(1e-14));
  CHECK(d.stderr_ == Approx(0.175).epsilon(1e-13));
  CHECK(d.ci_low == Approx(0.6791224965203264).epsilon(1e-10));
  CHECK(d.ci_high == Approx(1.4708775034796735).epsilon(1e-10));
  // scipy.stats.ttest_rel(x, y).statistic = 6.142857142857142 = mean / stderr.
  CHECK(d.mean / d.stderr_ == Approx(6.142857142857142).epsilon(1e-12));
  // Bit for bit the estimate of the explicit differences.
  std::vector<double> diff;
  for (std::size_t j = 0; j < kX.size(); ++j) diff.push_back(kX[j] - kY[j]);
  const Estimate ref = estimate_mean(diff);
  CHECK(d.mean == ref.mean);
  CHECK(d.stderr_ == ref.stderr_);
  CHECK(d.ci_low == ref.ci_low);
  CHECK(d.ci_high == ref.ci_high);
  // Pairing removes the common noise: the paired interval is much narrower than the unpaired
  // intervals of the two series (checks.md 8: common random numbers).
  CHECK(d.ci_high - d.ci_low < 0.5 * (estimate_mean(kX).ci_high - estimate_mean(kX).ci_low));
}

TEST_CASE("estimate_paired_difference of identical series is exactly 0", "[stats]") {
  const Estimate d = estimate_paired_difference(kX, kX);
  CHECK(d.n == 10);
  CHECK(d.mean == 0.0);
  CHECK(d.stderr_ == 0.0);
  CHECK(d.ci_low == 0.0);
  CHECK(d.ci_high == 0.0);
}
