// The drill: section of a scenario: what it reads and how it reports mistakes (file:line:col).

#include "sim/drill/drill_spec.hpp"

#include <catch2/catch.hpp>

#include "sim/scenario/load_scenario.hpp"

namespace larder {
namespace {

const std::string kHead = R"(format: 1
name: drill-spec
seed: 1
horizon: { days: 60, warmup_days: 14 }
stores: [ { id: quay }, { id: hill } ]
items:
  - { id: rye, price: 4, unit_cost: 1, demand: { base: 10 } }
  - { id: croissant, price: 2, unit_cost: 1, demand: { base: 20 } }
policies:
  - { name: habit, forecast: { method: ses_weekday }, quantity: { rule: in_stock_target, level: 0.9 } }
  - { name: newsvendor, forecast: { method: ses_weekday }, quantity: { rule: critical_fractile } }
)";

std::string errors_of(const std::string& drill) {
  Diagnostics diag;
  const auto s = parse_scenario(kHead + drill, "d.yaml", diag);
  CHECK(!s);
  return diag.format();
}

TEST_CASE("drill section: a valid exercise", "[drill]") {
  Diagnostics diag;
  const auto s = parse_scenario(kHead + R"(drill:
  store: hill
  items: [croissant, rye]
  days: 21
  compare: [newsvendor, habit]
  events: [ { day: 12, demand: 1.6 }, { day: 3, demand: 0.5, announced: true } ]
)",
                                "d.yaml", diag);
  INFO(diag.format());
  REQUIRE(s);
  REQUIRE(s->drill);
  const DrillSpec& d = *s->drill;
  CHECK(d.store == 1);
  CHECK(d.items == std::vector<int>{1, 0});
  CHECK(d.days == 21);
  CHECK(d.compare == std::vector<int>{1, 0});
  REQUIRE(d.events.size() == 2);
  CHECK(d.events[0].day == 12);
  CHECK(d.events[0].demand == 1.6);
  CHECK_FALSE(d.events[0].announced);
  CHECK(d.events[1].announced);

  // Defaults: 28 days, every policy compared; a scenario without drill: has none.
  const auto plain =
      parse_scenario(kHead + "drill: { store: quay, items: [rye] }\n", "d.yaml", diag);
  REQUIRE(plain);
  CHECK(plain->drill->days == 28);
  CHECK(plain->drill->compare == std::vector<int>{0, 1});
  CHECK_FALSE(parse_scenario(kHead, "d.yaml", diag)->drill);
}

TEST_CASE("drill section: mistakes are reported with file:line:col", "[drill]") {
  // Line 12 is the first line after kHead's 11 lines.
  const std::string e = errors_of(R"(drill:
  store: quai
  items: [rye, baguette, rye]
  days: 0
  compare: [newsvendr]
  events: [ { day: 40, demand: 1.5 }, { demand: -1 } ]
  speed: fast
)");
  INFO(e);
  CHECK(e.find("d.yaml:13:10: error: drill.store: unknown store 'quai'") != std::string::npos);
  CHECK(e.find("hint: did you mean 'quay'?") != std::string::npos);
  CHECK(e.find("d.yaml:14:16: error: drill.items[1]: unknown item 'baguette'") !=
        std::string::npos);
  CHECK(e.find("d.yaml:14:26: error: drill.items[2]: item 'rye' is listed twice") !=
        std::string::npos);
  CHECK(e.find("d.yaml:15:9: error:") != std::string::npos);  // days must be in [1, 364]
  CHECK(e.find("d.yaml:16:13: error: drill.compare[0]: unknown policy 'newsvendr'") !=
        std::string::npos);
  CHECK(e.find("did you mean 'newsvendor'?") != std::string::npos);
  CHECK(e.find("d.yaml:17:20: error:") != std::string::npos);  // event day beyond the drill
  CHECK(e.find("needs 'day'") != std::string::npos);
  CHECK(e.find("d.yaml:18:3: error: unknown key 'speed'") != std::string::npos);

  const std::string missing = errors_of("drill: { days: 10 }\n");
  CHECK(missing.find("needs 'store'") != std::string::npos);
  CHECK(missing.find("needs 'items'") != std::string::npos);
  const std::string many = errors_of("drill: { store: quay, items: [] }\n");
  CHECK(many.find("drill.items must be a list of item ids") != std::string::npos);
}

}  // namespace
}  // namespace larder
