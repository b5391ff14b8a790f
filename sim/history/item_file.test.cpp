// The item file: what `larder history --items-out` writes reads back to the scenario's items
// (a round trip through reports/item_file_csv), and every rejection names its line and column.

#include "sim/history/item_file.hpp"

#include <unistd.h>

#include <catch2/catch.hpp>
#include <filesystem>
#include <fstream>

#include "reports/item_file_csv.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

namespace fs = std::filesystem;

fs::path write_text(const std::string& name, const std::string& text) {
  const fs::path dir =
      fs::temp_directory_path() / ("larder-item-file-" + std::to_string(::getpid()));
  fs::create_directories(dir);
  const fs::path p = dir / name;
  std::ofstream(p, std::ios::binary) << text;
  return p;
}

std::string error_of(const std::string& text) {
  try {
    read_item_file(write_text("bad.csv", text).string());
  } catch (const InputError& e) {
    return e.what();
  }
  return {};
}

TEST_CASE("item file: the scenario's items read back", "[history]") {
  const Scenario s = test::scenario_from(R"(
format: 1
name: items
seed: 1
horizon: { days: 10, warmup_days: 0 }
replications: 1
stores: [ { id: s } ]
items:
  - { id: bun, price: 0.9, unit_cost: 0.35, demand: { base: 3 }, attributes: { category: bread, size: small } }
  - { id: pie-apple, price: 4.25, unit_cost: 1.5, shelf_life_days: 3, demand: { base: 2 }, attributes: { category: "cakes, fresh" } }
policies:
  - { name: p, forecast: { method: oracle }, quantity: { rule: fixed, quantity: 1 } }
)");
  const fs::path p = write_text("items.csv", item_file_csv(s));
  const std::vector<ItemRecord> items = read_item_file(p.string());
  REQUIRE(items.size() == 2);
  CHECK(items[0].id == "bun");
  CHECK(items[0].price == 0.9);
  CHECK(items[0].unit_cost == 0.35);
  CHECK(items[0].shelf_life_days == 1);
  using Attrs = std::vector<std::pair<std::string, std::string>>;
  CHECK(items[0].attributes == Attrs{{"category", "bread"}, {"size", "small"}});
  CHECK(items[1].id == "pie-apple");
  CHECK(items[1].price == 4.25);
  CHECK(items[1].shelf_life_days == 3);
  CHECK(items[1].attributes == Attrs{{"category", "cakes, fresh"}, {"size", ""}});
}

TEST_CASE("item file: rejections with line and column", "[history]") {
  const std::string h = "item,price,unit_cost,shelf_life_days\n";
  CHECK_THAT(error_of("item,price,shelf_life_days\n"),
             Catch::Contains("bad.csv:1:1: error: the header has no column 'unit_cost'"));
  CHECK_THAT(error_of(""), Catch::Contains("bad.csv:1:1: error: the item file is empty"));
  CHECK_THAT(error_of(h), Catch::Contains("bad.csv:1:1: error: the item file has no items"));
  CHECK_THAT(error_of("item,price,unit_cost,shelf_life_days,price\n"),
             Catch::Contains("bad.csv:1:38: error: column 'price' is given twice"));
  CHECK_THAT(error_of(h + "bun,cheap,0.3,1\n"),
             Catch::Contains("bad.csv:2:5: error: price must be a number >= 0 (got 'cheap')"));
  CHECK_THAT(error_of(h + "bun,1,-0.3,1\n"),
             Catch::Contains("bad.csv:2:7: error: unit_cost must be a number >= 0"));
  CHECK_THAT(error_of(h + "bun,1,0.3,0\n"),
             Catch::Contains("bad.csv:2:11: error: shelf_life_days must be a whole number from 1"));
  CHECK_THAT(error_of(h + "bun,1,0.3,1\nbun,1,0.3,1\n"),
             Catch::Contains("bad.csv:3:1: error: item 'bun' is given twice (first on line 2)"));
  CHECK_THAT(error_of(h + ",1,0.3,1\n"), Catch::Contains("bad.csv:2:1: error: item is empty"));
  CHECK_THAT(error_of(h + "bun,1,0.3\n"),
             Catch::Contains("bad.csv:2:1: error: expected 4 fields, got 3"));
  CHECK_THROWS_WITH(read_item_file("/nonexistent/items.csv"),
                    Catch::Contains("/nonexistent/items.csv: error: no such item file"));
}

}  // namespace
}  // namespace larder
