// The adjustments on cases computed by hand: pack rounding, the shelf cap in whole packs, the
// display minimum, waste feedback and the same-weekday growth cap, alone and chained in the
// order listed, built from scenario syntax through the registry.

#include <fmt/format.h>

#include <catch2/catch.hpp>

#include "policies/quantity/part_fixture.test.hpp"

namespace larder {
namespace {

/// Two items: `tray` comes in packs of 6, `loaf` by the unit. The rule is `fixed` with
/// `quantity` (a number or map), then `adjustments`.
std::string scenario(const std::string& quantity, const std::string& adjustments) {
  return fmt::format(R"(format: 1
name: t
seed: 1
stores: [ {{ id: s }} ]
items:
  - {{ id: tray, price: 3, unit_cost: 1, pack_size: 6, demand: {{ base: 20 }} }}
  - {{ id: loaf, price: 3, unit_cost: 1, demand: {{ base: 20 }} }}
policies:
  - {{ name: a, forecast: {{ method: oracle }}, quantity: {{ rule: fixed, quantity: {} }}, adjustments: {} }}
)",
                     quantity, adjustments);
}

/// Both items with the same usable stock and units on order.
std::vector<OrderInput> stock(int usable, int on_order) {
  std::vector<OrderInput> in(2);
  for (auto& x : in) {
    x.usable_stock = usable;
    x.on_order = on_order;
  }
  return in;
}

std::vector<int> orders(const std::string& quantity, const std::string& adjustments,
                        std::vector<OrderInput> in = stock(0, 0)) {
  qty_test::PartHarness h(scenario(quantity, adjustments));
  return h.order(3, in);
}

TEST_CASE("pack_round rounds up to whole packs", "[policies][adjustment]") {
  // tray: packs of 6; loaf: 1.
  CHECK(orders("7", "[pack_round]") == std::vector<int>{12, 7});
  CHECK(orders("6", "[pack_round]") == std::vector<int>{6, 6});
  CHECK(orders("1", "[pack_round]") == std::vector<int>{6, 1});
  CHECK(orders("0", "[pack_round]") == std::vector<int>{0, 0});
}

TEST_CASE("shelf_cap keeps usable + on order + order <= capacity, in whole packs",
          "[policies][adjustment]") {
  // 10 usable and 5 on order leave room for 25: the loaf gets 25, the tray 4 packs (24).
  CHECK(orders("30", "[{ method: shelf_cap, capacity: 40 }]", stock(10, 5)) ==
        std::vector<int>{24, 25});
  // 20 fits: the tray's 20 is 4 packs (24), which still fits.
  CHECK(orders("20", "[{ method: shelf_cap, capacity: 40 }]", stock(10, 5)) ==
        std::vector<int>{24, 20});
  // Room for 2 units only: no whole tray pack fits.
  CHECK(orders("20", "[{ method: shelf_cap, capacity: 17 }]", stock(10, 5)) ==
        std::vector<int>{0, 2});
  // An item map; stock above capacity orders nothing.
  CHECK(orders("30", "[{ method: shelf_cap, capacity: { tray: 40, loaf: 10 } }]", stock(10, 5)) ==
        std::vector<int>{24, 0});
}

TEST_CASE("min_display orders at least k - usable - on order", "[policies][adjustment]") {
  // k = 8 with 3 usable and 2 on order: at least 3.
  CHECK(orders("1", "[{ method: min_display, units: 8 }]", stock(3, 2)) == std::vector<int>{3, 3});
  CHECK(orders("5", "[{ method: min_display, units: 8 }]", stock(3, 2)) == std::vector<int>{5, 5});
  CHECK(orders("0", "[{ method: min_display, units: { tray: 8, loaf: 4 } }]", stock(3, 2)) ==
        std::vector<int>{3, 0});
}

TEST_CASE("adjustments apply in the order listed", "[policies][adjustment]") {
  // min_display then pack_round: 3 becomes a pack of 6; pack_round then min_display: 0 stays 0
  // until min_display raises it to 3 (the engine rounds that up later).
  CHECK(orders("0", "[{ method: min_display, units: 8 }, pack_round]", stock(3, 2)) ==
        std::vector<int>{6, 3});
  CHECK(orders("0", "[pack_round, { method: min_display, units: 8 }]", stock(3, 2)) ==
        std::vector<int>{3, 3});
  // The syntax of the brief: pack_round, then a shelf cap of 40 (room 25 -> 24 for trays).
  CHECK(orders("23", "[pack_round, { method: shelf_cap, capacity: 40 }]", stock(10, 5)) ==
        std::vector<int>{24, 23});
  CHECK(orders("26", "[pack_round, { method: shelf_cap, capacity: 40 }]", stock(10, 5)) ==
        std::vector<int>{24, 25});
}

Observation open_day(int wasted = 0, int donated = 0, int sold = 0) {
  Observation o;
  o.open = true;
  o.wasted = wasted;
  o.donated = donated;
  o.sold = sold;
  return o;
}

TEST_CASE("waste_feedback cuts share x the last open day's unsold units",
          "[policies][adjustment]") {
  qty_test::PartHarness h(scenario("10", "[{ method: waste_feedback, share: 0.5 }]"));
  const std::vector<OrderInput> in = stock(0, 0);
  CHECK(h.order(0, in) == std::vector<int>{10, 10});  // nothing observed yet
  // Day 1: the tray wasted 5 (cut 2.5 -> 3), the loaf donated 3 (cut 1.5 -> 2).
  std::vector<Observation> day1 = {open_day(5, 0), open_day(0, 3)};
  h.observe(1, day1);
  CHECK(h.order(1, in) == std::vector<int>{7, 8});
  // Day 2 closed (units still outdate): the last open day is still day 1.
  std::vector<Observation> day2(2);
  day2[0].wasted = 9;
  h.observe(2, day2);
  CHECK(h.order(2, in) == std::vector<int>{7, 8});
  // Day 3 open without waste: no cut; day 4 with 30 wasted: never below 0.
  std::vector<Observation> day3 = {open_day(), open_day()};
  h.observe(3, day3);
  CHECK(h.order(3, in) == std::vector<int>{10, 10});
  std::vector<Observation> day4 = {open_day(30), open_day(19)};
  h.observe(4, day4);
  CHECK(h.order(4, in) == std::vector<int>{0, 0});
}

TEST_CASE("cap_growth caps at factor x the mean of the last 4 same-weekday sales",
          "[policies][adjustment]") {
  // Day 0 is a Monday. Monday sales 10, 12, 8, 14 (mean 11); every other day 100.
  qty_test::PartHarness h(
      scenario("{ tray: 20, loaf: 30 }", "[{ method: cap_growth, factor: 1.5 }]"));
  const std::vector<OrderInput> in = stock(0, 0);
  const int monday_sales[] = {10, 12, 8, 14, 30};
  const auto observe = [&](int day) {
    const int sold = day % 7 == 0 ? monday_sales[day / 7] : 100;
    std::vector<Observation> o = {open_day(0, 0, sold), open_day(0, 0, sold)};
    h.observe(day, o);
  };
  // Three Mondays seen (day 21 held back): no cap yet for the Monday delivery ordered on
  // Sunday, day 27.
  for (int day = 0; day < 28; ++day) {
    if (day != 21) observe(day);
  }
  CHECK(h.order(27, in) == std::vector<int>{20, 30});
  observe(21);  // the fourth Monday
  // Cap floor(1.5 x 11) = 16 for the Monday delivery; the Tuesday one is capped at 150.
  CHECK(h.order(27, in) == std::vector<int>{16, 16});
  CHECK(h.order(28, in) == std::vector<int>{20, 30});
  // A fifth Monday sells 30: the last four are 12, 8, 14, 30 (mean 16), cap 24.
  observe(28);
  CHECK(h.order(34, in) == std::vector<int>{20, 24});
}

TEST_CASE("adjustments validate their parameters", "[policies][adjustment][validation]") {
  const auto problems = [](const std::string& adjustments) {
    return qty_test::build_problems(scenario("5", adjustments));
  };
  CHECK(problems("[shelf_cap]") ==
        "p.yaml:9:100: error: policies[0].adjustments[0] needs 'capacity'\n"
        "  hint: give one number for every item, or a map from item id to number\n");
  CHECK(problems("[{ method: shelf_cap, capacity: 40.5 }]") ==
        "p.yaml:9:131: error: policies[0].adjustments[0].capacity must be a whole number (got "
        "40.5)\n");
  CHECK(problems("[{ method: min_display, units: -1 }]") ==
        "p.yaml:9:130: error: policies[0].adjustments[0].units must be in [0, 1000000000] (got "
        "-1)\n");
  CHECK(problems("[{ method: waste_feedback, share: 2 }]") ==
        "p.yaml:9:133: error: policies[0].adjustments[0].share must be in [0, 1] (got 2)\n");
  CHECK(problems("[{ method: cap_growth }]") ==
        "p.yaml:9:100: error: policies[0].adjustments[0] needs 'factor'\n"
        "  hint: the largest order as a multiple of the mean of the last 4 same-weekday sales, "
        "e.g. factor: 1.5\n");
  CHECK(problems("[{ method: cap_growth, factor: 0 }]") ==
        "p.yaml:9:130: error: policies[0].adjustments[0].factor must be > 0 (got 0)\n");
  CHECK(problems("[{ method: pack_round, size: 6 }]") ==
        "p.yaml:9:122: error: unknown key 'size' in policies[0].adjustments[0]\n");
}

}  // namespace
}  // namespace larder
