// End to end: `larder history` writes a history and an item file that read back, refuses an
// unknown policy with exit code 2, and a bad history file given to `larder fit` ends with exit
// code 2 and compiler-style `file:line:col` messages (cli.md, "Errors and exit codes").

#include <fmt/format.h>
#include <sys/wait.h>
#include <unistd.h>

#include <array>
#include <catch2/catch.hpp>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "sim/history/history_reader.hpp"
#include "sim/history/item_file.hpp"
#include "tests/cli_runner.test.hpp"

namespace larder {
namespace {

namespace fs = std::filesystem;

using test::Outcome;

fs::path scratch_dir() {
  const fs::path p = test::scratch_dir("history-cli");
  fs::create_directories(p);
  return p;
}

Outcome larder(const std::string& args) {
  return test::run_larder("history-cli", args);
}

const char* kScenario = R"(format: 1
name: history-cli
seed: 3
horizon: { days: 30, warmup_days: 7, start_date: 2027-05-03 }
replications: 2
stores: [ { id: corner }, { id: market } ]
items:
  - { id: roll, price: 1.5, unit_cost: 0.4, demand: { base: 30 }, attributes: { category: bread } }
  - { id: pie, price: 4, unit_cost: 1.5, shelf_life_days: 2, demand: { base: 8 }, attributes: { category: cakes } }
policies:
  - { name: fixed, forecast: { method: oracle }, quantity: { rule: fixed, quantity: 25 } }
  - { name: learner, forecast: { method: ses_weekday }, quantity: { rule: critical_fractile } }
)";

TEST_CASE("larder history writes a history and an item file that read back", "[history][cli]") {
  const fs::path dir = scratch_dir() / "ok";
  fs::remove_all(dir);
  fs::create_directories(dir);
  std::ofstream(dir / "s.yaml") << kScenario;
  const Outcome o = larder(fmt::format(
      "history {} --policy learner --replication 1 --out {} "
      "--items-out {} --quiet",
      (dir / "s.yaml").string(), (dir / "out/h.csv").string(), (dir / "out/items.csv").string()));
  INFO(o.err);
  REQUIRE(o.code == 0);
  CHECK(o.out.find("120 rows") != std::string::npos);  // 30 days x 2 stores x 2 items
  long rows = 0;
  CivilDate first{};
  read_history_file((dir / "out/h.csv").string(), [&](const HistoryRow& r) {
    if (rows++ == 0) first = r.date;
  });
  CHECK(rows == 120);
  CHECK(first == CivilDate{2027, 5, 3});
  const std::vector<ItemRecord> items = read_item_file((dir / "out/items.csv").string());
  REQUIRE(items.size() == 2);
  CHECK(items[1].id == "pie");
  CHECK(items[1].shelf_life_days == 2);
  CHECK(items[1].attributes ==
        std::vector<std::pair<std::string, std::string>>{{"category", "cakes"}});
  // No temporary files are left beside the outputs.
  int files = 0;
  for (const auto& e : fs::directory_iterator(dir / "out")) files += e.is_regular_file() ? 1 : 0;
  CHECK(files == 2);
}

TEST_CASE("larder history refuses an unknown policy with exit code 2", "[history][cli]") {
  const fs::path dir = scratch_dir() / "bad-policy";
  fs::remove_all(dir);
  fs::create_directories(dir);
  std::ofstream(dir / "s.yaml") << kScenario;
  const Outcome o = larder(fmt::format("history {} --policy nope --out {}",
                                       (dir / "s.yaml").string(), (dir / "h.csv").string()));
  CHECK(o.code == 2);
  CHECK(o.err.find("error: --policy nope: no policy of that name") != std::string::npos);
  CHECK(o.err.find("hint: the scenario's policies: fixed, learner") != std::string::npos);
  CHECK(!fs::exists(dir / "h.csv"));
}

TEST_CASE("a bad history file ends with exit code 2 and file:line:col messages", "[history][cli]") {
  const fs::path dir = scratch_dir() / "bad-history";
  fs::remove_all(dir);
  fs::create_directories(dir);
  const fs::path bad = dir / "bad.csv";
  std::ofstream(bad) << "date,store,item,delivered,sold,leftover,sold_out\n"
                        "2027-03-01,s,bun,10,7,3,0\n"
                        "2027-02-30,s,bun,10,7,3,0\n"
                        "2027-03-02,s,bun,10,14,0,1\n";
  const Outcome o =
      larder(fmt::format("fit {} --out {}", bad.string(), (dir / "fitted.yaml").string()));
  INFO(o.err);
  CHECK(o.code == 2);
  CHECK(o.err.find(bad.string() + ":3:1: error: date 2027-02-30 is not a date in the calendar") !=
        std::string::npos);
  CHECK(o.err.find(bad.string() + ":4:21: error: sold 14 is more than the stock available") !=
        std::string::npos);
  CHECK(!fs::exists(dir / "fitted.yaml"));
}

}  // namespace
}  // namespace larder
