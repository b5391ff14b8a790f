// `larder fit` end to end: history -> fit -> check on a small scenario (exit codes 0 and the
// table), the placeholder warning without --items, and bad input (history rows, item file,
// options, too little data): exit code 2 with `file:line:col: error:` messages (cli.md).

#include <fmt/format.h>
#include <sys/wait.h>

#include <array>
#include <catch2/catch.hpp>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "tests/cli_runner.test.hpp"

namespace larder {
namespace {

namespace fs = std::filesystem;

using test::Outcome;
using test::slurp;

fs::path scratch(const std::string& name) {
  const fs::path p = test::scratch_dir("fit-test") / name;
  fs::create_directories(p.parent_path());
  return p;
}

fs::path write_text(const std::string& name, const std::string& text) {
  const fs::path p = scratch(name);
  test::write_text(p, text);
  return p;
}

Outcome larder(const std::string& args) {
  return test::run_larder("fit-test", args);
}

const char* kScenario = R"(format: 1
name: fit-cli
seed: 5
horizon: { days: 140, warmup_days: 0, start_date: 2027-02-01 }
replications: 1
stores: [ { id: quay, size: 1.2 }, { id: dock, size: 0.8 } ]
items:
  - { id: roll, price: 1.5, unit_cost: 0.4, attributes: { type: bread }, demand: { base: 25, distribution: normal, cv: 0.3 } }
  - { id: pie, price: 4, unit_cost: 1.5, demand: { base: 9 } }
policies:
  - name: habit
    forecast: { method: ses_weekday, alpha: 0.3 }
    quantity: { rule: in_stock_target, level: 0.6, assume: normal }
)";

TEST_CASE("larder fit: history, fit, check", "[fit]") {
  const fs::path sc = write_text("known.yaml", kScenario);
  const fs::path hist = scratch("h.csv");
  const fs::path items = scratch("items.csv");
  const fs::path fitted = scratch("out/fitted.yaml");
  Outcome h = larder(fmt::format("history {} --policy habit --out {} --items-out {} -q",
                                 sc.string(), hist.string(), items.string()));
  INFO(h.err);
  REQUIRE(h.code == 0);

  Outcome f = larder(
      fmt::format("fit {} --items {} --out {}", hist.string(), items.string(), fitted.string()));
  INFO(f.err << f.out);
  REQUIRE(f.code == 0);
  CHECK(f.err.empty());  // prices known: no placeholder warning
  CHECK_THAT(f.out,
             Catch::Contains("roll") && Catch::Contains("pie") && Catch::Contains("sold out"));
  const std::string yaml = slurp(fitted);
  CHECK_THAT(yaml, Catch::Contains("price: 1.5") && Catch::Contains("type: \"bread\""));
  CHECK_THAT(yaml, !Catch::Contains("PLACEHOLDER"));
  Outcome c = larder(fmt::format("check {}", fitted.string()));
  INFO(c.err << yaml);
  CHECK(c.code == 0);

  // Without --items: placeholders, marked in the file and announced on stderr.
  Outcome p = larder(fmt::format("fit {} --out {}", hist.string(), fitted.string()));
  CHECK(p.code == 0);
  CHECK_THAT(p.err, Catch::Contains("placeholders"));
  CHECK_THAT(slurp(fitted), Catch::Contains("PLACEHOLDER"));
  CHECK(larder(fmt::format("check {}", fitted.string())).code == 0);

  // A fixed family.
  Outcome n =
      larder(fmt::format("fit {} --family poisson --out {} -q", hist.string(), fitted.string()));
  CHECK(n.code == 0);
  CHECK_THAT(slurp(fitted), !Catch::Contains("distribution: normal"));

  // --check: the history's deliveries replayed on the fitted scenario, a row per item.
  Outcome k = larder(fmt::format("fit {} --items {} --check --check-replications 20 -t 1 --out {}",
                                 hist.string(), items.string(), fitted.string()));
  INFO(k.err << k.out);
  CHECK(k.code == 0);
  CHECK_THAT(k.out, Catch::Contains("the history's own deliveries replayed") &&
                        Catch::Contains("fitted 95%") && Catch::Contains("20 replications"));
  CHECK_THAT(slurp(fitted), !Catch::Contains("replay"));  // the written scenario is the usual one
}

TEST_CASE("larder fit: bad input exits 2 with file:line messages", "[fit]") {
  const fs::path out = scratch("bad-out.yaml");
  fs::remove(out);
  const fs::path bad = write_text("bad.csv",
                                  "date,store,item,delivered,sold,leftover,sold_out\n"
                                  "2027-03-01,quay,roll,10,8,2,0\n"
                                  "2027-03-02,quay,roll,10,eleven,0,1\n"
                                  "2027-03-03,quay,roll,10,9,1,2\n");
  Outcome b = larder(fmt::format("fit {} --out {}", bad.string(), out.string()));
  CHECK(b.code == 2);
  CHECK_THAT(b.err, Catch::Contains(bad.string() + ":3:") && Catch::Contains("error:"));
  CHECK_THAT(b.err, Catch::Contains(bad.string() + ":4:"));
  CHECK_FALSE(fs::exists(out));  // nothing half-written

  Outcome missing =
      larder(fmt::format("fit {} --out {}", scratch("none.csv").string(), out.string()));
  CHECK(missing.code == 2);
  CHECK_THAT(missing.err, Catch::Contains("none.csv"));

  // Too little data: every item left out, so there is nothing valid to write.
  std::string few = "date,store,item,delivered,sold,leftover,sold_out\n";
  for (int d = 1; d <= 9; ++d) few += fmt::format("2027-03-0{},quay,roll,10,6,4,0\n", d);
  const fs::path short_file = write_text("short.csv", few);
  Outcome s = larder(fmt::format("fit {} --out {}", short_file.string(), out.string()));
  CHECK(s.code == 2);
  CHECK_THAT(s.err, Catch::Contains("short.csv") && Catch::Contains("enough data"));
  CHECK_FALSE(fs::exists(out));

  const fs::path items =
      write_text("bad-items.csv", "item,price,unit_cost,shelf_life_days\nroll,-1,0.4,1\n");
  Outcome i = larder(
      fmt::format("fit {} --items {} --out {}", short_file.string(), items.string(), out.string()));
  CHECK(i.code == 2);
  CHECK_THAT(i.err, Catch::Contains("bad-items.csv:2:"));

  Outcome o =
      larder(fmt::format("fit {} --family gamma --out {}", short_file.string(), out.string()));
  CHECK(o.code == 2);
}

}  // namespace
}  // namespace larder
