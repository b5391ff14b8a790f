// Waste-reduction rules compared in one run (README, "Leftover handling as part of a policy";
// model.md, steps 3-5):
// - a policy's `leftovers:` gives, for that policy, results bit-identical to the same handling
//   written on the items (the draws are keyed by coordinates and laid out for every policy's
//   needs at once, so a policy's customers do not depend on the other policies);
// - in one run, the policies meet the same customers (common random numbers), so their
//   differences are paired: with an ordering rule that does not look at the leftover handling
//   (in_stock_target), donating instead of discarding changes where the leftovers go and
//   nothing else (conservation of units, worked by hand);
// - surplus_units = wasted + donated + salvaged + sold at a discount, in every replication,
//   and donation never lowers it;
// - the surplus-only markdown earns at least as much as marking down every last-day unit where
//   most of them would sell at full price, and wastes less than no markdown (paired, 4 SE).

#include <fmt/format.h>

#include <algorithm>
#include <catch2/catch.hpp>
#include <cmath>
#include <string>
#include <vector>

#include "reports/sweep_csv.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

/// A small network: 3 stores with a `format` attribute, 3 items of one day, two days and three
/// days of shelf life, hours 8-20, profiles that put customers after 18:00.
std::string network(const std::string& item_extra, const std::string& policies,
                    int replications = 6) {
  return fmt::format(R"(
format: 1
name: rules
seed: 17
horizon: {{ days: 90, warmup_days: 14 }}
replications: {2}
calendar: {{ hours: {{ open: 8, close: 20 }} }}
stores:
  - {{ id: a, size: 1.2, attributes: {{ format: cafe }} }}
  - {{ id: b, size: 0.8, attributes: {{ format: cafe }} }}
  - {{ id: c, size: 1.0, attributes: {{ format: convenience }} }}
customers: {{ fifo_share: 0.5, discount_take_rate: 0.4 }}
item_defaults:
  weight_kg: 0.2
  co2e_kg: 0.5
  salvage_value: 0.1
  demand: {{ distribution: negative_binomial, cv: 0.4, intraday: evening_peak }}
items:
  - {{ id: wrap, price: 4, unit_cost: 1.8, attributes: {{ category: deli }}, demand: {{ base: 14 }}{0} }}
  - {{ id: bun, price: 2, unit_cost: 0.6, shelf_life_days: 2, attributes: {{ category: bakery }}, demand: {{ base: 20 }}{0} }}
  - {{ id: juice, price: 3, unit_cost: 1.2, shelf_life_days: 3, attributes: {{ category: drinks }}, demand: {{ base: 9 }}{0} }}
policies:
{1}
)",
                     item_extra, policies, replications);
}

constexpr const char* kToday =
    "  - { name: today, forecast: { method: ses_weekday }, quantity: { rule: in_stock_target, "
    "level: 0.8 } }\n";

std::string policy(const std::string& name, const std::string& quantity,
                   const std::string& leftovers = "") {
  return fmt::format("  - {{ name: {}, forecast: {{ method: ses_weekday }}, quantity: {}{} }}\n",
                     name, quantity, leftovers.empty() ? "" : ", leftovers: " + leftovers);
}

/// Every metric of every replication, and every breakdown value, exactly equal.
void require_identical(const RunResult& a, int pa, const RunResult& b, int pb) {
  const auto& va = a.values[static_cast<size_t>(pa)];
  const auto& vb = b.values[static_cast<size_t>(pb)];
  REQUIRE(va.size() == vb.size());
  for (size_t r = 0; r < va.size(); ++r) {
    for (size_t k = 0; k < kMetricCount; ++k) {
      INFO("replication " << r << ", " << metric_name(static_cast<Metric>(k)));
      REQUIRE(va[r][k] == vb[r][k]);
    }
  }
  const auto& ba = a.breakdown[static_cast<size_t>(pa)].values;
  const auto& bb = b.breakdown[static_cast<size_t>(pb)].values;
  REQUIRE(ba.size() == bb.size());
  for (size_t r = 0; r < ba.size(); ++r) {
    REQUIRE(ba[r].size() == bb[r].size());
    for (size_t g = 0; g < ba[r].size(); ++g) REQUIRE(ba[r][g] == bb[r][g]);
  }
}

TEST_CASE("policy leftovers are bit-identical to the same handling on the items",
          "[engine][tiers][waste_rules]") {
  // Each case: the policy's `leftovers:` value, and the same handling written on every item.
  struct Case {
    const char* name;
    const char* on_policy;
    const char* on_items;
    const char* quantity;
  };
  const Case cases[] = {
      {"donate", "donate", ", leftovers: donate", "{ rule: critical_fractile }"},
      {"salvage with a policy value", "{ rule: salvage, salvage_value: 0.3 }",
       ", leftovers: salvage, salvage_value: 0.3", "{ rule: critical_fractile }"},
      {"next-day discount with bargain customers",
       "{ rule: discount_next_day, next_day: { price: 1, fallback: donate, bargain_demand: 0.2 } "
       "}",
       ", leftovers: discount_next_day, next_day: { price: 1, fallback: donate, bargain_demand: "
       "0.2 }",
       "{ rule: in_stock_target, level: 0.8 }"},
      {"evening markdown", "{ markdown: { from_hour: 18, price: 1, uplift: 0.5 } }",
       ", markdown: { from_hour: 18, price: 1, uplift: 0.5 }",
       "{ rule: in_stock_target, level: 0.8 }"},
      {"surplus-only markdown",
       "{ markdown: { from_hour: 18, price: 1, uplift: 0.5, surplus_only: true } }",
       ", markdown: { from_hour: 18, price: 1, uplift: 0.5, surplus_only: true }",
       "{ rule: in_stock_target, level: 0.8 }"},
  };
  for (const Case& c : cases) {
    SECTION(c.name) {
      // One run with today's rule (discard) and the policy; one run of the policy alone on
      // items that carry the handling themselves.
      const Scenario both = test::scenario_from(
          network("", std::string(kToday) + policy("rule", c.quantity, c.on_policy)));
      const Scenario alone = test::scenario_from(network(c.on_items, policy("rule", c.quantity)));
      const RunResult r_both = test::run_scenario(both);
      const RunResult r_alone = test::run_scenario(alone);
      require_identical(r_both, 1, r_alone, 0);
      // In one run, both policies meet the same customers (common random numbers).
      for (size_t rep = 0; rep < r_both.values[0].size(); ++rep) {
        CHECK(at(r_both.values[0][rep], Metric::demand_units) ==
              at(r_both.values[1][rep], Metric::demand_units));
      }
      // The handling did something (the test could fail): the two policies of the first run
      // differ on waste.
      CHECK(test::metric_estimate(r_both, 0, Metric::waste_units).mean !=
            test::metric_estimate(r_both, 1, Metric::waste_units).mean);
    }
  }
}

TEST_CASE("policy leftovers can choose items by id or by attribute",
          "[engine][tiers][waste_rules]") {
  const std::string q = "{ rule: in_stock_target, level: 0.8 }";
  const Scenario by_where = test::scenario_from(network(
      "",
      std::string(kToday) + policy("rule", q, "{ rule: donate, where: { category: bakery } }")));
  const Scenario by_id = test::scenario_from(
      network("", std::string(kToday) + policy("rule", q, "{ rule: donate, items: [bun] }")));
  const RunResult a = test::run_scenario(by_where);
  const RunResult b = test::run_scenario(by_id);
  require_identical(a, 1, b, 1);
  // Only the bun is donated: the item breakdown shows donations for it alone.
  const PolicyBreakdown& bd = a.breakdown[1];
  for (size_t k = 0; k < bd.keys.size(); ++k) {
    if (bd.keys[k].dimension != "item") continue;
    const double donated = at(bd.values[0][k], Metric::donated_units);
    if (bd.keys[k].key == "bun") {
      CHECK(donated > 0);
    } else {
      CHECK(donated == 0);
    }
  }
}

TEST_CASE("discard against donate in one run: paired, on the same customers",
          "[engine][waste_rules]") {
  // in_stock_target orders from the forecast of sales, which the disposition does not touch,
  // so the two policies order, sell and lose exactly the same units every day; the discarded
  // units of one are the donated units of the other (conservation, worked by hand).
  const std::string q = "{ rule: in_stock_target, level: 0.8 }";
  const Scenario s =
      test::scenario_from(network("", std::string(kToday) + policy("donate", q, "donate")));
  const RunResult r = test::run_scenario(s);
  REQUIRE(r.values[0].size() == 6);
  for (size_t rep = 0; rep < r.values[0].size(); ++rep) {
    const MetricVector& today = r.values[0][rep];
    const MetricVector& donate = r.values[1][rep];
    CHECK(at(today, Metric::demand_units) == at(donate, Metric::demand_units));
    CHECK(at(today, Metric::sold_units) == at(donate, Metric::sold_units));
    CHECK(at(today, Metric::delivered_units) == at(donate, Metric::delivered_units));
    CHECK(at(today, Metric::waste_units) > 0);
    CHECK(at(donate, Metric::waste_units) == 0);
    CHECK(at(donate, Metric::donated_units) == at(today, Metric::waste_units));
    // Donation empties the bin, not the surplus.
    CHECK(at(donate, Metric::surplus_units) == at(today, Metric::surplus_units));
    CHECK(at(donate, Metric::donated_co2e_kg) == Approx(at(today, Metric::co2e_kg)));
  }
  // The paired difference of waste has no noise at all: every replication gives the same sign.
  const Estimate d = test::metric_estimate(r, 1, Metric::waste_units);
  CHECK(d.mean == 0);
}

TEST_CASE("surplus = wasted + donated + salvaged + discounted sales, in every replication",
          "[engine][waste_rules]") {
  const std::string q = "{ rule: in_stock_target, level: 0.8 }";
  const std::string cf = "{ rule: critical_fractile }";
  const Scenario s = test::scenario_from(network(
      "",
      std::string(kToday) + policy("donate", cf, "donate") + policy("salvage", cf, "salvage") +
          policy("next-day", q, "discount_next_day") +
          policy("markdown", q, "{ markdown: { from_hour: 18, uplift: 0.5 } }") +
          policy("surplus-md", q,
                 "{ rule: donate, markdown: { from_hour: 18, uplift: 0.5, surplus_only: true } }") +
          policy("mixed", q,
                 "{ rule: discount_next_day, next_day: { fallback: salvage }, items: [wrap] }")));
  const RunResult r = test::run_scenario(s);
  for (size_t p = 0; p < r.values.size(); ++p) {
    for (size_t rep = 0; rep < r.values[p].size(); ++rep) {
      const MetricVector& v = r.values[p][rep];
      INFO(r.policies[p] << ", replication " << rep);
      const double parts = at(v, Metric::waste_units) + at(v, Metric::donated_units) +
                           at(v, Metric::salvaged_units) + at(v, Metric::discounted_units);
      CHECK(at(v, Metric::surplus_units) == parts);
      CHECK(at(v, Metric::surplus_share) ==
            Approx(parts / at(v, Metric::delivered_units)).epsilon(1e-12));
      // Every item weighs 0.2 kg and carries 0.5 kg CO2e.
      CHECK(at(v, Metric::surplus_kg) == Approx(0.2 * parts));
      CHECK(at(v, Metric::surplus_co2e_kg) == Approx(0.5 * parts));
      CHECK(at(v, Metric::surplus_kg) ==
            Approx(at(v, Metric::waste_kg) + at(v, Metric::donated_kg) +
                   at(v, Metric::salvaged_kg) + at(v, Metric::discounted_kg)));
      CHECK(at(v, Metric::surplus_co2e_kg) ==
            Approx(at(v, Metric::co2e_kg) + at(v, Metric::donated_co2e_kg) +
                   at(v, Metric::salvaged_co2e_kg) + at(v, Metric::discounted_co2e_kg)));
      // Units are conserved: what was delivered was sold at full price, left in the surplus,
      // or is still on hand at the end (at most a few days of stock).
      CHECK(at(v, Metric::surplus_units) <= at(v, Metric::delivered_units));
    }
  }
  // Every disposition shows up somewhere.
  CHECK(test::metric_estimate(r, 1, Metric::donated_units).mean > 0);
  CHECK(test::metric_estimate(r, 2, Metric::salvaged_units).mean > 0);
  CHECK(test::metric_estimate(r, 3, Metric::discounted_units).mean > 0);
  CHECK(test::metric_estimate(r, 6, Metric::salvaged_units).mean > 0);
  // The surplus is reported; donation does not lower it against discarding (same orders with
  // critical_fractile: a donated unit recovers nothing, as a discarded one).
  const auto& m = r.metrics;
  CHECK(std::find(m.begin(), m.end(), Metric::surplus_units) != m.end());
  CHECK(std::find(m.begin(), m.end(), Metric::donated_co2e_kg) != m.end());
}

TEST_CASE("donation never lowers the surplus", "[engine][waste_rules]") {
  for (const std::string q :
       {"{ rule: critical_fractile }", "{ rule: in_stock_target, level: 0.7 }"}) {
    const Scenario s =
        test::scenario_from(network("", policy("discard", q) + policy("donate", q, "donate")));
    const RunResult r = test::run_scenario(s);
    for (size_t rep = 0; rep < r.values[0].size(); ++rep) {
      CHECK(at(r.values[1][rep], Metric::surplus_units) >=
            at(r.values[0][rep], Metric::surplus_units));
      CHECK(at(r.values[1][rep], Metric::waste_units) == 0);
    }
  }
}

TEST_CASE("the surplus-only markdown keeps full-price sales and still cuts waste",
          "[engine][tiers][waste_rules]") {
  // One-day items ordered for a unit left at close on 70% of days, a flat profile and a
  // markdown from 14:00 (half of the day's customers still to come): most units on the shelf
  // at 14:00 would sell at full price. Marking every one of them down sells them at half price
  // to the 40% of customers who take a discounted unit, and lets bargain-only customers
  // (uplift 0.5) take units that regular customers would have bought at full price later;
  // marking down only the expected surplus keeps those sales, and the bargain-only customers
  // still buy part of the surplus, which no policy sells without a markdown.
  const std::string text = R"(
format: 1
name: surplus-markdown
seed: 4242
horizon: { days: 120, warmup_days: 21 }
replications: 30
calendar: { hours: { open: 8, close: 20 } }
stores: [ { id: a, size: 1.0 }, { id: b, size: 1.5 }, { id: c, size: 0.7 } ]
customers: { fifo_share: 0.5, discount_take_rate: 0.4 }
item_defaults:
  demand: { distribution: negative_binomial, cv: 0.3, intraday: flat }
items:
  - { id: wrap, price: 4, unit_cost: 1.2, demand: { base: 30 } }
  - { id: salad, price: 5, unit_cost: 1.5, demand: { base: 18 } }
policies:
  - { name: none, forecast: { method: ses_weekday }, quantity: { rule: in_stock_target, level: 0.7 } }
  - name: all
    forecast: { method: ses_weekday }
    quantity: { rule: in_stock_target, level: 0.7 }
    leftovers: { markdown: { from_hour: 14, uplift: 0.5 } }
  - name: surplus
    forecast: { method: ses_weekday }
    quantity: { rule: in_stock_target, level: 0.7 }
    leftovers: { markdown: { from_hour: 14, uplift: 0.5, surplus_only: true } }
)";
  const RunResult r = test::run_scenario(test::scenario_from(text));
  const auto paired = [&](int a, int b, Metric m) {
    std::vector<double> d;
    for (size_t rep = 0; rep < r.values[0].size(); ++rep) {
      d.push_back(at(r.values[static_cast<size_t>(a)][rep], m) -
                  at(r.values[static_cast<size_t>(b)][rep], m));
    }
    return estimate_mean(d);
  };
  // Profit: surplus-only minus all, at least 0 within 4 standard errors, and the standard error
  // small against the profit (the check has power).
  const Estimate profit = paired(2, 1, Metric::profit);
  INFO("profit: surplus - all = " << profit.mean << " +- " << profit.stderr_);
  CHECK(profit.mean + 4 * profit.stderr_ >= 0);
  CHECK(profit.mean > 0);
  CHECK(profit.stderr_ < 0.01 * test::metric_estimate(r, 0, Metric::profit).mean);
  // Fewer units sold at a discount.
  CHECK(test::metric_estimate(r, 2, Metric::discounted_units).mean <
        0.5 * test::metric_estimate(r, 1, Metric::discounted_units).mean);
  // Waste: below no markdown by more than 4 standard errors of the paired difference.
  const Estimate waste = paired(2, 0, Metric::waste_units);
  INFO("waste: surplus - none = " << waste.mean << " +- " << waste.stderr_);
  CHECK(waste.mean + 4 * waste.stderr_ < 0);
}

TEST_CASE("breakdown.csv has store attributes", "[engine][waste_rules]") {
  const Scenario s = test::scenario_from(network(
      "", std::string(kToday) + policy("donate", "{ rule: critical_fractile }", "donate"), 2));
  const RunResult r = test::run_scenario(s);
  const PolicyBreakdown& b = r.breakdown[0];
  double cafe = -1;
  double convenience = -1;
  double by_store = 0;
  for (size_t k = 0; k < b.keys.size(); ++k) {
    const double demand = at(b.values[0][k], Metric::demand_units);
    if (b.keys[k].dimension == "store") by_store += demand;
    if (b.keys[k].dimension != "store:format") continue;
    if (b.keys[k].key == "cafe") cafe = demand;
    if (b.keys[k].key == "convenience") convenience = demand;
  }
  REQUIRE(cafe > 0);
  REQUIRE(convenience > 0);
  // The groups partition the stores: stores a and b are cafés, c is a convenience store.
  CHECK(cafe + convenience == by_store);
  CHECK(cafe + convenience == at(r.values[0][0], Metric::demand_units));
}

TEST_CASE("sweep frontiers read the surplus when a row donates", "[reports][waste_rules]") {
  const std::string q = "{ rule: in_stock_target, level: 0.8 }";
  const Scenario s =
      test::scenario_from(network("", std::string(kToday) + policy("donate", q, "donate"), 3));
  std::vector<SweepPoint> points(1);
  points[0].result = test::run_scenario(s);
  const FrontierMarks marks = sweep_frontiers(points);
  CHECK(marks.waste == Metric::surplus_share);
  // On waste alone donation would dominate (no waste, same in-stock); on the surplus the two
  // rows are the same point, so both are on the frontier.
  CHECK(marks.waste_in_stock[0]);
  CHECK(marks.waste_in_stock[1]);
  const Scenario plain = test::scenario_from(network("", std::string(kToday), 2));
  points[0].result = test::run_scenario(plain);
  CHECK(sweep_frontiers(points).waste == Metric::waste_share);
}

/// The first problem of a scenario that must not load.
std::string first_problem(const std::string& text) {
  Diagnostics diag;
  const auto s = parse_scenario(text, "rules.yaml", diag);
  REQUIRE_FALSE(s.has_value());
  return diag.format();
}

TEST_CASE("policy leftovers: errors with file, line and column",
          "[scenario][validation][waste_rules]") {
  const auto with = [](const std::string& leftovers) {
    return network("", std::string(kToday) +
                           "  - name: rule\n    forecast: { method: ses_weekday }\n    quantity: "
                           "{ rule: critical_fractile }\n    leftovers: " +
                           leftovers + "\n");
  };
  // Line 27 of the text: `    leftovers: ...` (line 1 is the empty line after R"(; counted by
  // hand), the value at column 16.
  CHECK_THAT(first_problem(with("compost")),
             Catch::Contains("rules.yaml:27:16") && Catch::Contains("compost"));
  CHECK_THAT(first_problem(with("{ rule: donate, items: [wrap, bunn] }")),
             Catch::Contains("rules.yaml:27:") && Catch::Contains("'bunn' is not an item id") &&
                 Catch::Contains("did you mean 'bun'"));
  CHECK_THAT(first_problem(with("{ rule: donate, where: { category: fish } }")),
             Catch::Contains("no item has category: fish"));
  CHECK_THAT(first_problem(with("{ rule: donate, items: [bun], where: { category: deli } }")),
             Catch::Contains("gives both items and where"));
  CHECK_THAT(first_problem(with("{ rule: donate, next_day: { price: 1 } }")),
             Catch::Contains("next_day is given but item 'wrap' has leftovers donate"));
  CHECK_THAT(first_problem(with("{ markdown: { from_hour: 18, price: 9 } }")),
             Catch::Contains("markdown.price (9) must be at most the price of item 'wrap' (4)"));
  CHECK_THAT(first_problem(with("{ rule: salvage, salvage_value: 1 }")),
             Catch::Contains("item 'bun' would be salvaged at 1 but costs 0.6"));
  CHECK_THAT(first_problem(with("{ items: [bun] }")),
             Catch::Contains("says nothing about leftovers"));
  CHECK_THAT(first_problem(with("{ rule: donate, colour: red }")), Catch::Contains("colour"));
  CHECK_THAT(first_problem(with("{ markdown: { from_hour: 21 } }")),
             Catch::Contains("from_hour must be after calendar.hours.open"));
}

TEST_CASE("the worked scenario waste_rules.yaml loads and its rules differ",
          "[scenario][waste_rules]") {
  Scenario s = load_scenario_file(std::string(LARDER_SOURCE_DIR) + "/scenarios/waste_rules.yaml");
  REQUIRE(s.policies.size() == 8);
  REQUIRE(s.stores.size() == 12);
  REQUIRE(s.items.size() == 10);
  CHECK(s.items_of(0)[0].leftovers == Leftovers::discard);
  CHECK(s.items_of(1)[0].next_day.has_value());
  CHECK(s.items_of(2)[0].markdown.has_value());
  CHECK_FALSE(s.items_of(2)[0].markdown->surplus_only);
  CHECK(s.items_of(3)[0].markdown->surplus_only);
  CHECK(s.items_of(4)[0].leftovers == Leftovers::donate);
  CHECK(s.items_of(5)[0].leftovers == Leftovers::salvage);
  CHECK(s.items_of(5)[0].salvage_value == 0.30);
  // A short run: a few days and replications, every policy.
  s.horizon.days = 21;
  s.horizon.warmup_days = 7;
  s.replications = 2;
  const RunResult r = test::run_scenario(s);
  CHECK(r.values.size() == 8);
  CHECK(test::metric_estimate(r, 4, Metric::waste_units).mean == 0);
}

}  // namespace
}  // namespace larder
