// Grouping of store-items for network service-level targets (policies.md, "Network service-level
// targets and grouping"). The ABC split follows the 20/30/50 rule of thumb of inventory practice
// (common practice: the top 20% of items by sales value are A, the next 30% B, the rest C;
// checks.md 9); the expected sales values are worked by hand.

#include "policies/network/groups.hpp"

#include <catch2/catch.hpp>
#include <string>
#include <vector>

#include "tests/fixture.hpp"

namespace larder {
namespace {

TEST_CASE("parse_grouping accepts the five forms and round-trips with to_string", "[groups]") {
  for (const char* text : {"store_item", "item", "all", "attribute:type", "abc"}) {
    const auto g = parse_grouping(text);
    REQUIRE(g.has_value());
    CHECK(to_string(*g) == text);
  }
  CHECK(parse_grouping("store_item")->kind == GroupingKind::store_item);
  CHECK(parse_grouping("item")->kind == GroupingKind::item);
  CHECK(parse_grouping("all")->kind == GroupingKind::all);
  CHECK(parse_grouping("abc")->kind == GroupingKind::abc);
  const auto attr = parse_grouping("attribute:sourcing");
  REQUIRE(attr.has_value());
  CHECK(attr->kind == GroupingKind::attribute);
  CHECK(attr->attribute == "sourcing");
}

TEST_CASE("parse_grouping rejects malformed forms", "[groups]") {
  for (const char* text :
       {"attribute:", "attribute", "abcd", "", "Item", "all ", "store-item",
        "store_attribute:", "store_attribute", "item +", "item + ", "item+abc", "item + item",
        "all + abc", "store_item + abc", "item + abc + attribute:a + store_attribute:b"}) {
    CAPTURE(text);
    CHECK_FALSE(parse_grouping(text).has_value());
  }
}

TEST_CASE("parse_grouping: store attributes and combined keys round-trip", "[groups]") {
  for (const char* text :
       {"store_attribute:format", "attribute:type + store_attribute:format",
        "item + store_attribute:format", "abc + attribute:sourcing + store_attribute:region"}) {
    const auto g = parse_grouping(text);
    REQUIRE(g.has_value());
    CHECK(to_string(*g) == text);
  }
  const auto store = parse_grouping("store_attribute:format");
  CHECK(store->kind == GroupingKind::store_attribute);
  CHECK(store->attribute == "format");
  // The YAML list form: the same grouping as the " + " text.
  const std::vector<std::string> keys = {"attribute:type", "store_attribute:format"};
  const auto list = parse_grouping(std::span<const std::string>(keys));
  REQUIRE(list.has_value());
  CHECK(list->kind == GroupingKind::combined);
  REQUIRE(list->parts.size() == 2);
  CHECK(list->parts[0].kind == GroupingKind::attribute);
  CHECK(list->parts[1].kind == GroupingKind::store_attribute);
  CHECK(to_string(*list) == "attribute:type + store_attribute:format");
  // A list of one key is that key; of none, of four, or with a repeat, nothing.
  const std::vector<std::string> one = {"abc"};
  CHECK(parse_grouping(std::span<const std::string>(one))->kind == GroupingKind::abc);
  CHECK_FALSE(parse_grouping(std::span<const std::string>()).has_value());
  const std::vector<std::string> four = {"item", "abc", "attribute:a", "store_attribute:b"};
  CHECK_FALSE(parse_grouping(std::span<const std::string>(four)).has_value());
  const std::vector<std::string> twice = {"attribute:a", "attribute:a"};
  CHECK_FALSE(parse_grouping(std::span<const std::string>(twice)).has_value());
}

TEST_CASE("abc_classes: 10 items split 2 A, 3 B, 5 C in value order", "[groups]") {
  // The 20/30/50 rule of thumb (common practice): of 10 items the 2 highest values are A, the
  // next 3 B, the last 5 C. Values are distinct and listed out of order; by hand, ranked:
  // 95 (idx 3), 80 (idx 7) | 61 (idx 0), 40 (idx 9), 33 (idx 5) | 20, 12, 9, 4, 1.
  const std::vector<double> value = {61, 12, 4, 95, 1, 33, 20, 80, 9, 40};
  const std::vector<int> expected = {1, 2, 2, 0, 2, 1, 2, 0, 2, 1};
  CHECK(abc_classes(value) == expected);
}

TEST_CASE("abc_classes on 4, 2, 1 and 0 items", "[groups]") {
  // 4 items: round(0.8) = 1 A, round(2.0) = 2 so 1 B, then 2 C.
  CHECK(abc_classes(std::vector<double>{3, 10, 1, 7}) == std::vector<int>{2, 0, 2, 1});
  // 2 items: round(0.4) = 0 raised to one A, round(1.0) = 1 so no B, one C.
  CHECK(abc_classes(std::vector<double>{1, 2}) == std::vector<int>{2, 0});
  // 1 item: round(0.2) = 0 raised to one A.
  CHECK(abc_classes(std::vector<double>{5}) == std::vector<int>{0});
  // 3 items: round(0.6) = 1 A, round(1.5) = 2 (half up) so 1 B, one C.
  CHECK(abc_classes(std::vector<double>{1, 2, 3}) == std::vector<int>{2, 1, 0});
  CHECK(abc_classes(std::vector<double>{}).empty());
}

TEST_CASE("abc_classes breaks ties in value by item index", "[groups]") {
  CHECK(abc_classes(std::vector<double>{5, 5, 5, 5}) == std::vector<int>{0, 1, 2, 2});
  // With ids, ties go by id (checks.md 9): a, b, c, d rank first to last.
  const std::vector<std::string> ids = {"d", "b", "c", "a"};
  CHECK(abc_classes(std::vector<double>{5, 5, 5, 5}, ids) == std::vector<int>{2, 1, 2, 0});
  // 10 items with a tie straddling the A/B and the B/C cuts: the lower index ranks higher.
  const std::vector<double> value = {7, 9, 9, 1, 4, 4, 4, 4, 0, 3};
  // Ranked: 9 (1), 9 (2) | 7 (0), 4 (4), 4 (5) | 4 (6), 4 (7), 3 (9), 1 (3), 0 (8).
  CHECK(abc_classes(value) == std::vector<int>{1, 0, 0, 2, 1, 1, 2, 2, 2, 2});
}

constexpr const char* kTwoByTwo = R"(format: 1
name: t
seed: 1
stores:
  - { id: quay, size: 1.5 }
  - { id: station, size: 0.5, open_weekdays: [mon, tue, wed, thu, fri] }
items:
  - id: loaf
    price: 4
    unit_cost: 1
    demand: { base: 10, weekday: { sat: 1.7 } }
  - id: bun
    price: 2.5
    unit_cost: 1
    demand: { base: 6, weekday: { mon: 0.3, tue: 0.3 } }
policies:
  - { name: a, forecast: { method: oracle }, quantity: { rule: fixed, quantity: 1 } }
)";

TEST_CASE("expected_sales_value worked by hand", "[groups]") {
  const Scenario s = test::scenario_from(kTwoByTwo);
  const std::vector<double> v = expected_sales_value(s);
  REQUIRE(v.size() == 2);
  // Sizes sum to 2. loaf: weekday mean (6 + 1.7) / 7 = 1.1, so 4 x 10 x 2 x 1.1 = 88.
  CHECK(v[0] == Approx(88.0).epsilon(1e-12));
  // bun: weekday mean (5 + 0.6) / 7 = 0.8, so 2.5 x 6 x 2 x 0.8 = 24.
  CHECK(v[1] == Approx(24.0).epsilon(1e-12));
}

// Sales values (one size-1 store, flat weekdays): a 2 x 10 = 20, b 3 x 10 = 30,
// c 1 x 100 = 100, d 1 x 5 = 5. ABC of 4 items: c A, b B, a and d C.
constexpr const char* kFourItems = R"(format: 1
name: t
seed: 1
stores: [ { id: n }, { id: s } ]
items:
  - { id: a, price: 2, unit_cost: 1, attributes: { type: bread }, demand: { base: 10 } }
  - { id: b, price: 3, unit_cost: 1, attributes: { type: cake, sourcing: buy }, demand: { base: 10 } }
  - { id: c, price: 1, unit_cost: 0.5, attributes: { sourcing: make }, demand: { base: 100 } }
  - { id: d, price: 1, unit_cost: 0.5, attributes: { type: bread }, demand: { base: 5 } }
policies:
  - { name: a, forecast: { method: oracle }, quantity: { rule: fixed, quantity: 1 } }
)";

GroupMap groups_of(const char* text, const Scenario& s) {
  const auto g = parse_grouping(text);
  REQUIRE(g.has_value());
  return make_groups(*g, s);
}

TEST_CASE("make_groups for every kind", "[groups]") {
  const Scenario s = test::scenario_from(kFourItems);
  REQUIRE(s.stores.size() == 2);
  REQUIRE(s.items.size() == 4);

  SECTION("store_item: store-major order") {
    const GroupMap m = groups_of("store_item", s);
    CHECK(m.count() == 8);
    CHECK(m.of_store_item == std::vector<int>{0, 1, 2, 3, 4, 5, 6, 7});
    CHECK(m.names ==
          std::vector<std::string>{"n/a", "n/b", "n/c", "n/d", "s/a", "s/b", "s/c", "s/d"});
  }
  SECTION("item: item order, the same in every store") {
    const GroupMap m = groups_of("item", s);
    CHECK(m.count() == 4);
    CHECK(m.of_store_item == std::vector<int>{0, 1, 2, 3, 0, 1, 2, 3});
    CHECK(m.names == std::vector<std::string>{"a", "b", "c", "d"});
  }
  SECTION("all: one group") {
    const GroupMap m = groups_of("all", s);
    CHECK(m.count() == 1);
    CHECK(m.of_store_item == std::vector<int>(8, 0));
    CHECK(m.names == std::vector<std::string>{"all"});
  }
  SECTION("attribute: values by first appearance, (none) where the key is missing") {
    const GroupMap m = groups_of("attribute:type", s);
    CHECK(m.names == std::vector<std::string>{"bread", "cake", "(none)"});
    CHECK(m.of_store_item == std::vector<int>{0, 1, 2, 0, 0, 1, 2, 0});
  }
  SECTION("attribute: (none) first when the first item lacks the key") {
    const GroupMap m = groups_of("attribute:sourcing", s);
    CHECK(m.names == std::vector<std::string>{"(none)", "buy", "make"});
    CHECK(m.of_store_item == std::vector<int>{0, 1, 2, 0, 0, 1, 2, 0});
  }
  SECTION("attribute: a key no item has gives one (none) group") {
    const GroupMap m = groups_of("attribute:colour", s);
    CHECK(m.names == std::vector<std::string>{"(none)"});
    CHECK(m.of_store_item == std::vector<int>(8, 0));
  }
  SECTION("abc: A, B, C by expected sales value") {
    const GroupMap m = groups_of("abc", s);
    CHECK(m.names == std::vector<std::string>{"A", "B", "C"});
    CHECK(m.of_store_item == std::vector<int>{2, 1, 0, 2, 2, 1, 0, 2});
  }
}

// Three stores with a format (and one region missing), four items with a type.
constexpr const char* kStoreAttributes = R"(format: 1
name: t
seed: 1
stores:
  - { id: n, attributes: { format: big, region: north } }
  - { id: s, attributes: { format: small } }
  - { id: e, attributes: { format: big, region: east } }
items:
  - { id: a, price: 2, unit_cost: 1, attributes: { type: bread }, demand: { base: 10 } }
  - { id: b, price: 3, unit_cost: 1, attributes: { type: cake }, demand: { base: 10 } }
  - { id: c, price: 1, unit_cost: 0.5, attributes: { type: bread }, demand: { base: 100 } }
policies:
  - { name: a, forecast: { method: oracle }, quantity: { rule: fixed, quantity: 1 } }
)";

TEST_CASE("make_groups: store attributes and combined keys, by hand", "[groups]") {
  const Scenario s = test::scenario_from(kStoreAttributes);
  // Store-items in store-major order: n/a n/b n/c s/a s/b s/c e/a e/b e/c.
  SECTION("store_attribute: every item of a store in the store's group") {
    const GroupMap m = groups_of("store_attribute:format", s);
    CHECK(m.names == std::vector<std::string>{"big", "small"});
    CHECK(m.of_store_item == std::vector<int>{0, 0, 0, 1, 1, 1, 0, 0, 0});
  }
  SECTION("store_attribute: (none) for a store without the key") {
    const GroupMap m = groups_of("store_attribute:region", s);
    CHECK(m.names == std::vector<std::string>{"north", "(none)", "east"});
    CHECK(m.of_store_item == std::vector<int>{0, 0, 0, 1, 1, 1, 2, 2, 2});
  }
  SECTION("type x format: one group per (item group, store group) pair that occurs") {
    const GroupMap m = groups_of("attribute:type + store_attribute:format", s);
    CHECK(m.names ==
          std::vector<std::string>{"bread / big", "cake / big", "bread / small", "cake / small"});
    CHECK(m.of_store_item == std::vector<int>{0, 1, 0, 2, 3, 2, 0, 1, 0});
    REQUIRE(m.key_names.size() == 4);
    CHECK(m.key_names[2] == std::vector<std::string>{"bread", "small"});
  }
  SECTION("item x format: per item within each store format") {
    const GroupMap m = groups_of("item + store_attribute:format", s);
    CHECK(m.names == std::vector<std::string>{"a / big", "b / big", "c / big", "a / small",
                                              "b / small", "c / small"});
    CHECK(m.of_store_item == std::vector<int>{0, 1, 2, 3, 4, 5, 0, 1, 2});
  }
  SECTION("three keys: abc x type x format") {
    // Sales values a 20, b 30, c 100 per store: c A, b B, a C (3 items: 1 A, 1 B, 1 C).
    const GroupMap m = groups_of("abc + attribute:type + store_attribute:format", s);
    CHECK(m.names == std::vector<std::string>{"C / bread / big", "B / cake / big",
                                              "A / bread / big", "C / bread / small",
                                              "B / cake / small", "A / bread / small"});
    CHECK(m.of_store_item == std::vector<int>{0, 1, 2, 3, 4, 5, 0, 1, 2});
  }
  SECTION("a single key carries its own name as its one key name") {
    const GroupMap m = groups_of("attribute:type", s);
    CHECK(m.key_names == std::vector<std::vector<std::string>>{{"bread"}, {"cake"}});
  }
}

TEST_CASE("grouping_suggestion: the closest valid key within edit distance 2", "[groups]") {
  const Scenario s = test::scenario_from(kStoreAttributes);
  CHECK(grouping_suggestion("items", s) == "did you mean 'item'?");
  CHECK(grouping_suggestion("attribute:tpye", s) == "did you mean 'attribute:type'?");
  CHECK(grouping_suggestion("store_attribute:fromat", s) ==
        "did you mean 'store_attribute:format'?");
  CHECK(grouping_suggestion("attribute:type + store_atribute:format", s) ==
        "did you mean 'store_attribute:format'?");
  CHECK(grouping_suggestion("attribute:format", s) ==
        "'format' is a store attribute: did you mean 'store_attribute:format'?");
  CHECK(grouping_suggestion("store_attribute:type", s) ==
        "'type' is an item attribute: did you mean 'attribute:type'?");
  CHECK(grouping_suggestion("attribute:type", s).empty());
  CHECK(grouping_suggestion("something-else-entirely", s).empty());
}

TEST_CASE("first_missing_attribute names the first item or store without the key", "[groups]") {
  const Scenario s = test::scenario_from(kStoreAttributes);
  CHECK_FALSE(first_missing_attribute(*parse_grouping("attribute:type"), s).has_value());
  CHECK_FALSE(first_missing_attribute(*parse_grouping("abc"), s).has_value());
  const auto m =
      first_missing_attribute(*parse_grouping("attribute:type + store_attribute:region"), s);
  REQUIRE(m.has_value());
  CHECK(m->store);
  CHECK(m->index == 1);
  CHECK(m->key == "region");
  CHECK(m->count == 1);
  const Scenario four = test::scenario_from(kFourItems);
  const auto t = first_missing_attribute(*parse_grouping("attribute:sourcing"), four);
  REQUIRE(t.has_value());
  CHECK_FALSE(t->store);
  CHECK(t->index == 0);
  CHECK(t->count == 2);  // a and d
}

TEST_CASE("make_groups abc numbers only the classes that occur", "[groups]") {
  // Two items: one A, no B (round(1.0) = 1 leaves no room), one C, so C is group 1.
  const Scenario s = test::scenario_from(kTwoByTwo);
  const GroupMap m = groups_of("abc", s);
  CHECK(m.names == std::vector<std::string>{"A", "C"});
  // loaf (88) is A, bun (24) is C.
  CHECK(m.of_store_item == std::vector<int>{0, 1, 0, 1});
}

}  // namespace
}  // namespace larder
