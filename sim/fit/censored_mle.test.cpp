// The censored-likelihood estimators against SciPy 1.10.1 (Debian's python3-scipy) and the
// values of checks.md 3(a); the integer trap (a sold-out day means D >= sales).

#include "sim/fit/censored_mle.hpp"

#include <catch2/catch.hpp>
#include <cmath>
#include <vector>

#include "sim/fit/count_likelihood.hpp"

namespace larder {
namespace {

// checks.md 3(a): the tiny fixed data set.
const std::vector<int> kSales = {12, 15, 15, 9, 20, 18, 15, 11, 20, 14};
const std::vector<std::uint8_t> kFlags = {0, 0, 1, 0, 1, 0, 0, 0, 1, 0};

// Optimiser tolerance: the check values are quoted to 6 decimals, and scipy's Nelder-Mead ran
// with xatol 1e-10, so both sides agree far below this.
constexpr double kTol = 2e-6;

TEST_CASE("single terms match scipy.stats logpmf/logsf", "[fit]") {
  // /usr/bin/python3, scipy 1.10.1: m=7.5, cv=0.6, r=m/(cv*cv*m-1), p=r/(r+m);
  // stats.nbinom.logpmf(9,r,p), stats.nbinom.logsf(9-1,r,p)
  CHECK(count_log_likelihood(DemandFamily::negative_binomial, 7.5, 0.6, 9, false) ==
        Approx(-2.6455614399693372).epsilon(1e-12));
  CHECK(count_log_likelihood(DemandFamily::negative_binomial, 7.5, 0.6, 9, true) ==
        Approx(-1.0416728497477608).epsilon(1e-12));
  // stats.poisson.logpmf(9,7.5), stats.poisson.logsf(9-1,7.5)
  CHECK(count_log_likelihood(DemandFamily::poisson, 7.5, 0, 9, false) ==
        Approx(-2.1677002952010884).epsilon(1e-12));
  CHECK(count_log_likelihood(DemandFamily::poisson, 7.5, 0, 9, true) ==
        Approx(-1.0846121075840736).epsilon(1e-12));
  // sd=4.5: np.log(stats.norm.cdf((9.5-7.5)/sd)-stats.norm.cdf((8.5-7.5)/sd)),
  // stats.norm.logsf((8.5-7.5)/sd), stats.norm.logcdf((0.5-7.5)/sd)
  CHECK(count_log_likelihood(DemandFamily::normal, 7.5, 0.6, 9, false) ==
        Approx(-2.480399168692812).epsilon(1e-12));
  CHECK(count_log_likelihood(DemandFamily::normal, 7.5, 0.6, 9, true) ==
        Approx(-0.8865609542717152).epsilon(1e-12));
  CHECK(count_log_likelihood(DemandFamily::normal, 7.5, 0.6, 0, false) ==
        Approx(-2.814963469944682).epsilon(1e-12));
  // A sold-out day with no sales says only D >= 0.
  CHECK(count_log_likelihood(DemandFamily::normal, 7.5, 0.6, 0, true) == 0.0);
}

TEST_CASE("Tobit MLE on checks.md 3(a)'s tiny data set", "[fit]") {
  // checks.md 3(a) [C]: Normal MLE (15.790915, 4.575836), nll 23.3008746. Reproduced with
  // scipy.optimize.minimize(tobit, [15, log 4], method='Nelder-Mead') on the hand-coded
  // stats.norm.logpdf / logsf likelihood: 15.790914973671335, 4.575836241427444,
  // 23.300874555931504.
  std::vector<double> x(kSales.begin(), kSales.end());
  const TobitFit f = fit_tobit(x, kFlags);
  CHECK(f.mean == Approx(15.790914973671335).margin(kTol));
  CHECK(f.sd == Approx(4.575836241427444).margin(kTol));
  CHECK(f.neg_log_likelihood == Approx(23.300874555931504).margin(1e-8));
}

TEST_CASE("rounded-normal censored MLE against scipy", "[fit]") {
  // The simulator's normal count max(0, round(X)): np.log(norm.cdf((x+.5-m)/s) -
  // norm.cdf((x-.5-m)/s)) on days that did not sell out, norm.logsf((x-.5-m)/s) on sold-out
  // days; scipy.optimize.minimize(..., [15, log 4], method='Nelder-Mead', xatol 1e-10):
  // m = 15.625250855798056, s = 4.353584360961132, nll = 22.9065943329136.
  const CensoredFit f = fit_censored(DemandFamily::normal, kSales, kFlags);
  CHECK(f.converged);
  CHECK(f.mean == Approx(15.625250855798056).margin(kTol));
  CHECK(f.cv * f.mean == Approx(4.353584360961132).margin(kTol));
  CHECK(f.neg_log_likelihood == Approx(22.9065943329136).margin(1e-8));
  CHECK(f.mean_se > 0.5);  // ten days cannot pin the mean to better than about sd / sqrt(10)
  CHECK(f.mean_se < 3.0);
}

TEST_CASE("negative binomial censored MLE against scipy", "[fit]") {
  // Data of our own; var = (cv m)^2, r = m / (cv^2 m - 1), p = r / (r + m);
  // nll = -(sum stats.nbinom.logpmf(y[e==0], r, p) + sum stats.nbinom.logsf(y[e==1]-1, r, p));
  // scipy.optimize.minimize(nll, [log 7, log 0.5], method='Nelder-Mead', xatol 1e-12):
  // m = 7.904980168487969, cv = 0.595909853764389, nll = 33.63687266645028.
  const std::vector<int> y = {3, 7, 5, 9, 9, 4, 12, 6, 9, 2, 8, 9, 1, 11, 9};
  const std::vector<std::uint8_t> e = {0, 0, 0, 1, 0, 0, 0, 0, 1, 0, 0, 1, 0, 0, 1};
  const CensoredFit f = fit_censored(DemandFamily::negative_binomial, y, e);
  CHECK(f.converged);
  CHECK(f.mean == Approx(7.904980168487969).margin(kTol));
  CHECK(f.cv == Approx(0.595909853764389).margin(kTol));
  CHECK(f.neg_log_likelihood == Approx(33.63687266645028).margin(1e-8));
}

TEST_CASE("integer trap: a sold-out day counts as D >= sales, not D > sales", "[fit]") {
  // checks.md 3(a) [C]: Poisson MLE with "flag => D >= x" 15.584077; with "flag => D > x"
  // 15.840339. scipy: minimize(-(poisson.logpmf(x[d==0], m) + poisson.logsf(x[d==1]-1, m)))
  // gives 15.584076964379353, nll 22.80761121266136.
  const CensoredFit f = fit_censored(DemandFamily::poisson, kSales, kFlags);
  CHECK(f.mean == Approx(15.584076964379353).margin(kTol));
  CHECK(f.neg_log_likelihood == Approx(22.80761121266136).margin(1e-8));
  CHECK(std::abs(f.mean - 15.840339) > 0.2);
  // The same flags read as D > x are D >= x + 1: the higher checks.md value.
  std::vector<int> shifted = kSales;
  for (size_t j = 0; j < shifted.size(); ++j) shifted[j] += kFlags[j];
  CHECK(fit_censored(DemandFamily::poisson, shifted, kFlags).mean ==
        Approx(15.840339).margin(kTol));
}

}  // namespace
}  // namespace larder
