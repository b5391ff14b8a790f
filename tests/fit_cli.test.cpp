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

#include "sim/scenario/iso_date.hpp"
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

/// `text` with every occurrence of `from` replaced by `to`.
std::string replace_all(std::string text, const std::string& from, const std::string& to) {
  for (size_t at = text.find(from); at != std::string::npos; at = text.find(from, at + to.size()))
    text.replace(at, from.size(), to);
  return text;
}

TEST_CASE("hostile histories through fit: refused clearly, or written so that check loads them",
          "[fit]") {
  // Issue 23: fit wrote scenarios that were wrong (an id setting its own size) or unreadable.
  const fs::path sc = write_text("hostile.yaml", kScenario);
  const fs::path hist = scratch("hostile-h.csv");
  REQUIRE(larder(fmt::format("history {} --policy habit --out {} -q", sc.string(), hist.string()))
              .code == 0);
  const std::string good = slurp(hist);
  const fs::path out = scratch("hostile-out/fitted.yaml");
  const auto fit = [&](const std::string& history, const std::string& items = "") {
    const fs::path h = write_text("hostile-variant.csv", history);
    std::string extra;
    if (!items.empty()) extra = " --items " + write_text("hostile-items.csv", items).string();
    fs::remove_all(out.parent_path());
    return larder(fmt::format("fit {}{} --out {} -q", h.string(), extra, out.string()));
  };

  SECTION("ids a scenario cannot hold are refused by name, nothing written") {
    const Outcome injected = fit(replace_all(good, ",quay,", ",\"q, size: 1000 } #\","));
    INFO(injected.err);
    CHECK(injected.code == 2);
    CHECK(injected.err.find("store id 'q, size: 1000 } #' must use only letters") !=
          std::string::npos);
    CHECK(injected.err.find("a scenario cannot hold it") != std::string::npos);
    CHECK(!fs::exists(out));
    const Outcome accented = fit(replace_all(good, ",pie,",
                                             ",p\xc3\xaf"
                                             "e,"));
    CHECK(accented.code == 2);
    CHECK(accented.err.find("item id 'p\\xc3\\xafe'") != std::string::npos);
    const Outcome nul = fit(replace_all(good, ",pie,", std::string(",p\0e,", 5)));
    CHECK(nul.code == 2);
    CHECK(!fs::exists(out));
  }
  SECTION("history --items-out refuses an attribute value the item file cannot hold") {
    std::string text = kScenario;
    text.replace(text.find("type: bread"), 11, "type: \"two\\nlines\"");
    const fs::path multi = write_text("multi-line.yaml", text);
    const fs::path items = scratch("multi-items.csv");
    fs::remove(items);
    const Outcome h =
        larder(fmt::format("history {} --policy habit --out {} --items-out {} -q", multi.string(),
                           scratch("multi-h.csv").string(), items.string()));
    INFO(h.err);
    CHECK(h.code == 2);
    CHECK(h.err.find("item 'roll': attribute type holds a line break") != std::string::npos);
    CHECK(!fs::exists(items));
  }
  SECTION("item file values beyond the loader's limits are refused") {
    const Outcome priced = fit(good,
                               "item,price,unit_cost,shelf_life_days\nroll,1e12,0.4,1\n"
                               "pie,4,1.5,1\n");
    INFO(priced.err);
    CHECK(priced.code == 2);
    CHECK(priced.err.find("item 'roll': price 1000000000000 is above the scenario limit of "
                          "1000000000") != std::string::npos);
    const Outcome life = fit(good,
                             "item,price,unit_cost,shelf_life_days\nroll,1.5,0.4,400\n"
                             "pie,4,1.5,1\n");
    CHECK(life.code == 2);
    CHECK(life.err.find("shelf_life_days 400 is above the scenario limit of 365") !=
          std::string::npos);
    const Outcome colon = fit(good,
                              "item,price,unit_cost,shelf_life_days,ty:pe\nroll,1.5,0.4,1,x\n"
                              "pie,4,1.5,1,y\n");
    CHECK(colon.code == 2);
    CHECK(colon.err.find("attribute name 'ty:pe'") != std::string::npos);
    CHECK(!fs::exists(out));
  }
  SECTION("odd but valid text and a history ending on 9999-12-31 load") {
    // Attribute values with quotes, a backslash, a hash and non-ASCII letters: written quoted.
    const Outcome quoted = fit(good,
                               "item,price,unit_cost,shelf_life_days,note\n"
                               "roll,1.5,0.4,1,\"say \"\"hi\"\" \\ # caf\xc3\xa9: {x}\"\n"
                               "pie,4,1.5,1,plain\n");
    INFO(quoted.err);
    REQUIRE(quoted.code == 0);
    Outcome c = larder(fmt::format("check {}", out.string()));
    INFO(c.err << slurp(out));
    CHECK(c.code == 0);
    CHECK(slurp(out).find("note: \"say \\\"hi\\\" \\\\ # caf\xc3\xa9: {x}\"") != std::string::npos);

    // Every date moved so that the last is 9999-12-31 (the horizon after it has no dates).
    std::istringstream lines(good);
    std::string shifted, line;
    std::getline(lines, line);
    shifted += line + "\n";
    const CivilDate last_before = add_days(*parse_iso_date("2027-02-01"), 139);
    const int offset =
        static_cast<int>(day_number(*parse_iso_date("9999-12-31")) - day_number(last_before));
    while (std::getline(lines, line)) {
      const auto date = parse_iso_date(line.substr(0, 10));
      REQUIRE(date);
      shifted += to_iso(add_days(*date, offset)) + line.substr(10) + "\n";
    }
    const Outcome late = fit(shifted);
    INFO(late.err);
    REQUIRE(late.code == 0);
    CHECK(slurp(out).find("start_weekday") != std::string::npos);
    c = larder(fmt::format("check {}", out.string()));
    INFO(c.err);
    CHECK(c.code == 0);
  }
}

}  // namespace
}  // namespace larder
