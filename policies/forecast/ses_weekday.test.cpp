// ses_weekday against the textbook recursion worked in checks.md 7.1 (values [C]: computed and
// matched to statsmodels SimpleExpSmoothing with initialization_method='known').

#include "policies/forecast/ses_weekday.hpp"

#include <catch2/catch.hpp>

namespace larder {
namespace {

TEST_CASE("ses_update follows l_t = alpha y_t + (1 - alpha) l_{t-1} (checks.md 7.1)",
          "[policies][forecast]") {
  // y, alpha = 0.3, l_0 = 14: fitted values 14, 13.4, 13.88, ... and forecast 15.5568756107.
  const double y[] = {12, 15, 11, 14, 18, 16, 13, 17, 19, 15, 14, 16};
  const double fitted[] = {14,        13.4,      13.88,     13.016,    13.3112,   14.71784,
                           15.102488, 14.471742, 15.230219, 16.361153, 15.952807, 15.366965};
  SesState s{14.0, 1.0, true};
  for (int t = 0; t < 12; ++t) {
    CHECK(s.level == Approx(fitted[t]).epsilon(1e-6));
    s = ses_update(s, y[t], 0.3);
  }
  CHECK(s.level == Approx(15.5568756107).epsilon(1e-10));
}

TEST_CASE("the variance is the smoothed squared one-step error (policies.md)",
          "[policies][forecast]") {
  // Worked by hand: v1 = 0.8 * 4 + 0.2 * (10 - 8)^2 = 4; v2 = 0.8 * 4 + 0.2 * (5 - 8.4)^2.
  SesState s{8.0, 4.0, true};
  s = ses_update(s, 10.0, 0.2);
  CHECK(s.level == Approx(8.4));
  CHECK(s.variance == Approx(4.0));
  s = ses_update(s, 5.0, 0.2);
  CHECK(s.variance == Approx(0.8 * 4.0 + 0.2 * 3.4 * 3.4));
}

TEST_CASE("weekday SES: a Monday from Mondays, started from the first week (checks.md 7.1)",
          "[policies][forecast]") {
  // alpha = 0.4, l_0 = first value of each weekday; next-week forecasts Mon..Sun.
  const double y[] = {23, 19, 20, 25, 31, 37, 12, 18, 15, 18, 20, 33, 38, 7,
                      20, 20, 16, 24, 27, 35, 12, 19, 17, 17, 24, 28, 38, 10};
  const double expected[] = {19.96, 17.864, 17.552, 23.64, 29.128, 37.064, 10.48};
  Scenario sc;  // starts on a Monday
  sc.items.resize(1);
  SesWeekday f(sc, 0.4, std::vector<std::array<SesState, kDaysPerWeek>>(1));
  for (int t = 0; t < 28; ++t) {
    const double v = y[t];
    f.observe(t, std::span<const double>(&v, 1));
  }
  for (int w = 0; w < 7; ++w) {
    DemandForecast out;
    f.predict(28 + w, std::span<DemandForecast>(&out, 1));
    CHECK(out.mean == Approx(expected[w]).epsilon(1e-12));
  }
}

}  // namespace
}  // namespace larder
