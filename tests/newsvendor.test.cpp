// The engine against newsvendor closed forms: one store, one item, Poisson(20) demand every
// day, shelf life 1, lost sales. The textbook single-period model (Nahmias, Production and
// Operations Analysis, the newsvendor chapter; Silver, Pyke and Thomas 2017, ch. on style
// goods and perishables) gives, for stock Q each morning, E[sales] = E[min(D, Q)],
// E[leftover] = E[(Q - D)+], E[lost] = E[(D - Q)+], P(no stockout) = F(Q), P(unit left at
// close) = F(Q - 1). The expectations are computed here from Boost.Math's Poisson pmf, and the
// simulated means must agree within 4 standard errors (across replications).

#include <fmt/format.h>

#include <boost/math/distributions/poisson.hpp>
#include <catch2/catch.hpp>

#include "tests/fixture.hpp"

namespace larder {
namespace {

/// Exact one-day expectations of the newsvendor with Poisson(mu) demand and stock q, from the
/// Boost.Math pmf (an external reference).
struct Newsvendor {
  double sales = 0, leftover = 0, lost = 0, no_stockout = 0, in_stock = 0;
};
Newsvendor exact_poisson(double mu, int q) {
  boost::math::poisson_distribution<double> d(mu);
  Newsvendor n;
  for (int k = 0; k < 400; ++k) {
    const double p = boost::math::pdf(d, k);
    n.sales += p * std::min(k, q);
    n.leftover += p * std::max(q - k, 0);
    n.lost += p * std::max(k - q, 0);
  }
  n.no_stockout = boost::math::cdf(d, q);
  n.in_stock = q >= 1 ? boost::math::cdf(d, q - 1) : 0.0;
  return n;
}

constexpr int kDays = 1000;
constexpr int kReplications = 30;

std::string one_item(const std::string& item_extra, const std::string& policy) {
  return fmt::format(R"(
format: 1
name: newsvendor
seed: 11
horizon: {{ days: {}, warmup_days: 0 }}
replications: {}
stores: [ {{ id: s }} ]
items:
  - {{ id: loaf, price: 3, unit_cost: 1, demand: {{ base: 20 }} {} }}
policies:
{}
)",
                     kDays, kReplications, item_extra, policy);
}

/// |simulated mean - exact| <= 4 standard errors, and the test is sharp enough to fail.
void check_close(const Estimate& e, double exact, const char* what) {
  INFO(what << ": simulated " << e.mean << " +- " << e.stderr_ << ", exact " << exact);
  CHECK(std::abs(e.mean - exact) <= 4.0 * e.stderr_);
  CHECK(e.stderr_ < 0.02 * std::max(std::abs(exact), 0.05));
}

void check_against_closed_form(const RunResult& r, int policy, int q, double price, double cost,
                               double salvage, double penalty) {
  const Newsvendor n = exact_poisson(20.0, q);
  const double days = kDays;
  using test::metric_estimate;
  check_close(metric_estimate(r, policy, Metric::sold_units, days), n.sales, "sales per day");
  const Metric leftover_metric = salvage > 0 ? Metric::salvaged_units : Metric::waste_units;
  check_close(metric_estimate(r, policy, leftover_metric, days), n.leftover, "leftover per day");
  check_close(metric_estimate(r, policy, Metric::lost_units, days), n.lost, "lost per day");
  check_close(metric_estimate(r, policy, Metric::no_stockout_share), n.no_stockout,
              "no-stockout share (type 1)");
  check_close(metric_estimate(r, policy, Metric::in_stock_at_close), n.in_stock,
              "in stock at close");
  check_close(metric_estimate(r, policy, Metric::fill_rate), n.sales / 20.0, "fill rate (type 2)");
  const double profit = price * n.sales + salvage * n.leftover - cost * q - penalty * n.lost;
  check_close(metric_estimate(r, policy, Metric::profit, days), profit, "profit per day");
  // Every day receives exactly q units.
  CHECK(metric_estimate(r, policy, Metric::delivered_units, days).mean == Approx(q).epsilon(0));
}

TEST_CASE("fixed quantity Q* = 22 matches the Poisson(20) newsvendor (checks.md 1.4, example A)",
          "[engine][newsvendor]") {
  const Scenario s = test::scenario_from(one_item("", R"(
  - name: fixed-22
    forecast: { method: oracle }
    quantity: { rule: fixed, quantity: 22 })"));
  const RunResult r = test::run_scenario(s, 2);
  check_against_closed_form(r, 0, 22, 3.0, 1.0, 0.0, 0.0);
  // checks.md example A (scipy): E[profit] at Q* = 35.0615102585, fill rate 0.9510251710.
  CHECK(exact_poisson(20, 22).sales * 3 - 22 == Approx(35.0615102585).epsilon(1e-9));
}

TEST_CASE("critical_fractile with the oracle orders Q* = 22 for p=3, c=1 (CR = 2/3)",
          "[engine][newsvendor]") {
  // Example A of checks.md 1.4: Q* = 22 = scipy.stats.poisson.ppf(2/3, 20).
  const Scenario s = test::scenario_from(one_item("", R"(
  - name: newsvendor
    forecast: { method: oracle }
    quantity: { rule: critical_fractile, assume: poisson })"));
  check_against_closed_form(test::run_scenario(s), 0, 22, 3.0, 1.0, 0.0, 0.0);
}

TEST_CASE("critical_fractile with salvage 0.5 and penalty 0.5 orders Q* = 24 (CR = 5/6)",
          "[engine][newsvendor]") {
  // Variant A' of checks.md 1.4: Q* = 24, E[profit] = 36.5371977788 (scipy).
  const Scenario s = test::scenario_from(
      one_item(", leftovers: salvage, salvage_value: 0.5, stockout_penalty: 0.5", R"(
  - name: newsvendor
    forecast: { method: oracle }
    quantity: { rule: critical_fractile })"));
  const RunResult r = test::run_scenario(s);
  check_against_closed_form(r, 0, 24, 3.0, 1.0, 0.5, 0.5);
  const Newsvendor n = exact_poisson(20, 24);
  CHECK(3 * n.sales + 0.5 * n.leftover - 24 - 0.5 * n.lost == Approx(36.5371977788).epsilon(1e-9));
}

TEST_CASE("in_stock_target orders the smallest Q with P(D <= Q - 1) >= level",
          "[engine][newsvendor]") {
  // Poisson(20): F(21) = 0.643698 < 0.70 <= F(22) = 0.720611 (checks.md 1.4), so Q = 23 and
  // the share of days with a unit left at close is F(22).
  const Scenario s = test::scenario_from(one_item("", R"(
  - name: in-stock-70
    forecast: { method: oracle }
    quantity: { rule: in_stock_target, level: 0.70, assume: poisson })"));
  const RunResult r = test::run_scenario(s);
  check_against_closed_form(r, 0, 23, 3.0, 1.0, 0.0, 0.0);
  CHECK(exact_poisson(20, 23).in_stock == Approx(0.7206113431).epsilon(1e-9));
}

}  // namespace
}  // namespace larder
