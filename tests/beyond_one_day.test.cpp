// Ordering rules beyond one day (lead times, items that keep, leftovers on a next-day
// discount), checked against exact optima of small Markov decision processes.
//
// The yardstick is tests/mdp/perishable_mdp.py: relative value iteration written in numpy /
// scipy.sparse from model.md, independently of larder's C++ (run
// `/usr/bin/python3 tests/mdp/perishable_mdp.py` to print the values pasted below). It
// reproduces the published optima of Hendrix, Ortega, Haijema, Buisman and Garcia (2019), "On
// computing optimal policies in perishable inventory control using value iteration",
// Computational and Mathematical Methods 1(4) e1027: Poisson(5), price 1, cost 0.5, FIFO, one
// period between order and arrival (larder's lead_time_days 2): 2.22 a day at shelf life 2 and
// 2.40 at shelf life 3.
//
// 1. larder's chain solver (policies/quantity/item_chain) reproduces the Python optima.
// 2. critical_fractile with oracle forecasts, simulated by the engine, earns at least 98% of
//    the optimum (4 standard errors of the replications allowed) and never more than it.
// 3. At a next-day discount it earns at least as much as the best fixed quantity (paired).

#include <fmt/format.h>

#include <catch2/catch.hpp>
#include <string>

#include "policies/quantity/item_chain.hpp"
#include "policies/quantity/rule_warnings.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

struct Case {
  const char* name;
  double mean;
  double price;
  double cost;
  int life;
  int lead;
  double fifo;
  int cap;
  double take;
  double discount_price;
  bool discount;
  double optimum;  ///< tests/mdp/perishable_mdp.py, profit per day
};

// Printed by `/usr/bin/python3 tests/mdp/perishable_mdp.py` (scipy 1.10.1, numpy 1.24.2).
constexpr Case kCases[] = {
    {"life2_lead1_fifo1.0", 5, 1, 0.5, 2, 1, 1.0, 16, 0, 0, false, 2.288415760},
    {"life2_lead1_fifo0.5", 5, 1, 0.5, 2, 1, 0.5, 16, 0, 0, false, 2.148052071},
    {"life2_lead1_fifo0.0", 5, 1, 0.5, 2, 1, 0.0, 16, 0, 0, false, 2.063951059},
    {"life2_lead2_fifo1.0", 5, 1, 0.5, 2, 2, 1.0, 16, 0, 0, false, 2.215142996},
    {"life2_lead2_fifo0.5", 5, 1, 0.5, 2, 2, 0.5, 16, 0, 0, false, 2.040577447},
    {"life2_lead2_fifo0.0", 5, 1, 0.5, 2, 2, 0.0, 16, 0, 0, false, 1.874449821},
    {"life3_lead1_fifo1.0", 5, 1, 0.5, 3, 1, 1.0, 16, 0, 0, false, 2.450209584},
    {"life3_lead1_fifo0.5", 5, 1, 0.5, 3, 1, 0.5, 16, 0, 0, false, 2.343115852},
    {"life3_lead1_fifo0.0", 5, 1, 0.5, 3, 1, 0.0, 16, 0, 0, false, 2.224337499},
    {"life3_lead2_fifo1.0", 5, 1, 0.5, 3, 2, 1.0, 16, 0, 0, false, 2.398507520},
    {"life3_lead2_fifo0.5", 5, 1, 0.5, 3, 2, 0.5, 16, 0, 0, false, 2.246474246},
    {"life3_lead2_fifo0.0", 5, 1, 0.5, 3, 2, 0.0, 16, 0, 0, false, 2.080515605},
    {"discount_next_day", 20, 3, 1, 1, 1, 1.0, 40, 0.3, 1.5, true, 34.281574645},
    {"discount_next_day_lead2", 20, 3, 1, 1, 2, 1.0, 40, 0.3, 1.5, true, 33.652675655},
};

ChainSpec spec_of(const Case& c) {
  ChainSpec s;
  s.life = c.life;
  s.lead = c.lead;
  s.fifo_share = c.fifo;
  s.demand_pmf = truncated_pmf(DemandFamily::poisson, c.mean, c.mean);
  s.price = c.price;
  s.unit_cost = c.cost;
  s.discount_tier = c.discount;
  s.discount_price = c.discount_price;
  s.take_rate = c.take;
  s.cap = c.cap;
  return s;
}

std::string scenario_of(const Case& c, const std::string& policies) {
  const std::string leftovers = c.discount
                                    ? fmt::format(
                                          ", leftovers: discount_next_day, next_day: {{ price: {}, "
                                          "fallback: discard }}",
                                          c.discount_price)
                                    : "";
  return fmt::format(R"(
format: 1
name: beyond
seed: 11
horizon: {{ days: 2050, warmup_days: 50 }}
replications: 40
stores: [ {{ id: s }} ]
logistics: {{ lead_time_days: {} }}
customers: {{ fifo_share: {}, discount_take_rate: {} }}
items:
  - {{ id: x, price: {}, unit_cost: {}, shelf_life_days: {}, demand: {{ base: {} }}{} }}
policies:
{})",
                     c.lead, c.fifo, c.take, c.price, c.cost, c.life, c.mean, leftovers, policies);
}

TEST_CASE("the item chain's optimum equals the independent value iteration (Python)",
          "[mdp][quantity]") {
  for (const Case& c : kCases) {
    DYNAMIC_SECTION(c.name) {
      const ChainSpec s = spec_of(c);
      REQUIRE(ItemChain::fits(s));
      const ItemChain chain(s);
      CHECK(chain.optimal(1e-9).gain == Approx(c.optimum).epsilon(1e-6));
    }
  }
  // The published optima, to the two decimals given (Hendrix et al. 2019).
  CHECK(kCases[3].optimum == Approx(2.22).margin(0.005));
  CHECK(kCases[9].optimum == Approx(2.40).margin(0.005));
}

TEST_CASE("critical_fractile with oracle forecasts earns at least 98% of the exact optimum",
          "[mdp][quantity]") {
  for (const Case& c : kCases) {
    DYNAMIC_SECTION(c.name) {
      const Scenario sc = test::scenario_from(scenario_of(
          c,
          "  - { name: cf, forecast: { method: oracle }, quantity: { rule: critical_fractile } "
          "}\n"));
      const RunResult r = test::run_scenario(sc, 2);
      const Estimate e =
          test::metric_estimate(r, 0, Metric::profit, static_cast<double>(sc.scored_days()));
      INFO("profit a day " << e.mean << " +- " << e.stderr_ << ", optimum " << c.optimum);
      REQUIRE(e.stderr_ < 0.003 * c.optimum);  // precise enough to fail
      CHECK(e.mean >= 0.98 * c.optimum - 4.0 * e.stderr_);
      CHECK(e.mean <= c.optimum + 4.0 * e.stderr_);
    }
  }
}

TEST_CASE("at a next-day discount critical_fractile earns at least the best fixed quantity",
          "[mdp][quantity]") {
  const Case& c = kCases[12];
  std::string policies =
      "  - { name: cf, forecast: { method: oracle }, quantity: { rule: critical_fractile } }\n";
  for (int q = 16; q <= 23; ++q) {
    policies += fmt::format(
        "  - {{ name: f{}, forecast: {{ method: oracle }}, quantity: {{ rule: fixed, "
        "quantity: {} }} }}\n",
        q, q);
  }
  const Scenario sc = test::scenario_from(scenario_of(c, policies));
  const RunResult r = test::run_scenario(sc, 2);
  const auto cf = r.series(0, Metric::profit);
  double best = -1e300;
  int best_policy = 1;
  for (int k = 1; k < static_cast<int>(sc.policies.size()); ++k) {
    const auto v = r.series(k, Metric::profit);
    double m = 0.0;
    for (double x : v) m += x;
    if (m > best) {
      best = m;
      best_policy = k;
    }
  }
  // Paired differences on common random numbers.
  const auto fixed = r.series(best_policy, Metric::profit);
  std::vector<double> diff;
  for (size_t k = 0; k < cf.size(); ++k) diff.push_back(cf[k] - fixed[k]);
  const Estimate d = estimate_mean(diff);
  INFO("cf - " << sc.policies[static_cast<size_t>(best_policy)].name << " = " << d.mean << " +- "
               << d.stderr_);
  CHECK(d.mean >= -4.0 * d.stderr_);
}

}  // namespace
}  // namespace larder

namespace larder {
namespace {

TEST_CASE("check warns where a rule is known to be poor for an item", "[mdp][quantity]") {
  const Scenario sc = test::scenario_from(R"(
format: 1
name: warn
seed: 1
stores: [ { id: s } ]
items:
  - { id: bread, price: 3, unit_cost: 1, demand: { base: 20 } }
  - { id: bun, price: 3, unit_cost: 1, leftovers: discount_next_day, next_day: { price: 1.5 }, demand: { base: 20 } }
  - { id: cheese, price: 3, unit_cost: 1, shelf_life_days: 10, demand: { base: 200 } }
policies:
  - { name: bs, forecast: { method: oracle }, quantity: { rule: base_stock, level: 20 } }
  - { name: cf, forecast: { method: oracle }, quantity: { rule: critical_fractile } }
)");
  const auto w = rule_warnings(sc);
  // base_stock does not net bun's discounted units; cheese's chain is far too large (life 10,
  // about 220 units a day); bread is the plain newsvendor and bun's chain fits.
  REQUIRE(w.size() == 2);
  CHECK(w[0].find("policy 'bs': base_stock's level does not net item 'bun'") != std::string::npos);
  CHECK(w[1].find("item 'cheese': the leftover recovery value of policies 'cf' is approximated") !=
        std::string::npos);
}

}  // namespace
}  // namespace larder
