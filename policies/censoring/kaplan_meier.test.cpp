// The product-limit estimator against checks.md 3(b) (the tiny example and the discrete-demand
// fix, values [C] there) and against statsmodels on a second data set with ties.

#include "policies/censoring/kaplan_meier.hpp"

#include <catch2/catch.hpp>

namespace larder {
namespace {

/// checks.md 3(a)/(b) tiny data set: sales and stockout flags.
const int kSales[] = {12, 15, 15, 9, 20, 18, 15, 11, 20, 14};
const bool kSoldOut[] = {false, false, true, false, true, false, false, false, true, false};

/// The tiny data set with censored values at `sales - shift`.
std::vector<SurvivalObservation> tiny(double shift) {
  std::vector<SurvivalObservation> d;
  for (int i = 0; i < 10; ++i)
    d.push_back({kSoldOut[i] ? kSales[i] - shift : kSales[i], kSoldOut[i]});
  return d;
}

/// Compares the estimate with a table: `margin` is half a unit in the last digit of a printed
/// table, or 1e-15 (rounding of the products) for values printed in full.
void check_table(const KaplanMeier& km, const std::vector<double>& t, const std::vector<int>& n,
                 const std::vector<int>& d, const std::vector<double>& s, double margin) {
  REQUIRE(km.times.size() == t.size());
  for (size_t i = 0; i < t.size(); ++i) {
    INFO("event time " << t[i]);
    CHECK(km.times[i] == t[i]);
    CHECK(km.at_risk[i] == n[i]);
    CHECK(km.events[i] == d[i]);
    CHECK(km.survival[i] == Approx(s[i]).margin(margin));
  }
}

TEST_CASE("Kaplan-Meier on the checks.md 3(b) tiny example (standard convention)",
          "[policies][censoring]") {
  // checks.md 3(b) table [C] (= statsmodels SurvfuncRight): censored 15 stays at risk at 15.
  const KaplanMeier km = kaplan_meier(tiny(0.0));
  check_table(km, {9, 11, 12, 14, 15, 18}, {10, 9, 8, 7, 6, 3}, {1, 1, 1, 1, 2, 1},
              {0.9, 0.8, 0.7, 0.6, 0.4, 0.266667}, 5e-7);          // printed to 6 digits
  CHECK(km.survival.back() == Approx(4.0 / 15.0).epsilon(1e-12));  // by hand: 0.4 * (1 - 1/3)
  // checks.md 3(b): the two censored 20s leave S = 0.2667 beyond 18; restricted mean 15.3333.
  CHECK(km.remaining() == Approx(0.266667).margin(5e-7));
  CHECK(km.survival_at(100.0) == km.remaining());
  CHECK(km.largest_censored == 20.0);
  CHECK(km.restricted_mean(20.0) == Approx(15.3333).margin(5e-5));  // printed to 4 decimals
}

TEST_CASE("Kaplan-Meier with sold-out days at sales - 0.5 (checks.md 3(b) discrete trap)",
          "[policies][censoring]") {
  // checks.md 3(b) [C]: n at risk at 15 becomes 5, S(15) = 0.36, S(18) = 0.24, restricted
  // mean sum_{k=0}^{19} S(k) = 15.16. Also statsmodels 0.13.5
  // SurvfuncRight(time=[12,15,14.5,9,19.5,18,15,11,19.5,14], status=1-flags) gives n_risk
  // [10,9,8,7,5,3] and surv_prob [0.9,0.8,0.7,0.6,0.36,0.24].
  const KaplanMeier km = kaplan_meier(tiny(0.5));
  check_table(km, {9, 11, 12, 14, 15, 18}, {10, 9, 8, 7, 5, 3}, {1, 1, 1, 1, 2, 1},
              {0.9, 0.8, 0.7, 0.6, 0.36, 0.24}, 1e-15);
  CHECK(km.survival_at(15.0) == Approx(0.36).epsilon(1e-12));
  CHECK(km.survival_at(14.99) == Approx(0.6).epsilon(1e-12));
  CHECK(km.survival_at(18.0) == Approx(0.24).epsilon(1e-12));
  CHECK(km.survival_at(8.0) == 1.0);
  CHECK(km.largest_censored == 19.5);
  CHECK(km.restricted_mean(20.0) == Approx(15.16).epsilon(1e-12));
}

TEST_CASE("Kaplan-Meier matches statsmodels SurvfuncRight with ties of events and censoring",
          "[policies][censoring]") {
  // statsmodels 0.13.5 (/usr/bin/python3):
  //   SurvfuncRight(time=[7,3,9,9,5,12,4,9,6,11,8,12,2,10],
  //                 status=[1,0,1,0,1,0,1,1,0,1,1,0,1,0])
  //   surv_times [2,4,5,7,8,9,11], n_risk [14,12,11,9,8,7,3], n_events [1,1,1,1,1,2,1],
  //   surv_prob printed to 16 digits below.
  const std::vector<SurvivalObservation> d = {
      {7, false}, {3, true}, {9, false},  {9, true},  {5, false}, {12, true}, {4, false},
      {9, false}, {6, true}, {11, false}, {8, false}, {12, true}, {2, false}, {10, true}};
  const KaplanMeier km = kaplan_meier(d);
  check_table(km, {2, 4, 5, 7, 8, 9, 11}, {14, 12, 11, 9, 8, 7, 3}, {1, 1, 1, 1, 1, 2, 1},
              {0.9285714285714286, 0.8511904761904762, 0.7738095238095237, 0.6878306878306877,
               0.6018518518518517, 0.42989417989417983, 0.2865961199294533},
              1e-15);  // statsmodels prints 16 significant digits
  CHECK(km.largest_censored == 12.0);
}

TEST_CASE("Kaplan-Meier edge cases: no data, all censored, no censoring", "[policies][censoring]") {
  KaplanMeier km = kaplan_meier({});
  CHECK(km.times.empty());
  CHECK(km.remaining() == 1.0);
  km = kaplan_meier({{4, true}, {6, true}});
  CHECK(km.times.empty());
  CHECK(km.remaining() == 1.0);
  CHECK(km.largest_censored == 6.0);
  // Uncensored data: the empirical survival function (by hand: 3 values, S = 2/3, 1/3, 0).
  km = kaplan_meier({{5, false}, {1, false}, {3, false}});
  check_table(km, {1, 3, 5}, {3, 2, 1}, {1, 1, 1}, {2.0 / 3.0, 1.0 / 3.0, 0.0}, 1e-15);
  CHECK(km.restricted_mean(10.0) == Approx(3.0).epsilon(1e-12));  // the sample mean
}

}  // namespace
}  // namespace larder
