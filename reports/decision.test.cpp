// The decision page's sentences as a pure function: numbers worked by hand, and agreement with
// the verdicts of comparison.hpp (a change is stated only when its interval excludes 0).

#include "reports/decision.hpp"

#include <catch2/catch.hpp>
#include <random>

#include "reports/comparison.hpp"
#include "reports/sample_run.test.hpp"

namespace larder {
namespace {

AnnualChange change(double mean, double lo, double hi, int n = 10) {
  return {{mean, (hi - lo) / 4.0, lo, hi, n}, true};
}

TEST_CASE("a year is 365 days over the scored days", "[html]") {
  RunInfo info;
  info.horizon_days = 364;
  info.warmup_days = 28;
  CHECK(scored_days(info) == 336);
  CHECK(annual_factor(info) == Approx(365.0 / 336.0));
  info.warmup_days = 364;
  CHECK(std::isnan(annual_factor(info)));
  const Estimate e = scaled({2.0, 0.5, 1.0, 3.0, 5}, 10.0);
  CHECK(e.mean == 20.0);
  CHECK(e.stderr_ == 5.0);
  CHECK(e.ci_low == 10.0);
  CHECK(e.ci_high == 30.0);
  CHECK(e.n == 5);
}

TEST_CASE("decision sentences worked by hand", "[html]") {
  DecisionRow a;
  a.policy = "next-day";
  a.waste_in_tonnes = true;
  a.waste = change(-4.1, -5.0, -3.2);     // half-width 0.9: two decimals
  a.co2e = change(-9.8, -12.0, -7.6);     // half-width 2.2: one decimal
  a.lost = change(1900, 1500, 2300);      // half-width 400: none
  a.profit = change(12000, 8000, 16000);  // in thousands (16,000 >= 10,000); 4 k: one decimal
  CHECK(decision_sentence(a, "EUR") ==
        "next-day cuts waste by 4.10 t a year (3.20 to 5.00), 9.8 t CO2e less a year (7.6 to "
        "12.0) and costs 1,900 more lost customers a year (1,500 to 2,300); profit +12.0 k EUR a "
        "year (+8.0 k to +16.0 k).");

  DecisionRow b;
  b.policy = "markdown";
  b.waste_in_tonnes = true;
  b.waste = change(0.1, -0.3, 0.5);          // not significant
  b.lost = change(-250, -400, -100);         // fewer lost customers
  b.profit = change(-12000, -16000, -8000);  // significantly lower
  CHECK(decision_sentence(b, "") ==
        "markdown makes no clear difference to waste (-0.30 to +0.50 t a year) and loses 250 "
        "fewer customers a year (100 to 400); profit -12.0 k a year (-16.0 k to -8.0 k).");

  DecisionRow c;
  c.policy = "donate";
  c.waste = change(250, 120, 380);                   // units: no weights
  c.lost = change(3, -2, 8);                         // not significant
  c.profit = change(-3000000, -45000000, 39000000);  // millions, not significant
  CHECK(decision_sentence(c, "EUR") ==
        "donate adds 250 wasted units a year (120 to 380) and no clear difference in lost "
        "customers (-2.0 to +8.0 a year); no clear difference in profit (-45 M to +39 M EUR a "
        "year).");

  DecisionRow d;  // one replication: no interval, so no verdict
  d.policy = "solo";
  d.waste = change(5, std::nan(""), std::nan(""), 1);
  d.lost = change(5, std::nan(""), std::nan(""), 1);
  d.profit = change(5, std::nan(""), std::nan(""), 1);
  CHECK(decision_sentence(d, "EUR") ==
        "solo waste is not available and lost customers are not available; profit is not "
        "available.");
}

TEST_CASE("decision sentences agree with the verdicts", "[html]") {
  // Random intervals around 0 and away from it: the sentence says "cuts", "adds" or "no clear
  // difference" exactly as verdict() says better, worse or no significant difference.
  std::mt19937 gen(17);
  std::uniform_real_distribution<double> centre(-3.0, 3.0);
  std::uniform_real_distribution<double> half(0.05, 2.0);
  for (int k = 0; k < 500; ++k) {
    const double m = centre(gen);
    const double h = half(gen);
    const Estimate e{m, h / 2.0, m - h, m + h, 8};
    DecisionRow row;
    row.policy = "p";
    row.waste_in_tonnes = true;
    row.waste = {e, true};
    row.lost = {e, true};
    row.profit = {scaled(e, 1000.0), true};
    const std::string s = decision_sentence(row, "EUR");
    INFO(s);
    const std::string waste = verdict(Metric::waste_kg, e);
    const std::string lost = verdict(Metric::lost_units, e);
    const std::string profit = verdict(Metric::profit, scaled(e, 1000.0));
    CHECK((s.find("cuts waste") != std::string::npos) == waste.starts_with("better"));
    CHECK((s.find("adds") != std::string::npos) == waste.starts_with("worse"));
    CHECK((s.find("no clear difference to waste") != std::string::npos) ==
          (waste == "no significant difference"));
    CHECK((s.find("fewer customers") != std::string::npos) == lost.starts_with("better"));
    CHECK((s.find("more lost customers") != std::string::npos) == lost.starts_with("worse"));
    CHECK((s.find("; profit +") != std::string::npos) == profit.starts_with("better"));
    CHECK((s.find("; profit -") != std::string::npos) == profit.starts_with("worse"));
    CHECK((s.find("no clear difference in profit") != std::string::npos) ==
          (profit == "no significant difference"));
  }
}

TEST_CASE("decision rows scale the paired differences to a year", "[html]") {
  const RunResult r = test::sample_run();  // 91 days, 14 of warm-up: 77 scored
  const std::vector<DecisionRow> rows = decision_rows(r);
  REQUIRE(rows.size() == 2);
  CHECK(rows[0].policy == "newsvendor");
  CHECK_FALSE(rows[0].waste_in_tonnes);  // no waste_kg in the sample: units
  CHECK_FALSE(rows[0].co2e.available);
  const Estimate d = baseline_difference(r, 1, Metric::waste_units);
  CHECK(rows[0].waste.difference.mean == Approx(d.mean * 365.0 / 77.0));
  CHECK(rows[0].waste.difference.ci_low == Approx(d.ci_low * 365.0 / 77.0));
  const Estimate p = baseline_difference(r, 2, Metric::profit);
  CHECK(rows[1].profit.difference.ci_high == Approx(p.ci_high * 365.0 / 77.0));
}

TEST_CASE("decision amounts", "[html]") {
  CHECK(decision_amount(12345.0, 4000.0, true, true) == "+12.3 k");
  CHECK(decision_amount(-2500000.0, 40000.0, true, true) == "-2,500 k");
  CHECK(decision_amount(25000000.0, 400000.0, true, false) == "25.0 M");
  CHECK(decision_amount(1234.0, 40.0, false, false) == "1,230");  // three significant digits
  CHECK(decision_amount(16.068, 0.03, false, false) == "16.1");
  CHECK(decision_amount(55724.0, 160.0, false, false) == "55,700");
  CHECK(decision_change({9000.0, 1000.0, 7000.0, 11000.0, 5}, true) ==
        "+9.0 k (+7.0 k to +11.0 k)");
  CHECK(decision_change({-0.5, 0.1, -0.7, -0.3, 5}, false) == "-0.50 (-0.70 to -0.30)");
  CHECK(decision_change({3.0, 0.0, std::nan(""), std::nan(""), 1}, false) == "+3.0");
}

}  // namespace
}  // namespace larder
