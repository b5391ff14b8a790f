// Tests of the scenario loader. Expected values come from the spec (scenario.md, model.md) or
// from the lead's brief for this loader ("brief"), named beside each check. Messages are checked
// whole: file, line, column, text and hint.

#include "sim/scenario/load_scenario.hpp"

#include <unistd.h>

#include <catch2/catch.hpp>
#include <filesystem>
#include <fstream>
#include <regex>
#include <string>
#include <utility>
#include <vector>

using larder::Diagnostics;
using larder::Scenario;
using Lines = std::vector<std::string>;

namespace {

// A minimal valid scenario, one key per line. `complete` appends every key that a test text does
// not write itself, so a test text starts at line 1 and its line numbers read directly.
const std::vector<std::pair<std::string, std::string>> kMinimal = {
    {"format", "format: 1"},
    {"name", "name: t"},
    {"seed", "seed: 7"},
    {"stores", "stores: [{ id: a }]"},
    {"items", "items: [{ id: bread, price: 2, unit_cost: 1, demand: { base: 10 } }]"},
    {"policies",
     "policies: [{ name: p, forecast: { method: oracle }, quantity: { rule: fixed } }]"},
};

std::string complete(std::string text) {
  for (const auto& [key, line] : kMinimal) {
    if (!std::regex_search(text, std::regex("(^|\n)" + key + ":"))) text += line + "\n";
  }
  return text;
}

Lines messages(const Diagnostics& d) {
  Lines out;
  for (const auto& item : d.items()) out.push_back(larder::format_diagnostic(item));
  return out;
}

/// The problems of a scenario text taken as it is.
Lines problems_exact(const std::string& text) {
  Diagnostics d;
  const auto s = larder::parse_scenario(text, "t.yaml", d);
  CHECK(s.has_value() == d.ok());
  return messages(d);
}

/// The problems of a test text completed with the minimal scenario.
Lines problems(const std::string& text) {
  return problems_exact(complete(text));
}

/// The scenario of a test text completed with the minimal scenario, which must be valid.
Scenario valid(const std::string& text) {
  Diagnostics d;
  auto s = larder::parse_scenario(complete(text), "t.yaml", d);
  INFO(d.format());
  REQUIRE(s.has_value());
  REQUIRE(d.ok());
  return *s;
}

constexpr const char* kWeekdays = "weekdays are mon, tue, wed, thu, fri, sat, sun";

}  // namespace

// ---------------------------------------------------------------------------------------------
// Valid scenarios

TEST_CASE("the example of scenario.md loads, newer keys included", "[scenario]") {
  // scenario.md's example, with the two items its substitutes name added (rye writing the item
  // keys sourdough leaves out), a store named on an event, adjustments on a policy, and a baseline
  // other than the first policy so that its check cannot pass by the default.
  const std::string text = R"(format: 1
name: harbourside-bakeries
seed: 20261202
horizon: { days: 364, warmup_days: 28, start_weekday: mon }
replications: 100
calendar:
  open_weekdays: [mon, tue, wed, thu, fri, sat]
  hours: { open: 7, close: 19 }
  events:
    - { day: 120, demand: 1.6 }
    - { day: 121, closed: true, stores: [station] }
currency: EUR
stores:
  - { id: quay, size: 1.3 }
  - { id: station, size: 0.8, open_weekdays: [mon, tue, wed, thu, fri] }
items:
  - id: sourdough
    attributes: { type: bread, sourcing: make }
    price: 4.20
    unit_cost: 1.35
    shelf_life_days: 1
    pack_size: 1
    leftovers: discard
    salvage_value: 0.0
    disposal_cost: 0.02
    weight_kg: 0.8
    demand:
      base: 22
      weekday: { mon: 0.9, sat: 1.4 }
      distribution: negative_binomial
      cv: 0.35
      intraday: morning_peak
    substitutes: { rye: 0.25, spelt: 0.15 }
  - id: rye
    price: 3.10
    unit_cost: 0.95
    shelf_life_days: 3
    pack_size: 6
    leftovers: salvage
    salvage_value: 0.40
    stockout_penalty: 0.5
    co2e_kg: 1.1
    demand: { base: 9, distribution: normal, dispersion: 4 }
  - { id: spelt, price: 3.60, unit_cost: 1.10, demand: { base: 6 } }
customers:
  fifo_share: 0.3
  discount_take_rate: 0.4
  goodwill: { sensitivity: 0.0, half_life_days: 14 }
demand_shocks:
  store_traffic_cv: 0.10
  persistence: { lag: 7, coefficient: 0.3, cv: 0.15 }
logistics: { lead_time_days: 1, delivery_weekdays: [mon, tue, wed, thu, fri, sat] }
policies:
  - name: current-practice
    forecast: { method: ses_weekday, alpha: 0.45 }
    censoring: ignore
    quantity: { rule: in_stock_target, level: 0.70, assume: normal }
  - name: per-item-levels
    forecast: { method: ses_weekday, alpha: 0.2 }
    censoring: normal_tail
    quantity: { rule: network_in_stock, target: 0.70, groups: item }
    adjustments: [pack_round, { method: cap_growth, factor: 2 }]
baseline: per-item-levels
)";
  Diagnostics d;
  const auto parsed = larder::parse_scenario(text, "harbour.yaml", d);
  INFO(d.format());
  REQUIRE(parsed);
  const Scenario& s = *parsed;
  CHECK(s.format == 1);
  CHECK(s.name == "harbourside-bakeries");
  CHECK(s.file == "harbour.yaml");
  CHECK(s.seed == 20261202u);
  CHECK(s.seed_given);
  CHECK(s.horizon.days == 364);
  CHECK(s.horizon.warmup_days == 28);
  CHECK(s.horizon.start_weekday == 0);
  CHECK_FALSE(s.horizon.start_date);
  CHECK(s.replications == 100);
  CHECK(s.calendar.open_weekdays == larder::WeekdaySet{true, true, true, true, true, true, false});
  CHECK(s.calendar.open_hour == 7);
  CHECK(s.calendar.close_hour == 19);
  CHECK(s.hours() == 12);
  REQUIRE(s.calendar.events.size() == 2);
  CHECK(s.calendar.events[0].day == 120);
  CHECK(s.calendar.events[0].demand == 1.6);
  CHECK_FALSE(s.calendar.events[0].closed);
  CHECK(s.calendar.events[0].stores.empty());
  CHECK(s.calendar.events[1].day == 121);
  CHECK(s.calendar.events[1].demand == 1.0);
  CHECK(s.calendar.events[1].closed);
  CHECK(s.calendar.events[1].stores == Lines{"station"});
  CHECK(s.currency == "EUR");

  REQUIRE(s.stores.size() == 2);
  CHECK(s.stores[0].id == "quay");
  CHECK(s.stores[0].size == 1.3);
  // scenario.md: a store without open_weekdays takes the calendar's.
  CHECK(s.stores[0].open_weekdays == s.calendar.open_weekdays);
  CHECK(s.stores[1].id == "station");
  CHECK(s.stores[1].size == 0.8);
  CHECK(s.stores[1].open_weekdays ==
        larder::WeekdaySet{true, true, true, true, true, false, false});

  REQUIRE(s.items.size() == 3);
  const larder::Item& sd = s.items[0];
  CHECK(sd.id == "sourdough");
  CHECK(sd.attributes ==
        std::map<std::string, std::string>{{"sourcing", "make"}, {"type", "bread"}});
  CHECK(sd.price == 4.20);
  CHECK(sd.unit_cost == 1.35);
  CHECK(sd.shelf_life_days == 1);
  CHECK(sd.pack_size == 1);
  CHECK(sd.leftovers == larder::Leftovers::discard);
  CHECK(sd.salvage_value == 0.0);
  CHECK(sd.disposal_cost == 0.02);
  CHECK(sd.stockout_penalty == 0.0);
  CHECK(sd.weight_kg == 0.8);
  CHECK_FALSE(sd.co2e_kg);
  CHECK(sd.demand.base == 22);
  // scenario.md: weekday multipliers, missing days = 1.
  CHECK(sd.demand.weekday == std::array<double, 7>{0.9, 1, 1, 1, 1, 1.4, 1});
  CHECK(sd.demand.family == larder::DemandFamily::negative_binomial);
  CHECK(sd.demand.cv == 0.35);
  CHECK_FALSE(sd.demand.dispersion);
  CHECK(sd.demand.intraday == "morning_peak");
  CHECK(sd.demand.intraday_weights.empty());
  // substitutes: rye is items[1], spelt items[2], in the order written.
  REQUIRE(sd.substitutes.size() == 2);
  CHECK(sd.substitutes[0].item == 1);
  CHECK(sd.substitutes[0].share == 0.25);
  CHECK(sd.substitutes[1].item == 2);
  CHECK(sd.substitutes[1].share == 0.15);
  CHECK_FALSE(sd.next_day);
  CHECK_FALSE(sd.markdown);
  const larder::Item& rye = s.items[1];
  CHECK(rye.id == "rye");
  CHECK(rye.attributes.empty());
  CHECK(rye.price == 3.10);
  CHECK(rye.unit_cost == 0.95);
  CHECK(rye.shelf_life_days == 3);
  CHECK(rye.pack_size == 6);
  CHECK(rye.leftovers == larder::Leftovers::salvage);
  CHECK(rye.salvage_value == 0.40);
  CHECK(rye.stockout_penalty == 0.5);
  CHECK_FALSE(rye.weight_kg);
  CHECK(rye.co2e_kg == 1.1);
  CHECK(rye.demand.base == 9);
  CHECK(rye.demand.family == larder::DemandFamily::normal);
  CHECK_FALSE(rye.demand.cv);
  CHECK(rye.demand.dispersion == 4);
  CHECK(rye.demand.intraday == "flat");
  CHECK(rye.substitutes.empty());
  const larder::Item& spelt = s.items[2];
  CHECK(spelt.id == "spelt");
  CHECK(spelt.price == 3.60);
  CHECK(spelt.unit_cost == 1.10);
  CHECK(spelt.demand.base == 6);
  CHECK(spelt.substitutes.empty());

  CHECK(s.fifo_share == 0.3);
  CHECK(s.discount_take_rate == 0.4);
  CHECK(s.goodwill.sensitivity == 0.0);
  CHECK(s.goodwill.half_life_days == 14);
  CHECK(s.shocks.store_traffic_cv == 0.10);
  CHECK(s.shocks.persistence_lag == 7);
  CHECK(s.shocks.persistence_coefficient == 0.3);
  CHECK(s.shocks.persistence_cv == 0.15);
  CHECK(s.logistics.lead_time_days == 1);
  CHECK(s.logistics.delivery_weekdays ==
        larder::WeekdaySet{true, true, true, true, true, true, false});

  REQUIRE(s.policies.size() == 2);
  const larder::PolicySpec& cur = s.policies[0];
  CHECK(cur.name == "current-practice");
  CHECK(cur.where.line == 54);
  CHECK(cur.forecast.method == "ses_weekday");
  CHECK(cur.forecast.path == "policies[0].forecast");
  CHECK(cur.forecast.where.file == "harbour.yaml");
  CHECK(cur.forecast.where.line == 55);
  CHECK(cur.forecast.where.column == 15);
  // brief: params is the whole part node as written, for the part to validate.
  CHECK(cur.forecast.params["alpha"].as<double>() == 0.45);
  CHECK(cur.censoring.method == "ignore");
  CHECK(cur.censoring.path == "policies[0].censoring");
  CHECK(cur.censoring.params.IsScalar());
  CHECK(cur.quantity.method == "in_stock_target");
  CHECK(cur.quantity.path == "policies[0].quantity");
  CHECK(cur.quantity.params["assume"].as<std::string>() == "normal");
  CHECK(cur.adjustments.empty());
  const larder::PolicySpec& pil = s.policies[1];
  CHECK(pil.name == "per-item-levels");
  CHECK(pil.censoring.method == "normal_tail");
  CHECK(pil.quantity.method == "network_in_stock");
  CHECK(pil.quantity.params["groups"].as<std::string>() == "item");
  REQUIRE(pil.adjustments.size() == 2);
  CHECK(pil.adjustments[0].method == "pack_round");
  CHECK(pil.adjustments[0].path == "policies[1].adjustments[0]");
  CHECK(pil.adjustments[1].method == "cap_growth");
  CHECK(pil.adjustments[1].path == "policies[1].adjustments[1]");
  CHECK(pil.adjustments[1].params["factor"].as<int>() == 2);
  CHECK(pil.adjustments[1].where.line == 62);
  CHECK(s.baseline == 1);
}

TEST_CASE("defaults apply to every key left out", "[scenario]") {
  const Scenario s = valid("");
  // Defaults in brackets in scenario.md.
  CHECK(s.horizon.days == 364);
  CHECK(s.horizon.warmup_days == 28);
  CHECK(s.horizon.start_weekday == 0);
  CHECK(s.replications == 100);
  CHECK(s.calendar.open_weekdays == larder::kAllWeekdays);  // [all seven]
  CHECK(s.calendar.open_hour == 8);                         // [8 to 20]
  CHECK(s.calendar.close_hour == 20);
  CHECK(s.calendar.events.empty());
  CHECK(s.fifo_share == 0.5);          // [0.5]
  CHECK(s.discount_take_rate == 0.5);  // brief: discount_take_rate [0.5]
  CHECK(s.logistics.lead_time_days == 1);
  CHECK(s.logistics.delivery_weekdays == larder::kAllWeekdays);
  CHECK(s.baseline == 0);  // [first policy]
  REQUIRE(s.stores.size() == 1);
  CHECK(s.stores[0].size == 1.0);
  CHECK(s.stores[0].open_weekdays == larder::kAllWeekdays);
  REQUIRE(s.items.size() == 1);
  const larder::Item& i = s.items[0];
  // brief: shelf_life_days [1], pack_size [1], leftovers [discard], salvage, disposal and
  // stockout penalty [0], weight and CO2e optional, distribution [poisson].
  CHECK(i.shelf_life_days == 1);
  CHECK(i.pack_size == 1);
  CHECK(i.leftovers == larder::Leftovers::discard);
  CHECK(i.salvage_value == 0.0);
  CHECK(i.disposal_cost == 0.0);
  CHECK(i.stockout_penalty == 0.0);
  CHECK_FALSE(i.weight_kg);
  CHECK_FALSE(i.co2e_kg);
  CHECK(i.demand.family == larder::DemandFamily::poisson);
  CHECK(i.demand.weekday == std::array<double, 7>{1, 1, 1, 1, 1, 1, 1});
  CHECK_FALSE(i.demand.cv);
  CHECK_FALSE(i.demand.dispersion);
  // brief: intraday ["flat"]; no substitutes, next-day discount or markdown unless written.
  CHECK(i.demand.intraday == "flat");
  CHECK(i.demand.intraday_weights.empty());
  CHECK(i.substitutes.empty());
  CHECK_FALSE(i.next_day);
  CHECK_FALSE(i.markdown);
  REQUIRE(s.policies.size() == 1);
  CHECK_FALSE(s.policies[0].observe_intraday);        // brief: observe [daily]
  CHECK(s.policies[0].censoring.method == "ignore");  // brief: censoring [ignore]
  CHECK(s.policies[0].censoring.path == "policies[0].censoring");
  CHECK(s.policies[0].adjustments.empty());
}

TEST_CASE("without a seed one is drawn and marked as not given", "[scenario]") {
  // scenario.md: seed [random: printed so the run can be repeated].
  Diagnostics d;
  const auto s = larder::parse_scenario(
      "format: 1\nname: t\nstores: [{ id: a }]\n"
      "items: [{ id: b, price: 1, unit_cost: 1, demand: { base: 1 } }]\n"
      "policies: [{ name: p, forecast: { method: oracle }, quantity: { rule: fixed } }]\n",
      "t.yaml", d);
  REQUIRE(s);
  CHECK_FALSE(s->seed_given);
}

TEST_CASE("start_date sets the start weekday", "[scenario]") {
  // GNU coreutils `date -u -d 2026-12-02 +%A`: Wednesday (index 2, Monday = 0).
  const Scenario s = valid("horizon: { start_date: 2026-12-02 }\n");
  CHECK(s.horizon.start_weekday == 2);
  CHECK(s.horizon.start_date == "2026-12-02");
  CHECK(s.weekday_of(5) == 0);  // five days after a Wednesday is a Monday
}

TEST_CASE("item_defaults merge into every item, the item's keys winning", "[scenario]") {
  const Scenario s = valid(R"(item_defaults:
  unit_cost: 1
  shelf_life_days: 2
  attributes: { type: bread, sourcing: make }
  demand: { distribution: negative_binomial, cv: 0.3, weekday: { sat: 1.5 } }
items:
  - { id: a, price: 3, attributes: { sourcing: buy }, demand: { base: 10 } }
  - { id: b, price: 2, unit_cost: 0.5, demand: { base: 5, weekday: { mon: 0.5 } } }
)");
  REQUIRE(s.items.size() == 2);
  const larder::Item& a = s.items[0];
  // brief: nested mappings (demand, attributes) merge key by key, the item's keys win.
  CHECK(a.unit_cost == 1);
  CHECK(a.shelf_life_days == 2);
  CHECK(a.attributes == std::map<std::string, std::string>{{"sourcing", "buy"}, {"type", "bread"}});
  CHECK(a.demand.base == 10);
  CHECK(a.demand.family == larder::DemandFamily::negative_binomial);
  CHECK(a.demand.cv == 0.3);
  CHECK(a.demand.weekday == std::array<double, 7>{1, 1, 1, 1, 1, 1.5, 1});
  const larder::Item& b = s.items[1];
  CHECK(b.unit_cost == 0.5);
  CHECK(b.attributes ==
        std::map<std::string, std::string>{{"sourcing", "make"}, {"type", "bread"}});
  CHECK(b.demand.base == 5);
  CHECK(b.demand.cv == 0.3);
  // demand.weekday is one key of demand: the item's mapping replaces the default's whole.
  CHECK(b.demand.weekday == std::array<double, 7>{0.5, 1, 1, 1, 1, 1, 1});
}

TEST_CASE("generated stores", "[scenario]") {
  const Scenario s = valid("stores: { count: 12, size: { lognormal_cv: 0.3 } }\n");
  REQUIRE(s.stores.size() == 12);
  // scenario.md: generated ids s001...
  CHECK(s.stores[0].id == "s001");
  CHECK(s.stores[11].id == "s012");
  CHECK(s.stores[0].size != s.stores[1].size);
  CHECK(s.stores[0].size > 0);
  // The same seed gives the same sizes.
  CHECK(valid("stores: { count: 12, size: { lognormal_cv: 0.3 } }\n").stores[5].size ==
        s.stores[5].size);
  const Scenario flat = valid("stores: { count: 3 }\n");
  for (const auto& st : flat.stores) CHECK(st.size == 1.0);  // brief: cv absent = all 1
}

TEST_CASE("calendar events may name stores, and stores may list weekdays", "[scenario]") {
  const Scenario s = valid(R"(calendar:
  open_weekdays: [tue, mon]
  events: [{ day: 3, demand: 0, stores: [a] }]
stores: [{ id: a, open_weekdays: [sun], attributes: { region: north } }, { id: b }]
logistics: { delivery_weekdays: [mon, tue, wed, thu, fri, sat, sun] }
)");
  CHECK(s.calendar.open_weekdays ==
        larder::WeekdaySet{true, true, false, false, false, false, false});
  CHECK(s.calendar.events[0].stores == Lines{"a"});
  CHECK(s.stores[0].open_weekdays ==
        larder::WeekdaySet{false, false, false, false, false, false, true});
  CHECK(s.stores[0].attributes.at("region") == "north");
  CHECK(s.stores[1].open_weekdays == s.calendar.open_weekdays);
}

TEST_CASE("policy parts keep their own keys unchecked", "[scenario]") {
  // brief: the part validates its own keys later, so the loader reports none inside it.
  const Scenario s = valid(
      "policies: [{ name: p, forecast: { method: x, anything: 1 }, censoring: { method: drop, "
      "weeks: 4 }, quantity: { rule: y, whatever: [1, 2] } }]\n");
  CHECK(s.policies[0].forecast.method == "x");
  CHECK(s.policies[0].censoring.method == "drop");
  CHECK(s.policies[0].censoring.params["weeks"].as<int>() == 4);
  CHECK(s.policies[0].quantity.method == "y");
}

// ---------------------------------------------------------------------------------------------
// The file as a whole

TEST_CASE("YAML syntax errors carry the parser's line and column", "[scenario]") {
  // yaml-cpp 0.7 reports "illegal map value" at the second ':' (0-based column 4).
  CHECK(problems_exact("a: b: c\n") == Lines{"t.yaml:1:5: error: invalid YAML: illegal map value"});
}

TEST_CASE("an empty file, several documents or a non-mapping are rejected", "[scenario]") {
  CHECK(problems_exact("") ==
        Lines{"t.yaml: error: the scenario is empty\n  hint: a scenario starts with `format: 1`"});
  CHECK(problems_exact("format: 1\n---\nname: x\n") ==
        Lines{"t.yaml:3:1: error: a scenario file holds one YAML document (found 2)\n"
              "  hint: remove the `---` separator"});
  CHECK(problems_exact("- format\n- 1\n") ==
        Lines{"t.yaml:1:1: error: a scenario must be a mapping of keys to values such as "
              "`format: 1` (got a list)"});
}

TEST_CASE("unknown keys are errors with a did-you-mean hint", "[scenario]") {
  // scenario.md: unknown keys are errors (a typo must never be silently ignored).
  CHECK(
      problems("sede: 1\n") ==
      Lines{"t.yaml:1:1: error: unknown key 'sede' in the scenario\n  hint: did you mean 'seed'?"});
  CHECK(problems("horizon: { dayz: 30 }\n") ==
        Lines{"t.yaml:1:12: error: unknown key 'dayz' in horizon\n  hint: did you mean 'days'?"});
  CHECK(problems("stores: [{ id: a, colour: red }]\n") ==
        Lines{"t.yaml:1:19: error: unknown key 'colour' in stores[0]"});
  CHECK(problems("items: [{ id: a, price: 1, unit_cost: 1, demand: { base: 1, bsae: 2 } }]\n") ==
        Lines{"t.yaml:1:61: error: unknown key 'bsae' in items[0].demand\n"
              "  hint: did you mean 'base'?"});
  CHECK(problems("policies: [{ name: p, forecast: { method: x }, quantity: { rule: y }, "
                 "observ: intraday }]\n") ==
        Lines{"t.yaml:1:71: error: unknown key 'observ' in policies[0]\n"
              "  hint: did you mean 'observe'?"});
}

TEST_CASE("a key given twice in one mapping is an error at the second", "[scenario]") {
  CHECK(problems("seed: 1\nseed: 2\n") ==
        Lines{"t.yaml:2:1: error: duplicate key 'seed' in the scenario\n"
              "  hint: 'seed' is first given at line 1"});
  CHECK(problems("horizon: { days: 30, days: 40 }\n") ==
        Lines{"t.yaml:1:22: error: duplicate key 'days' in horizon\n"
              "  hint: 'days' is first given at line 1"});
  CHECK(problems("items:\n  - id: a\n    price: 1\n    unit_cost: 1\n    demand:\n      base: 1\n"
                 "      base: 2\n") ==
        Lines{"t.yaml:7:7: error: duplicate key 'base' in items[0].demand\n"
              "  hint: 'base' is first given at line 6"});
  // Inside policy parts too: the part would otherwise see only the first.
  CHECK(problems("policies: [{ name: p, forecast: { method: x, method: y }, quantity: { rule: z } "
                 "}]\n") ==
        Lines{"t.yaml:1:46: error: duplicate key 'method' in policies[0].forecast\n"
              "  hint: 'method' is first given at line 1"});
}

TEST_CASE("several problems in one file are all reported, in file order", "[scenario]") {
  // brief: every problem goes to diag, all at once, never just the first.
  CHECK(problems(R"(replications: 0
horizon: { days: 0 }
items:
  - id: a
    price: -1
    unit_cost: 1
    shelf_life_days: 0
    demand: { base: 1 }
policies: [{ name: p, forecast: { method: x }, quantity: { rule: y } }]
baseline: q
)") == Lines{"t.yaml:1:15: error: replications must be in [1, 1000000] (got 0)",
             "t.yaml:2:18: error: horizon.days must be in [1, 100000] (got 0)",
             "t.yaml:5:12: error: items[0].price must be in [0, 1000000000] (got -1)",
             "t.yaml:7:22: error: items[0].shelf_life_days must be in [1, 365] (got 0)",
             "t.yaml:10:11: error: baseline 'q' is not one of the policies (p)\n"
             "  hint: did you mean 'p'?"});
}

TEST_CASE("a missing file is one diagnostic without a line", "[scenario]") {
  const std::string path = "/nonexistent-larder-dir/none.yaml";
  try {
    larder::load_scenario_file(path);
    FAIL("no exception");
  } catch (const larder::InputError& e) {
    // POSIX strerror(ENOENT): "No such file or directory".
    CHECK(messages(e.diagnostics()) ==
          Lines{path + ": error: cannot read the scenario: No such file or directory"});
  }
}

TEST_CASE("a file is read and its problems thrown with its path", "[scenario]") {
  const auto dir = std::filesystem::temp_directory_path() /
                   ("larder-scenario-test-" + std::to_string(::getpid()));
  std::filesystem::create_directories(dir);
  const std::string good = (dir / "good.yaml").string();
  const std::string bad = (dir / "bad.yaml").string();
  std::ofstream(good) << complete("");
  std::ofstream(bad) << complete("replications: -2\n");
  CHECK(larder::load_scenario_file(good).file == good);
  try {
    larder::load_scenario_file(bad);
    FAIL("no exception");
  } catch (const larder::InputError& e) {
    CHECK(messages(e.diagnostics()) ==
          Lines{bad + ":1:15: error: replications must be in [1, 1000000] (got -2)"});
    CHECK(std::string(e.what()) ==
          bad + ":1:15: error: replications must be in [1, 1000000] (got -2)\n");
  }
  try {
    larder::load_scenario_file(dir.string());
    FAIL("no exception");
  } catch (const larder::InputError& e) {
    CHECK(messages(e.diagnostics()) ==
          Lines{dir.string() + ": error: cannot read the scenario: it is a directory"});
  }
  std::filesystem::remove_all(dir);
}

TEST_CASE("nothing throws out of parse_scenario, whatever the shapes", "[scenario]") {
  // brief: sequences given where a mapping is expected (and vice versa) give a message.
  for (const std::string text :
       {"format: [1]\nname: {a: 1}\nseed: [1]\nhorizon: [1]\nreplications: {}\ncalendar: [1]\n"
        "currency: [a]\nstores: {count: [1], size: 3}\nitems: [[1], {id: [a], demand: [1], "
        "attributes: 3}]\nitem_defaults: 4\ncustomers: [1]\nlogistics: 3\npolicies: {a: 1}\n"
        "baseline: [1]\n",
        "calendar: { open_weekdays: {a: 1}, hours: [1], events: [[1], {day: [1], stores: "
        "{a: 1}}] }\nitems: [{ id: a, price: {}, demand: { weekday: 3, base: [1] } }]\n"
        "policies: [{ name: [p], forecast: [1], censoring: {}, quantity: { rule: {a: 1} }, "
        "adjustments: {a: 1} }]\n",
        "item_defaults: { next_day: [1], markdown: { from_hour: [1], price: {} }, substitutes: 1, "
        "demand: { intraday: [[1], {}] } }\nitems: [{ id: a, price: 1, unit_cost: 1, demand: "
        "{ base: 1, intraday: {a: 1} }, leftovers: [x], substitutes: { [a]: 1, b: [1], c: {} }, "
        "next_day: { fallback: [1], price: [] }, markdown: [] }, { id: b, substitutes: [1] }]\n"
        "customers: { discount_take_rate: {} }\npolicies: [{ observe: [1] }]\n",
        "calendar: { hours: { open: [1] } }\nitems: [{ id: a, price: 1, unit_cost: 1, demand: "
        "{ base: 1, intraday: [1] }, markdown: { from_hour: 99 }, substitutes: { ~: 1 } }]\n",
        "? [a, b]\n: 1\n", "&a [*a]\n", "a: &x {b: *x}\n", "--- !!map\n", "%YAML 1.2\n---\n1\n"}) {
    Diagnostics d;
    CHECK_NOTHROW(larder::parse_scenario(text, "t.yaml", d));
    CHECK_FALSE(d.ok());
  }
}

// ---------------------------------------------------------------------------------------------
// format, name, seed

TEST_CASE("format is required and must be 1", "[scenario]") {
  // scenario.md: "The format carries a `format: 1` key".
  CHECK(problems_exact("name: t\n") ==
        Lines{"t.yaml:1:1: error: format is required\n"
              "  hint: add `format: 1` at the top of the file",
              "t.yaml:1:1: error: stores is required\n"
              "  hint: list them, e.g. stores: [{ id: quay }], or generate them: "
              "stores: { count: 10 }",
              "t.yaml:1:1: error: items is required\n"
              "  hint: e.g. items: [{ id: bread, price: 2, unit_cost: 0.8, demand: { base: 20 } }]",
              "t.yaml:1:1: error: policies is required\n"
              "  hint: e.g. policies: [{ name: current, forecast: { method: ses_weekday }, "
              "quantity: { rule: in_stock_target, level: 0.7 } }]"});
  CHECK(problems("format: 2\n") == Lines{"t.yaml:1:9: error: format must be 1 (got 2)\n"
                                         "  hint: this version of larder reads format 1"});
  CHECK(problems("format: one\n") == Lines{"t.yaml:1:9: error: format must be a number (got one)"});
}

TEST_CASE("name is required and is an id", "[scenario]") {
  // brief: ids/names use letters, digits, '_', '-', '.' only (folder names and CSV).
  CHECK(
      problems_exact("format: 1\nseed: 1\nstores: [{ id: a }]\n"
                     "items: [{ id: b, price: 1, unit_cost: 1, demand: { base: 1 } }]\n"
                     "policies: [{ name: p, forecast: { method: o }, quantity: { rule: f } }]\n") ==
      Lines{"t.yaml:1:1: error: name is required"});
  CHECK(problems("name: my shop\n") ==
        Lines{"t.yaml:1:7: error: name must use only letters, digits, '_', '-' and '.' "
              "(got 'my shop')"});
  CHECK(problems("name: ..\n") == Lines{"t.yaml:1:7: error: name must not be '..'"});
  CHECK(problems("name: ''\n") == Lines{"t.yaml:1:7: error: name must not be empty"});
  CHECK(problems("name: [a]\n") ==
        Lines{"t.yaml:1:7: error: name must be a single value (got a list)"});
}

TEST_CASE("seed is an unsigned 64-bit integer", "[scenario]") {
  CHECK(valid("seed: 18446744073709551615\n").seed == 18446744073709551615u);  // 2^64 - 1
  CHECK(problems("seed: -3\n") ==
        Lines{"t.yaml:1:7: error: seed must be a whole number in [0, 18446744073709551615] "
              "(got -3)"});
  CHECK(problems("seed: 18446744073709551616\n") ==  // 2^64
        Lines{"t.yaml:1:7: error: seed must be a whole number in [0, 18446744073709551615] "
              "(got 18446744073709551616)"});
  CHECK(problems("seed: 1.5\n") ==
        Lines{"t.yaml:1:7: error: seed must be a whole number in [0, 18446744073709551615] "
              "(got 1.5)"});
}

// ---------------------------------------------------------------------------------------------
// horizon, replications

TEST_CASE("horizon ranges", "[scenario]") {
  // brief: days [364] >= 1, warmup_days [28] in [0, days-1].
  CHECK(problems("horizon: { days: 0 }\n") ==
        Lines{"t.yaml:1:18: error: horizon.days must be in [1, 100000] (got 0)"});
  CHECK(problems("horizon: { days: 2.5 }\n") ==
        Lines{"t.yaml:1:18: error: horizon.days must be a whole number (got 2.5)"});
  CHECK(problems("horizon: { days: 1e12 }\n") ==
        Lines{"t.yaml:1:18: error: horizon.days must be in [1, 100000] (got 1e12)"});
  CHECK(problems("horizon: { days: 10, warmup_days: 10 }\n") ==
        Lines{"t.yaml:1:35: error: horizon.warmup_days must be in [0, 9] (got 10)"});
  CHECK(problems("horizon: { warmup_days: -1 }\n") ==
        Lines{"t.yaml:1:25: error: horizon.warmup_days must be in [0, 363] (got -1)"});
  CHECK(problems("horizon: { days: 20 }\n") ==
        Lines{"t.yaml:1:18: error: horizon.warmup_days defaults to 28, which needs horizon.days "
              ">= 29 (got 20)\n  hint: set horizon.warmup_days below horizon.days"});
  CHECK(valid("horizon: { days: 20, warmup_days: 19 }\n").scored_days() == 1);
  CHECK(problems("horizon: 364\n") ==
        Lines{"t.yaml:1:10: error: horizon must be a mapping of keys to values (got 364)"});
}

TEST_CASE("horizon start: a weekday or an ISO date, not both", "[scenario]") {
  CHECK(valid("horizon: { start_weekday: sat }\n").horizon.start_weekday == 5);
  CHECK(problems("horizon: { start_weekday: mon, start_date: 2027-01-04 }\n") ==
        Lines{"t.yaml:1:44: error: horizon.start_weekday and horizon.start_date are both given\n"
              "  hint: start_date sets the weekday: give only one of them"});
  CHECK(problems("horizon: { start_weekday: Monday }\n") ==
        Lines{"t.yaml:1:27: error: horizon.start_weekday must be a weekday name (got Monday)\n"
              "  hint: did you mean 'mon'? " +
              std::string(kWeekdays)});
  CHECK(problems("horizon: { start_weekday: 1 }\n") ==
        Lines{"t.yaml:1:27: error: horizon.start_weekday must be a weekday name (got 1)\n"
              "  hint: " +
              std::string(kWeekdays)});
  CHECK(problems("horizon: { start_date: 2027-1-4 }\n") ==
        Lines{"t.yaml:1:24: error: horizon.start_date must be an ISO date YYYY-MM-DD "
              "(got 2027-1-4)"});
  // Gregorian calendar: 2027 is not a leap year.
  CHECK(problems("horizon: { start_date: 2027-02-29 }\n") ==
        Lines{"t.yaml:1:24: error: horizon.start_date is not a date in the calendar "
              "(got 2027-02-29)"});
}

TEST_CASE("replications in [1, 1000000]", "[scenario]") {
  CHECK(problems("replications: 0\n") ==
        Lines{"t.yaml:1:15: error: replications must be in [1, 1000000] (got 0)"});
  CHECK(problems("replications: 1000001\n") ==
        Lines{"t.yaml:1:15: error: replications must be in [1, 1000000] (got 1000001)"});
  CHECK(problems("replications: many\n") ==
        Lines{"t.yaml:1:15: error: replications must be a number (got many)"});
}

// ---------------------------------------------------------------------------------------------
// calendar

TEST_CASE("weekday lists", "[scenario]") {
  // brief: weekday names mon tue wed thu fri sat sun (lower case).
  CHECK(problems("calendar: { open_weekdays: [mon, tues] }\n") ==
        Lines{"t.yaml:1:34: error: calendar.open_weekdays[1] must be a weekday name (got tues)\n"
              "  hint: did you mean 'tue'? " +
              std::string(kWeekdays)});
  CHECK(problems("calendar: { open_weekdays: [mon, mon] }\n") ==
        Lines{"t.yaml:1:34: error: calendar.open_weekdays lists 'mon' twice"});
  CHECK(problems("calendar: { open_weekdays: mon }\n") ==
        Lines{"t.yaml:1:28: error: calendar.open_weekdays must be a list of weekdays such as "
              "[mon, tue] (got mon)"});
  CHECK(problems("calendar: { open_weekdays: [] }\n") ==
        Lines{"t.yaml:1:28: error: calendar.open_weekdays must list at least one weekday"});
  CHECK(problems("stores: [{ id: a, open_weekdays: [sun, [mon]] }]\n") ==
        Lines{"t.yaml:1:40: error: stores[0].open_weekdays[1] must be a weekday name (got a list)\n"
              "  hint: " +
              std::string(kWeekdays)});
}

TEST_CASE("opening hours", "[scenario]") {
  // brief: 0 <= open < close <= 24, integers.
  CHECK(problems("calendar: { hours: { open: 20, close: 8 } }\n") ==
        Lines{"t.yaml:1:39: error: calendar.hours.open (20) must be before calendar.hours.close "
              "(8)"});
  CHECK(problems("calendar: { hours: { open: 21 } }\n") ==
        Lines{"t.yaml:1:28: error: calendar.hours.open (21) must be before calendar.hours.close "
              "(20)"});
  CHECK(problems("calendar: { hours: { close: 25 } }\n") ==
        Lines{"t.yaml:1:29: error: calendar.hours.close must be in [0, 24] (got 25)"});
  CHECK(problems("calendar: { hours: { open: 7.5 } }\n") ==
        Lines{"t.yaml:1:28: error: calendar.hours.open must be a whole number (got 7.5)"});
  CHECK(problems("calendar: { hours: { opens: 7 } }\n") ==
        Lines{"t.yaml:1:22: error: unknown key 'opens' in calendar.hours\n"
              "  hint: did you mean 'open'?"});
}

TEST_CASE("calendar events", "[scenario]") {
  // brief: events are { day in [0, days-1], demand >= 0 [1], closed [false], stores }.
  CHECK(problems("calendar: { events: { day: 1 } }\n") ==
        Lines{"t.yaml:1:21: error: calendar.events must be a list of events such as "
              "[{ day: 120, demand: 1.6 }] (got a mapping)"});
  CHECK(problems("calendar: { events: [120] }\n") ==
        Lines{"t.yaml:1:22: error: calendar.events[0] must be a mapping such as "
              "{ day: 120, demand: 1.6 } (got 120)"});
  CHECK(problems("calendar:\n  events:\n    - { demand: 2 }\n") ==
        Lines{"t.yaml:3:7: error: calendar.events[0].day is required\n"
              "  hint: day is the day index from the start of the horizon"});
  // brief: day in [0, days-1].
  CHECK(problems("horizon: { days: 30, warmup_days: 0 }\ncalendar: { events: [{ day: 30 }] }\n") ==
        Lines{"t.yaml:2:29: error: calendar.events[0].day must be in [0, 29] (got 30)"});
  CHECK(problems("calendar: { events: [{ day: 1, demand: -1 }] }\n") ==
        Lines{"t.yaml:1:40: error: calendar.events[0].demand must be in [0, 1000] (got -1)"});
  CHECK(problems("calendar: { events: [{ day: 1, closed: maybe }] }\n") ==
        Lines{"t.yaml:1:40: error: calendar.events[0].closed must be true or false (got maybe)"});
}

TEST_CASE("calendar events name existing stores", "[scenario]") {
  // scenario.md: referenced ids must exist.
  const std::string stores = "stores: [{ id: quay }, { id: station }]\n";
  CHECK(problems("calendar: { events: [{ day: 1, stores: [quai] }] }\n" + stores) ==
        Lines{"t.yaml:1:41: error: calendar.events[0].stores[0] 'quai' is not a store id\n"
              "  hint: did you mean 'quay'?"});
  CHECK(problems("calendar: { events: [{ day: 1, stores: [quay, harbour] }] }\n" + stores) ==
        Lines{"t.yaml:1:47: error: calendar.events[0].stores[1] 'harbour' is not a store id\n"
              "  hint: the stores are quay, station"});
  CHECK(problems("calendar: { events: [{ day: 1, stores: [] }] }\n") ==
        Lines{"t.yaml:1:40: error: calendar.events[0].stores must list at least one store id\n"
              "  hint: leave stores out to apply the event to every store"});
  CHECK(problems("calendar: { events: [{ day: 1, stores: quay }] }\n" + stores) ==
        Lines{"t.yaml:1:40: error: calendar.events[0].stores must be a list of store ids "
              "(got quay)"});
}

// ---------------------------------------------------------------------------------------------
// stores

TEST_CASE("store lists", "[scenario]") {
  // brief: stores is a list of { id, size [1] > 0, open_weekdays, attributes } or generated.
  CHECK(problems("stores: 5\n") ==
        Lines{"t.yaml:1:9: error: stores must be a list of stores or a mapping such as "
              "{ count: 40, size: { lognormal_cv: 0.3 } } (got 5)"});
  CHECK(problems("stores: []\n") ==
        Lines{"t.yaml:1:9: error: stores must list at least one store"});
  CHECK(problems("stores: [quay]\n") ==
        Lines{"t.yaml:1:10: error: stores[0] must be a mapping such as { id: quay, size: 1.3 } "
              "(got quay)"});
  CHECK(problems("stores: [{ size: 2 }]\n") ==
        Lines{"t.yaml:1:10: error: stores[0].id is required"});
  CHECK(problems("stores: [{ id: a/b }]\n") ==
        Lines{"t.yaml:1:16: error: stores[0].id must use only letters, digits, '_', '-' and '.' "
              "(got 'a/b')"});
  // brief: duplicate ids are an error at the second, with a hint naming the line of the first.
  CHECK(problems("stores:\n  - { id: quay }\n  - { id: quay }\n") ==
        Lines{"t.yaml:3:11: error: stores[1].id 'quay' is already used by stores[0]\n"
              "  hint: stores[0].id is at line 2"});
  // brief: size [1] > 0.
  CHECK(problems("stores: [{ id: a, size: 0 }]\n") ==
        Lines{"t.yaml:1:25: error: stores[0].size must be in (0, 1000] (got 0)"});
  CHECK(problems("stores: [{ id: a, size: .inf }]\n") ==
        Lines{"t.yaml:1:25: error: stores[0].size must be a finite number (got .inf)"});
}

TEST_CASE("attributes map names to single values", "[scenario]") {
  // brief: attributes map string -> string; names go into CSV, so they are ids.
  CHECK(problems("stores: [{ id: a, attributes: [x] }]\n") ==
        Lines{"t.yaml:1:31: error: stores[0].attributes must be a mapping from name to value "
              "such as { type: bread } (got a list)"});
  CHECK(problems("stores: [{ id: a, attributes: { region: [n] } }]\n") ==
        Lines{"t.yaml:1:41: error: stores[0].attributes.region must be a single non-empty value "
              "(got a list)"});
  CHECK(problems("stores: [{ id: a, attributes: { 'my region': n } }]\n") ==
        Lines{"t.yaml:1:33: error: attribute name in stores[0].attributes must use only letters, "
              "digits, '_', '-' and '.' (got 'my region')"});
  CHECK(problems("items: [{ id: a, price: 1, unit_cost: 1, demand: { base: 1 }, "
                 "attributes: { type: '' } }]\n") ==
        Lines{"t.yaml:1:83: error: items[0].attributes.type must be a single non-empty value "
              "(got )"});
}

TEST_CASE("generated stores: count and size checks", "[scenario]") {
  // brief: generated stores are { count: N, size: { lognormal_cv: v } }, cv >= 0.
  CHECK(problems("stores: { size: { lognormal_cv: 0.3 } }\n") ==
        Lines{"t.yaml:1:9: error: stores.count is required\n"
              "  hint: generated stores need a count, e.g. stores: { count: 40 }"});
  CHECK(problems("stores: { count: 0 }\n") ==
        Lines{"t.yaml:1:18: error: stores.count must be in [1, 1000000] (got 0)"});
  CHECK(problems("stores: { count: 3, size: { lognormal_cv: -0.1 } }\n") ==
        Lines{"t.yaml:1:43: error: stores.size.lognormal_cv must be in [0, 10] (got -0.1)"});
  CHECK(problems("stores: { count: 3, id: x }\n") ==
        Lines{"t.yaml:1:21: error: unknown key 'id' in stores"});
  CHECK(problems("stores: { count: 3, size: 0.3 }\n") ==
        Lines{"t.yaml:1:27: error: stores.size must be a mapping of keys to values (got 0.3)"});
}

// ---------------------------------------------------------------------------------------------
// items

TEST_CASE("item lists and ids", "[scenario]") {
  // brief: items is a list; ids unique (error at the second, hint naming the first's line).
  CHECK(problems("items: { id: a }\n") ==
        Lines{"t.yaml:1:8: error: items must be a list of items (got a mapping)"});
  CHECK(problems("items: []\n") == Lines{"t.yaml:1:8: error: items must list at least one item"});
  CHECK(problems("items: [bread]\n") ==
        Lines{"t.yaml:1:9: error: items[0] must be a mapping such as { id: bread, price: 2, ... } "
              "(got bread)"});
  CHECK(problems("items: [{ price: 1, unit_cost: 1, demand: { base: 1 } }]\n") ==
        Lines{"t.yaml:1:9: error: items[0].id is required"});
  CHECK(problems("items:\n  - { id: a, price: 1, unit_cost: 1, demand: { base: 1 } }\n"
                 "  - { id: a, price: 1, unit_cost: 1, demand: { base: 1 } }\n") ==
        Lines{"t.yaml:3:11: error: items[1].id 'a' is already used by items[0]\n"
              "  hint: items[0].id is at line 2"});
}

TEST_CASE("item numbers are range-checked", "[scenario]") {
  // brief (and scenario.md: prices >= 0, shelf life >= 1): the range of every item number.
  const std::vector<std::pair<std::string, std::string>> cases = {
      {"price: -1", "items[0].price must be in [0, 1000000000] (got -1)"},
      {"unit_cost: -1", "items[0].unit_cost must be in [0, 1000000000] (got -1)"},
      {"shelf_life_days: 0", "items[0].shelf_life_days must be in [1, 365] (got 0)"},
      {"shelf_life_days: 1.5", "items[0].shelf_life_days must be a whole number (got 1.5)"},
      {"pack_size: 0", "items[0].pack_size must be in [1, 1000000] (got 0)"},
      {"salvage_value: -1", "items[0].salvage_value must be in [0, 1000000000] (got -1)"},
      {"disposal_cost: -1", "items[0].disposal_cost must be in [0, 1000000000] (got -1)"},
      {"stockout_penalty: -1", "items[0].stockout_penalty must be in [0, 1000000000] (got -1)"},
      {"weight_kg: -1", "items[0].weight_kg must be in [0, 1000000000] (got -1)"},
      {"co2e_kg: -1", "items[0].co2e_kg must be in [0, 1000000000] (got -1)"},
      {"price: cheap", "items[0].price must be a number (got cheap)"},
  };
  for (const auto& [line, message] : cases) {
    const std::string key = line.substr(0, line.find(':'));
    std::string text = "items:\n  - id: a\n    " + line + "\n";
    if (key != "price") text += "    price: 2\n";
    if (key != "unit_cost") text += "    unit_cost: 1\n";
    text += "    demand: { base: 1 }\n";
    // The value is on line 3, after "    <key>: ".
    const int column = 4 + static_cast<int>(key.size()) + 3;
    CHECK(problems(text) == Lines{"t.yaml:3:" + std::to_string(column) + ": error: " + message});
  }
}

TEST_CASE("required item keys", "[scenario]") {
  // brief: price and unit_cost required; demand.base required.
  CHECK(problems("items: [{ id: a, unit_cost: 1, demand: { base: 1 } }]\n") ==
        Lines{"t.yaml:1:9: error: items[0].price is required"});
  CHECK(problems("items:\n  - id: a\n    price: 1\n    unit_cost:\n    demand: { base: 1 }\n") ==
        Lines{"t.yaml:4:5: error: items[0].unit_cost is required"});
  CHECK(problems("items: [{ id: a, price: 1, unit_cost: 1 }]\n") ==
        Lines{"t.yaml:1:9: error: items[0].demand is required\n  hint: e.g. demand: { base: 20 }"});
  CHECK(problems("items: [{ id: a, price: 1, unit_cost: 1, demand: { cv: 1 } }]\n") ==
        Lines{"t.yaml:1:50: error: items[0].demand.base is required\n"
              "  hint: base is the mean demand per open day at a size-1 store",
              "t.yaml:1:56: error: items[0].demand.cv is given but poisson has no spread "
              "parameter\n  hint: remove cv, or set distribution: negative_binomial or normal"});
  CHECK(problems("items: [{ id: a, price: 1, unit_cost: 1, demand: 5 }]\n") ==
        Lines{"t.yaml:1:50: error: items[0].demand must be a mapping of keys to values (got 5)"});
}

TEST_CASE("leftovers", "[scenario]") {
  // scenario.md: leftovers is discard | salvage | donate | discount_next_day.
  const std::string head = "items:\n  - { id: a, price: 2, unit_cost: 1, demand: { base: 1 }, ";
  // Column of the first value after head on line 2.
  CHECK(problems(head + "leftovers: compost }\n") ==
        Lines{"t.yaml:2:70: error: items[0].leftovers must be one of discard, salvage, donate, "
              "discount_next_day (got compost)"});
  CHECK(valid(head + "leftovers: donate }\n").items[0].leftovers == larder::Leftovers::donate);
  // brief: salvage value must be below unit cost when leftovers is salvage.
  CHECK(problems(head + "leftovers: salvage, salvage_value: 1 }\n") ==
        Lines{"t.yaml:2:94: error: items[0].salvage_value (1) must be less than items[0].unit_cost "
              "(1) when leftovers is salvage\n"
              "  hint: otherwise every extra unit ordered would pay"});
  CHECK(valid(head + "leftovers: salvage, salvage_value: 0.5 }\n").items[0].salvage_value == 0.5);
  // A salvage value without salvage leftovers is harmless.
  CHECK(valid(head + "salvage_value: 3 }\n").items[0].salvage_value == 3);
}

TEST_CASE("demand weekday multipliers", "[scenario]") {
  // scenario.md: weekday multipliers by weekday name; brief: multipliers >= 0.
  const std::string head = "items: [{ id: a, price: 1, unit_cost: 1, demand: { base: 1, weekday: ";
  CHECK(problems(head + "{ mon: 0.9, Sat: 1.4 } } }]\n") ==
        Lines{"t.yaml:1:82: error: items[0].demand.weekday has a key that is not a weekday "
              "(got Sat)\n  hint: did you mean 'sat'? " +
              std::string(kWeekdays)});
  CHECK(problems(head + "{ sat: -1 } } }]\n") ==
        Lines{"t.yaml:1:77: error: items[0].demand.weekday.sat must be in [0, 1000] (got -1)"});
  CHECK(problems(head + "[1, 1] } }]\n") ==
        Lines{"t.yaml:1:70: error: items[0].demand.weekday must be a mapping from weekday to "
              "number such as { mon: 0.9 } (got a list)"});
}

TEST_CASE("demand distribution and its spread parameter", "[scenario]") {
  const std::string head = "items: [{ id: a, price: 1, unit_cost: 1, demand: { base: 1, ";
  CHECK(problems(head + "distribution: gamma } }]\n") ==
        Lines{"t.yaml:1:75: error: items[0].demand.distribution must be one of poisson, "
              "negative_binomial, normal (got gamma)"});
  // brief: negative_binomial and normal need exactly one of cv or dispersion.
  CHECK(problems(head + "distribution: negative_binomial } }]\n") ==
        Lines{"t.yaml:1:75: error: items[0].demand.distribution negative_binomial needs cv or "
              "dispersion\n  hint: add cv (variance = (cv * mean)^2) or dispersion (variance = "
              "mean + mean^2 / dispersion)"});
  CHECK(problems(head + "distribution: normal, cv: 0.2, dispersion: 3 } }]\n") ==
        Lines{"t.yaml:1:104: error: items[0].demand gives both cv and dispersion; normal takes "
              "exactly one\n  hint: remove one of them"});
  // model.md: poisson has no spread parameter.
  CHECK(problems(head + "dispersion: 3 } }]\n") ==
        Lines{"t.yaml:1:73: error: items[0].demand.dispersion is given but poisson has no spread "
              "parameter\n  hint: remove dispersion, or set distribution: negative_binomial or "
              "normal"});
  CHECK(problems(head + "distribution: normal, cv: -0.5 } }]\n") ==
        Lines{"t.yaml:1:87: error: items[0].demand.cv must be in [0, 100] (got -0.5)"});
  CHECK(problems(head + "distribution: normal, dispersion: -2 } }]\n") ==
        Lines{"t.yaml:1:95: error: items[0].demand.dispersion must be >= 0.001 (got -2)"});
}

TEST_CASE("item_defaults are checked where they are written", "[scenario]") {
  CHECK(
      problems("item_defaults: [1]\n") ==
      Lines{"t.yaml:1:16: error: item_defaults must be a mapping of keys to values (got a list)"});
  CHECK(
      problems("item_defaults: { id: x }\n") ==
      Lines{
          "t.yaml:1:18: error: item_defaults cannot set id\n  hint: every item gives its own id"});
  // Reported once at item_defaults, not once per item.
  CHECK(
      problems("item_defaults: { disposal_cost: -1 }\n"
               "items: [{ id: a, price: 1, unit_cost: 1, demand: { base: 1 } }, "
               "{ id: b, price: 1, unit_cost: 1, demand: { base: 1 } }]\n") ==
      Lines{"t.yaml:1:33: error: item_defaults.disposal_cost must be in [0, 1000000000] (got -1)"});
  CHECK(problems("item_defaults: { prise: 1 }\n") ==
        Lines{"t.yaml:1:18: error: unknown key 'prise' in item_defaults\n"
              "  hint: did you mean 'price'?"});
  // A default fills a required key.
  CHECK(
      valid("item_defaults: { price: 5 }\nitems: [{ id: a, unit_cost: 1, demand: { base: 1 } }]\n")
          .items[0]
          .price == 5);
  // A spread parameter from the defaults and another from the item: both given.
  CHECK(problems(
            "item_defaults: { demand: { distribution: normal, cv: 0.2 } }\n"
            "items: [{ id: a, price: 1, unit_cost: 1, demand: { base: 1, dispersion: 2 } }]\n") ==
        Lines{"t.yaml:2:73: error: items[0].demand gives both cv and dispersion; normal takes "
              "exactly one\n  hint: cv comes from item_defaults (line 1); remove one of them"});
}

TEST_CASE("unknown item keys", "[scenario]") {
  CHECK(
      problems("items: [{ id: a, prize: 1, unit_cost: 1, demand: { base: 1 } }]\n") ==
      Lines{"t.yaml:1:9: error: items[0].price is required",
            "t.yaml:1:18: error: unknown key 'prize' in items[0]\n  hint: did you mean 'price'?"});
  CHECK(
      problems("items: [{ id: a, price: 1, unit_cost: 1, demand: { base: 1 }, markdwon: {} }]\n") ==
      Lines{"t.yaml:1:63: error: unknown key 'markdwon' in items[0]\n"
            "  hint: did you mean 'markdown'?"});
}

// ---------------------------------------------------------------------------------------------
// customers, logistics, demand shocks

TEST_CASE("customers", "[scenario]") {
  // brief: fifo_share in [0, 1].
  CHECK(problems("customers: { fifo_share: 1.5 }\n") ==
        Lines{"t.yaml:1:26: error: customers.fifo_share must be in [0, 1] (got 1.5)"});
  // scenario.md: discount_take_rate is a share of customers, a probability [0.5].
  CHECK(valid("customers: { discount_take_rate: 0.4 }\n").discount_take_rate == 0.4);
  CHECK(valid("customers: { discount_take_rate: 0 }\n").discount_take_rate == 0.0);
  CHECK(problems("customers: { discount_take_rate: 1.2 }\n") ==
        Lines{"t.yaml:1:34: error: customers.discount_take_rate must be in [0, 1] (got 1.2)"});
  // model.md, Demand: goodwill sensitivity in [0, 1], half-life in days > 0.
  const Scenario g = valid("customers: { goodwill: { sensitivity: 0.5, half_life_days: 10 } }\n");
  CHECK(g.goodwill.sensitivity == 0.5);
  CHECK(g.goodwill.half_life_days == 10);
  CHECK(problems("customers: { goodwill: { sensitivity: 2 } }\n") ==
        Lines{"t.yaml:1:39: error: customers.goodwill.sensitivity must be in [0, 1] (got 2)"});
  CHECK(problems("customers: { goodwill: { half_life_days: 0 } }\n") ==
        Lines{"t.yaml:1:42: error: customers.goodwill.half_life_days must be > 0 (got 0)"});
}

TEST_CASE("logistics", "[scenario]") {
  CHECK(valid("logistics: { lead_time_days: 2 }\n").logistics.lead_time_days == 2);
  // brief: lead_time_days integer >= 1.
  CHECK(problems("logistics: { lead_time_days: 0 }\n") ==
        Lines{"t.yaml:1:30: error: logistics.lead_time_days must be in [1, 365] (got 0)"});
  // model.md: deliveries only happen on delivery weekdays.
  const Scenario d = valid("logistics: { delivery_weekdays: [mon, wed, fri] }\n");
  const larder::WeekdaySet mon_wed_fri = {true, false, true, false, true, false, false};
  CHECK(d.logistics.delivery_weekdays == mon_wed_fri);
  CHECK(problems("logistics: { delivery_weekdays: [mon, funday] }\n") ==
        Lines{"t.yaml:1:39: error: logistics.delivery_weekdays[1] must be a weekday name (got "
              "funday)\n  hint: weekdays are mon, tue, wed, thu, fri, sat, sun"});
}

TEST_CASE("demand shocks", "[scenario]") {
  // model.md, Demand: a store traffic shock with a cv, and AR(1) persistence at lag 1 or 7.
  const Scenario s = valid(
      "demand_shocks: { store_traffic_cv: 0.1, persistence: { lag: 7, coefficient: 0.3, cv: "
      "0.15 } }\n");
  CHECK(s.shocks.store_traffic_cv == 0.1);
  CHECK(s.shocks.persistence_lag == 7);
  CHECK(s.shocks.persistence_coefficient == 0.3);
  CHECK(s.shocks.persistence_cv == 0.15);
  CHECK(problems("demand_shocks: { store_traffic_cv: -0.1 }\n") ==
        Lines{"t.yaml:1:36: error: demand_shocks.store_traffic_cv must be >= 0 (got -0.1)"});
  CHECK(problems("demand_shocks: { persistence: { lag: 3, coefficient: 0.5 } }\n") ==
        Lines{"t.yaml:1:38: error: demand_shocks.persistence.lag must be 1 or 7 (got 3)\n"
              "  hint: 1: yesterday carries over; 7: the same weekday last week carries over"});
  CHECK(problems("demand_shocks: { persistence: { lag: 1, coefficient: 1 } }\n") ==
        Lines{"t.yaml:1:54: error: demand_shocks.persistence.coefficient must be in [0, 1) (got "
              "1)"});
}

// ---------------------------------------------------------------------------------------------
// policies, baseline

TEST_CASE("policy lists and names", "[scenario]") {
  // brief: policies is a non-empty list; names unique and in the id character set.
  CHECK(problems("policies: { name: p }\n") ==
        Lines{"t.yaml:1:11: error: policies must be a list of policies (got a mapping)"});
  CHECK(problems("policies: []\n") ==
        Lines{"t.yaml:1:11: error: policies must list at least one policy"});
  CHECK(problems("policies: [p]\n") ==
        Lines{"t.yaml:1:12: error: policies[0] must be a mapping with a name, a forecast and a "
              "quantity (got p)"});
  CHECK(problems("policies: [{ forecast: { method: x }, quantity: { rule: y } }]\n") ==
        Lines{"t.yaml:1:12: error: policies[0].name is required"});
  CHECK(problems("policies: [{ name: a b, forecast: { method: x }, quantity: { rule: y } }]\n") ==
        Lines{"t.yaml:1:20: error: policies[0].name must use only letters, digits, '_', '-' and "
              "'.' (got 'a b')"});
  CHECK(problems("policies:\n  - { name: p, forecast: { method: x }, quantity: { rule: y } }\n"
                 "  - { name: p, forecast: { method: x }, quantity: { rule: y } }\n") ==
        Lines{"t.yaml:3:13: error: policies[1].name 'p' is already used by policies[0]\n"
              "  hint: policies[0].name is at line 2"});
}

TEST_CASE("policy parts", "[scenario]") {
  // brief: forecast needs a method, quantity a rule; censoring and adjustments may be a bare
  // method name. policies.md: the four parts of a policy.
  const std::string name = "policies: [{ name: p, ";
  CHECK(problems(name + "quantity: { rule: y } }]\n") ==
        Lines{"t.yaml:1:12: error: policies[0].forecast is required\n"
              "  hint: e.g. forecast: { method: ses_weekday }"});
  CHECK(problems(name + "forecast: oracle, quantity: { rule: y } }]\n") ==
        Lines{"t.yaml:1:33: error: policies[0].forecast must be a mapping with a method "
              "(got oracle)\n  hint: write { method: oracle }"});
  CHECK(problems(name + "forecast: { alpha: 0.3 }, quantity: { rule: y } }]\n") ==
        Lines{"t.yaml:1:33: error: policies[0].forecast.method is required"});
  CHECK(problems(name + "forecast: { method: [a] }, quantity: { rule: y } }]\n") ==
        Lines{"t.yaml:1:43: error: policies[0].forecast.method must be a name (got a list)"});
  CHECK(problems(name + "forecast: { method: x } }]\n") ==
        Lines{"t.yaml:1:12: error: policies[0].quantity is required\n"
              "  hint: e.g. quantity: { rule: in_stock_target }"});
  CHECK(problems(name + "forecast: { method: x }, quantity: { level: 0.7 } }]\n") ==
        Lines{"t.yaml:1:58: error: policies[0].quantity.rule is required"});
  CHECK(problems(name + "forecast: { method: x }, quantity: fixed }]\n") ==
        Lines{"t.yaml:1:58: error: policies[0].quantity must be a mapping with a rule (got fixed)\n"
              "  hint: write { rule: fixed }"});
  CHECK(problems(name + "forecast: { method: x }, censoring: [drop], quantity: { rule: y } }]\n") ==
        Lines{"t.yaml:1:59: error: policies[0].censoring must be a method name or a mapping with "
              "a method (got a list)"});
  CHECK(problems(name + "forecast: { method: x }, quantity: { rule: y }, adjustments: pack_round "
                        "}]\n") ==
        Lines{"t.yaml:1:84: error: policies[0].adjustments must be a list such as [pack_round] "
              "(got pack_round)"});
  CHECK(
      problems(name + "forecast: { method: x }, quantity: { rule: y }, adjustments: [[a]] }]\n") ==
      Lines{"t.yaml:1:85: error: policies[0].adjustments[0] must be a method name or a mapping "
            "with a method (got a list)"});
  CHECK(problems(name + "forecast: { method: x }, quantity: { rule: y }, adjustments: [{ k: 2 }] "
                        "}]\n") ==
        Lines{"t.yaml:1:85: error: policies[0].adjustments[0].method is required"});
}

TEST_CASE("baseline names a policy", "[scenario]") {
  const std::string two =
      "policies:\n  - { name: current, forecast: { method: x }, quantity: { rule: y } }\n"
      "  - { name: new, forecast: { method: x }, quantity: { rule: y } }\n";
  CHECK(valid(two + "baseline: new\n").baseline == 1);
  // brief: an unknown name is an error listing the names.
  CHECK(problems(two + "baseline: currnet\n") ==
        Lines{"t.yaml:4:11: error: baseline 'currnet' is not one of the policies (current, new)\n"
              "  hint: did you mean 'current'?"});
  CHECK(problems(two + "baseline: zzzzzz\n") ==
        Lines{"t.yaml:4:11: error: baseline 'zzzzzz' is not one of the policies (current, new)"});
}

TEST_CASE("shelf capacity", "[scenario]") {
  // model.md, step 6: orders are capped by shelf capacity when it is set (units, >= 1).
  CHECK(valid("item_defaults: { shelf_capacity: 30 }\n").items[0].shelf_capacity == 30);
  CHECK(!valid("").items[0].shelf_capacity.has_value());
  CHECK(
      problems("item_defaults: { shelf_capacity: 0 }\n") ==
      Lines{"t.yaml:1:34: error: item_defaults.shelf_capacity must be in [1, 1000000000] (got 0)"});
}

// ---------------------------------------------------------------------------------------------
// intraday profiles, substitution, discounted tiers, observation

TEST_CASE("demand.intraday: a profile name or one weight per opening hour", "[scenario]") {
  // scenario.md: "a named profile or a list of hourly weights"; intraday_profile.hpp: the names.
  const std::string head = "items: [{ id: a, price: 2, unit_cost: 1, demand: { base: 1, intraday: ";
  for (const char* name : {"flat", "morning_peak", "midday_peak", "evening_peak"}) {
    const Scenario s = valid(head + name + " } }]\n");
    CHECK(s.items[0].demand.intraday == name);
    CHECK(s.items[0].demand.intraday_weights.empty());
  }
  // Opening hours 9 to 13 are four hours: four weights, kept as written.
  const std::string hours = "calendar: { hours: { open: 9, close: 13 } }\n";
  const Scenario w = valid(hours + head + "[0, 2, 1.5, 0.5] } }]\n");
  CHECK(w.items[0].demand.intraday_weights == std::vector<double>{0, 2, 1.5, 0.5});

  // The value starts at column 71 of line 1 (line 2 after `hours`).
  CHECK(problems(head + "mornin_peak } }]\n") ==
        Lines{"t.yaml:1:71: error: items[0].demand.intraday must be a profile name (flat, "
              "morning_peak, midday_peak, evening_peak) or a list of hourly weights (got "
              "mornin_peak)\n  hint: did you mean 'morning_peak'?"});
  CHECK(problems(head + "lunch } }]\n") ==
        Lines{"t.yaml:1:71: error: items[0].demand.intraday must be a profile name (flat, "
              "morning_peak, midday_peak, evening_peak) or a list of hourly weights (got "
              "lunch)"});
  CHECK(problems(head + "{ am: 2 } } }]\n") ==
        Lines{"t.yaml:1:71: error: items[0].demand.intraday must be a profile name (flat, "
              "morning_peak, midday_peak, evening_peak) or a list of hourly weights such as "
              "[1, 2, 1] (got a mapping)"});
  // brief: the default calendar opens 8 to 20, twelve hours.
  CHECK(problems(head + "[1, 2, 3] } }]\n") ==
        Lines{"t.yaml:1:71: error: items[0].demand.intraday gives 3 weights but the calendar has "
              "12 opening hours (8:00 to 20:00)\n  hint: give one weight per opening hour, from "
              "calendar.hours.open to calendar.hours.close"});
  CHECK(problems(hours + head + "[] } }]\n") ==
        Lines{"t.yaml:2:71: error: items[0].demand.intraday gives 0 weights but the calendar has "
              "4 opening hours (9:00 to 13:00)\n  hint: give one weight per opening hour, from "
              "calendar.hours.open to calendar.hours.close"});
  // brief: each weight >= 0, not all zero.
  CHECK(problems(hours + head + "[1, -1, 1, 1] } }]\n") ==
        Lines{"t.yaml:2:75: error: items[0].demand.intraday[1] must be >= 0 (got -1)"});
  CHECK(problems(hours + head + "[1, a, 1, 1] } }]\n") ==
        Lines{"t.yaml:2:75: error: items[0].demand.intraday[1] must be a number (got a)"});
  CHECK(problems(hours + head + "[0, 0, 0, 0] } }]\n") ==
        Lines{"t.yaml:2:71: error: items[0].demand.intraday weights are all zero\n"
              "  hint: at least one opening hour must have customers"});
  // A broken calendar is reported alone: the weights are not counted against it.
  CHECK(problems("calendar: { hours: { open: 20, close: 8 } }\n" + head + "[1, 2] } }]\n") ==
        Lines{"t.yaml:1:39: error: calendar.hours.open (20) must be before calendar.hours.close "
              "(8)"});
}

TEST_CASE("demand.intraday merges from item_defaults.demand", "[scenario]") {
  // brief: mergeable from item_defaults.demand like the other demand fields.
  const Scenario s = valid(R"(calendar: { hours: { open: 10, close: 13 } }
item_defaults: { demand: { intraday: [1, 3, 1] } }
items:
  - { id: a, price: 2, unit_cost: 1, demand: { base: 1 } }
  - { id: b, price: 2, unit_cost: 1, demand: { base: 1, intraday: evening_peak } }
)");
  CHECK(s.items[0].demand.intraday_weights == std::vector<double>{1, 3, 1});
  CHECK(s.items[1].demand.intraday == "evening_peak");
  CHECK(s.items[1].demand.intraday_weights.empty());
  // Reported once, where item_defaults writes it (column 38), not once per item.
  CHECK(problems("item_defaults: { demand: { intraday: [1, 3, 1] } }\n"
                 "items: [{ id: a, price: 1, unit_cost: 1, demand: { base: 1 } }, "
                 "{ id: b, price: 1, unit_cost: 1, demand: { base: 1 } }]\n") ==
        Lines{"t.yaml:1:38: error: item_defaults.demand.intraday gives 3 weights but the calendar "
              "has 12 opening hours (8:00 to 20:00)\n  hint: give one weight per opening hour, "
              "from calendar.hours.open to calendar.hours.close"});
}

TEST_CASE("substitutes name other items, with shares summing to at most 1", "[scenario]") {
  // scenario.md / model.md step 3: substitutes map item ids to probabilities; brief: forward
  // references allowed, resolved to item indices.
  const Scenario s = valid(R"(items:
  - { id: a, price: 2, unit_cost: 1, demand: { base: 1 }, substitutes: { c: 0.25, b: 0.15 } }
  - { id: b, price: 2, unit_cost: 1, demand: { base: 1 } }
  - { id: c, price: 2, unit_cost: 1, demand: { base: 1 }, substitutes: { a: 1 } }
  - { id: d, price: 2, unit_cost: 1, demand: { base: 1 }, substitutes: { a: 0.34, b: 0.56, c: 0.1 } }
)");
  const auto& a = s.items[0].substitutes;
  REQUIRE(a.size() == 2);
  CHECK(a[0].item == 2);
  CHECK(a[0].share == 0.25);
  CHECK(a[1].item == 1);
  CHECK(a[1].share == 0.15);
  CHECK(s.items[1].substitutes.empty());
  REQUIRE(s.items[2].substitutes.size() == 1);
  CHECK(s.items[2].substitutes[0].item == 0);
  CHECK(s.items[2].substitutes[0].share == 1.0);
  // 0.34 + 0.56 + 0.1 is 1.0000000000000002 in doubles (python3: 0.34 + 0.56 + 0.1): shares
  // written to sum to 1 are accepted.
  CHECK(s.items[3].substitutes.size() == 3);

  const std::string three =
      "  - { id: rye, price: 2, unit_cost: 1, demand: { base: 1 } }\n"
      "  - { id: spelt, price: 2, unit_cost: 1, demand: { base: 1 } }\n";
  const std::string head = "items:\n  - { id: a, price: 2, unit_cost: 1, demand: { base: 1 }, ";
  // On line 2, `substitutes` starts at column 59 and its mapping's first key at column 74.
  CHECK(problems(head + "substitutes: { ryee: 0.2 } }\n" + three) ==
        Lines{"t.yaml:2:74: error: items[0].substitutes names 'ryee', which is not an item id\n"
              "  hint: did you mean 'rye'?"});
  CHECK(problems(head + "substitutes: { barley: 0.2 } }\n" + three) ==
        Lines{"t.yaml:2:74: error: items[0].substitutes names 'barley', which is not an item id\n"
              "  hint: the items are a, rye, spelt"});
  CHECK(problems(head + "substitutes: { a: 0.2 } }\n" + three) ==
        Lines{"t.yaml:2:74: error: items[0].substitutes names the item itself ('a')\n"
              "  hint: a substitute is another item that customers take when this one is out"});
  // brief: shares in [0, 1], summing to <= 1 (error at the substitutes key, giving the sum).
  CHECK(problems(head + "substitutes: { rye: 1.5 } }\n" + three) ==
        Lines{"t.yaml:2:79: error: items[0].substitutes.rye must be in [0, 1] (got 1.5)"});
  CHECK(problems(head + "substitutes: { rye: 0.6, spelt: 0.5 } }\n" + three) ==
        Lines{"t.yaml:2:59: error: items[0].substitutes shares sum to 1.1; they must sum to at "
              "most 1\n  hint: a share is the probability that a customer who finds this item "
              "out tries that item; the rest leave"});
  CHECK(problems(head + "substitutes: [rye] }\n" + three) ==
        Lines{"t.yaml:2:72: error: items[0].substitutes must be a mapping from item id to share "
              "such as { rye: 0.25 } (got a list)"});
  // Every problem at once: an unknown id and a bad share in one mapping.
  CHECK(problems(head + "substitutes: { ryee: 0.2, spelt: x } }\n" + three) ==
        Lines{"t.yaml:2:74: error: items[0].substitutes names 'ryee', which is not an item id\n"
              "  hint: did you mean 'rye'?",
              "t.yaml:2:92: error: items[0].substitutes.spelt must be a number (got x)"});
  // brief: not allowed under item_defaults.
  CHECK(problems("item_defaults: { substitutes: { a: 0.1 } }\n") ==
        Lines{"t.yaml:1:18: error: item_defaults cannot set substitutes\n"
              "  hint: give substitutes per item: they name other items"});
}

TEST_CASE("leftovers: discount_next_day with next_day", "[scenario]") {
  // model.md step 5 / scenario.md: discount_next_day keeps leftovers a day at a discount.
  // brief: next_day { price [half the item price], fallback [discard], bargain_demand [0] }.
  const std::string head = "items:\n  - { id: a, price: 3, unit_cost: 1, demand: { base: 1 }, ";
  const Scenario plain = valid(head + "leftovers: discount_next_day }\n");
  const larder::Item& p = plain.items[0];
  CHECK(p.leftovers == larder::Leftovers::discount_next_day);
  REQUIRE(p.next_day);
  CHECK(p.next_day->price == 1.5);
  CHECK(p.next_day->fallback == larder::Leftovers::discard);
  CHECK(p.next_day->bargain_demand == 0.0);
  const Scenario full = valid(head +
                              "leftovers: discount_next_day, next_day: { price: 1, fallback: "
                              "donate, bargain_demand: 0.2 } }\n");
  REQUIRE(full.items[0].next_day);
  CHECK(full.items[0].next_day->price == 1.0);
  CHECK(full.items[0].next_day->fallback == larder::Leftovers::donate);
  CHECK(full.items[0].next_day->bargain_demand == 0.2);
  // The full price is allowed; salvage as the fallback with a salvage value below cost.
  const Scenario edge = valid(head +
                              "leftovers: discount_next_day, salvage_value: 0.5, next_day: { "
                              "price: 3, fallback: salvage } }\n");
  CHECK(edge.items[0].next_day->price == 3.0);
  CHECK(edge.items[0].next_day->fallback == larder::Leftovers::salvage);
  // item_defaults' next_day is taken whole; an item's own next_day replaces it whole.
  const Scenario merged = valid(R"(item_defaults:
  leftovers: discount_next_day
  next_day: { price: 0.5, fallback: donate }
items:
  - { id: a, price: 3, unit_cost: 1, demand: { base: 1 } }
  - { id: b, price: 3, unit_cost: 1, demand: { base: 1 }, next_day: { bargain_demand: 0.1 } }
  - { id: c, price: 3, unit_cost: 1, demand: { base: 1 }, leftovers: discard }
)");
  const auto& a = merged.items[0].next_day;
  REQUIRE(a);
  CHECK(a->price == 0.5);
  CHECK(a->fallback == larder::Leftovers::donate);
  const auto& b = merged.items[1].next_day;
  REQUIRE(b);
  CHECK(b->price == 1.5);
  CHECK(b->fallback == larder::Leftovers::discard);
  CHECK(b->bargain_demand == 0.1);
  // brief: next_day is set exactly when leftovers is discount_next_day.
  CHECK_FALSE(merged.items[2].next_day);
}

TEST_CASE("next_day errors", "[scenario]") {
  const std::string head = "items:\n  - { id: a, price: 2, unit_cost: 1, demand: { base: 1 }, ";
  const std::string keep = head + "leftovers: discount_next_day, next_day: ";
  // On line 2 of `keep`, the next_day mapping starts at column 99 and its first value at 108.
  CHECK(problems(keep + "{ price: 2.5 } }\n") ==
        Lines{"t.yaml:2:108: error: items[0].next_day.price (2.5) must be at most items[0].price "
              "(2)\n  hint: a discounted unit sells at most at the full price"});
  CHECK(problems(keep + "{ price: -1 } }\n") ==
        Lines{"t.yaml:2:108: error: items[0].next_day.price must be in [0, 1000000000] (got -1)"});
  CHECK(problems(keep + "{ fallback: discount_next_day } }\n") ==
        Lines{"t.yaml:2:111: error: items[0].next_day.fallback must be one of discard, salvage, "
              "donate (got discount_next_day)"});
  CHECK(problems(keep + "{ bargain_demand: -0.1 } }\n") ==
        Lines{"t.yaml:2:117: error: items[0].next_day.bargain_demand must be in [0, 100000000] "
              "(got -0.1)"});
  CHECK(problems(keep + "{ prise: 1 } }\n") ==
        Lines{"t.yaml:2:101: error: unknown key 'prise' in items[0].next_day\n"
              "  hint: did you mean 'price'?"});
  CHECK(problems(keep + "half }\n") ==
        Lines{"t.yaml:2:99: error: items[0].next_day must be a mapping of keys to values "
              "(got half)"});
  // brief: salvage as the fallback needs salvage_value < unit_cost, like leftovers: salvage.
  CHECK(problems(head + "leftovers: discount_next_day, salvage_value: 1, next_day: { fallback: "
                        "salvage } }\n") ==
        Lines{"t.yaml:2:104: error: items[0].salvage_value (1) must be less than "
              "items[0].unit_cost (1) when next_day.fallback is salvage\n"
              "  hint: otherwise every extra unit ordered would pay"});
  // brief: next_day without leftovers: discount_next_day is an error (mapping at column 69).
  CHECK(problems(head + "next_day: { price: 1 } }\n") ==
        Lines{"t.yaml:2:69: error: items[0].next_day is given but items[0].leftovers is discard\n"
              "  hint: set leftovers: discount_next_day to sell leftovers one more day at "
              "next_day.price, or remove next_day"});
  CHECK(problems(head + "leftovers: donate, next_day: { price: 1 } }\n") ==
        Lines{"t.yaml:2:88: error: items[0].next_day is given but items[0].leftovers is donate\n"
              "  hint: set leftovers: discount_next_day to sell leftovers one more day at "
              "next_day.price, or remove next_day"});
  // In item_defaults: an error when no item takes it.
  CHECK(problems("item_defaults: { next_day: { price: 1 } }\n") ==
        Lines{"t.yaml:1:28: error: item_defaults.next_day is used by no item (it applies to "
              "items with leftovers: discount_next_day that give no next_day of their own)\n"
              "  hint: set leftovers: discount_next_day, in item_defaults or on the items, or "
              "remove next_day"});
  // A default price above an item's price is reported where item_defaults writes it.
  CHECK(problems("item_defaults: { leftovers: discount_next_day, next_day: { price: 2.5 } }\n") ==
        Lines{"t.yaml:1:67: error: items[0].next_day.price (2.5) must be at most items[0].price "
              "(2)\n  hint: next_day comes from item_defaults (line 1); a discounted unit sells "
              "at most at the full price"});
}

TEST_CASE("evening markdown", "[scenario]") {
  // brief: markdown { from_hour (required, open < from_hour < close), price [half the item
  // price] <= item price, uplift >= 0 [0] }.
  const std::string head = "items:\n  - { id: a, price: 3, unit_cost: 1, demand: { base: 1 }, ";
  const Scenario plain = valid(head + "markdown: { from_hour: 17 } }\n");
  REQUIRE(plain.items[0].markdown);
  CHECK(plain.items[0].markdown->from_hour == 17);
  CHECK(plain.items[0].markdown->price == 1.5);
  CHECK(plain.items[0].markdown->uplift == 0.0);
  CHECK_FALSE(plain.items[0].next_day);
  const Scenario full = valid(head + "markdown: { from_hour: 19, price: 1.2, uplift: 0.3 } }\n");
  REQUIRE(full.items[0].markdown);
  CHECK(full.items[0].markdown->from_hour == 19);  // the last opening hour (8 to 20)
  CHECK(full.items[0].markdown->price == 1.2);
  CHECK(full.items[0].markdown->uplift == 0.3);
  // Merged from item_defaults as a whole mapping.
  const Scenario merged = valid(R"(item_defaults: { markdown: { from_hour: 17, price: 1 } }
items:
  - { id: a, price: 3, unit_cost: 1, demand: { base: 1 } }
  - { id: b, price: 4, unit_cost: 1, demand: { base: 1 }, markdown: { from_hour: 18 } }
)");
  REQUIRE(merged.items[0].markdown);
  CHECK(merged.items[0].markdown->from_hour == 17);
  CHECK(merged.items[0].markdown->price == 1.0);
  REQUIRE(merged.items[1].markdown);
  CHECK(merged.items[1].markdown->from_hour == 18);
  CHECK(merged.items[1].markdown->price == 2.0);

  // On line 2 the markdown mapping starts at column 69, its first value at column 82.
  CHECK(problems(head + "markdown: { price: 1 } }\n") ==
        Lines{"t.yaml:2:69: error: items[0].markdown.from_hour is required\n"
              "  hint: the clock hour from which units on their last day sell at the markdown "
              "price, e.g. from_hour: 17"});
  for (const char* hour : {"8", "20", "3"}) {
    CHECK(problems(head + "markdown: { from_hour: " + hour + " } }\n") ==
          Lines{"t.yaml:2:82: error: items[0].markdown.from_hour must be after "
                "calendar.hours.open (8) and before calendar.hours.close (20) (got " +
                std::string(hour) +
                ")\n  hint: the markdown price applies from that clock hour "
                "until closing"});
  }
  CHECK(problems("calendar: { hours: { open: 7, close: 19 } }\n" + head +
                 "markdown: { from_hour: 19 } }\n") ==
        Lines{"t.yaml:3:82: error: items[0].markdown.from_hour must be after calendar.hours.open "
              "(7) and before calendar.hours.close (19) (got 19)\n"
              "  hint: the markdown price applies from that clock hour until closing"});
  CHECK(problems(head + "markdown: { from_hour: 17.5 } }\n") ==
        Lines{"t.yaml:2:82: error: items[0].markdown.from_hour must be a whole number (got 17.5)"});
  CHECK(problems(head + "markdown: { from_hour: 17, price: 3.5 } }\n") ==
        Lines{"t.yaml:2:93: error: items[0].markdown.price (3.5) must be at most items[0].price "
              "(3)\n  hint: a discounted unit sells at most at the full price"});
  CHECK(problems(head + "markdown: { from_hour: 17, uplift: -0.1 } }\n") ==
        Lines{"t.yaml:2:94: error: items[0].markdown.uplift must be in [0, 1000] (got -0.1)"});
  CHECK(problems(head + "markdown: 17 }\n") ==
        Lines{"t.yaml:2:69: error: items[0].markdown must be a mapping of keys to values "
              "(got 17)"});
  // Checked once where item_defaults writes it.
  CHECK(problems("item_defaults: { markdown: { from_hour: 21 } }\n"
                 "items: [{ id: a, price: 1, unit_cost: 1, demand: { base: 1 } }, "
                 "{ id: b, price: 1, unit_cost: 1, demand: { base: 1 } }]\n") ==
        Lines{"t.yaml:1:41: error: item_defaults.markdown.from_hour must be after "
              "calendar.hours.open (8) and before calendar.hours.close (20) (got 21)\n"
              "  hint: the markdown price applies from that clock hour until closing"});
}

TEST_CASE("policies observe daily or intraday", "[scenario]") {
  // model.md, Observation: `observe: intraday` adds sales per bucket and the sell-out time.
  const std::string head =
      "policies: [{ name: p, forecast: { method: x }, quantity: { rule: y }, observe: ";
  CHECK(valid(head + "intraday }]\n").policies[0].observe_intraday);
  CHECK_FALSE(valid(head + "daily }]\n").policies[0].observe_intraday);
  CHECK(problems(head + "hourly }]\n") ==
        Lines{"t.yaml:1:80: error: policies[0].observe must be one of daily, intraday "
              "(got hourly)"});
}
