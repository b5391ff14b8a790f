// End to end: the `larder` executable on the demo and on small scenarios, checking exit codes
// (cli.md: 0 success, 2 bad input), the output files and their columns, and error messages.

#include <fmt/format.h>
#include <sys/wait.h>

#include <array>
#include <catch2/catch.hpp>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <nlohmann/json.hpp>
#include <sstream>

#include "tests/cli_runner.test.hpp"

namespace larder {
namespace {

namespace fs = std::filesystem;

using test::Outcome;
using test::slurp;

fs::path scratch(const std::string& name) {
  return test::scratch_path("cli-test", name);
}

/// Runs `larder ARGS`, capturing stdout, stderr and the exit code.
Outcome larder(const std::string& args) {
  return test::run_larder("cli-test", args);
}

fs::path write_scenario(const std::string& name, const std::string& text) {
  const fs::path p = scratch(name);
  std::ofstream(p) << text;
  return p;
}

std::vector<std::string> lines(const std::string& text) {
  std::vector<std::string> out;
  std::istringstream in(text);
  for (std::string l; std::getline(in, l);) out.push_back(l);
  return out;
}

const char* kSmall = R"(format: 1
name: small
seed: 3
horizon: { days: 60, warmup_days: 7 }
replications: 5
stores: [ { id: corner } ]
items:
  - { id: roll, price: 1.5, unit_cost: 0.4, demand: { base: 30 } }
  - { id: pie, price: 4, unit_cost: 1.5, shelf_life_days: 2, demand: { base: 8 } }
policies:
  - name: fixed
    forecast: { method: oracle }
    quantity: { rule: fixed, quantity: { roll: 35, pie: 9 } }
  - name: fractile
    forecast: { method: ses_weekday, alpha: 0.2 }
    quantity: { rule: critical_fractile }
)";

TEST_CASE("larder run with no scenario runs the demo and writes the results", "[cli]") {
  const fs::path out = scratch("demo-out");
  const Outcome o = larder(fmt::format("run --quiet -r 4 --out {}", out.string()));
  INFO(o.err);
  REQUIRE(o.code == 0);
  CHECK(o.out.find("habit") != std::string::npos);
  CHECK(o.out.find("newsvendor-oracle") != std::string::npos);
  CHECK(o.err.empty());  // --quiet

  const auto metrics = lines(slurp(out / "metrics.csv"));
  REQUIRE(!metrics.empty());
  CHECK(metrics[0] == "policy,metric,mean,stderr,ci_low,ci_high,replications");
  const auto summary = nlohmann::json::parse(slurp(out / "summary.json"));
  CHECK(summary["baseline"] == "habit");
  CHECK(summary["replications"] == 4);
  REQUIRE(summary["policies"].size() == 4);
  CHECK(summary["policies"][0]["name"] == "habit");
  const size_t n_metrics = summary["policies"][0]["metrics"].size();
  CHECK(n_metrics >= 18);
  CHECK(metrics.size() == 1 + 4 * n_metrics);
  const auto reps = lines(slurp(out / "replications.csv"));
  CHECK(reps.size() == 1 + 4 * 4);
  CHECK(reps[0].rfind("policy,replication,demand_units,", 0) == 0);
}

TEST_CASE("larder run on a scenario file, JSON to stdout, same results at any thread count",
          "[cli]") {
  const fs::path file = write_scenario("small.yaml", kSmall);
  const fs::path a = scratch("small-a");
  const fs::path b = scratch("small-b");
  const Outcome one = larder(
      fmt::format("run {} --quiet --threads 1 --format json --out {}", file.string(), a.string()));
  INFO(one.err);
  REQUIRE(one.code == 0);
  const auto j = nlohmann::json::parse(one.out);
  CHECK(j["scenario"] == "small");
  CHECK(j["seed"] == 3);
  const Outcome two =
      larder(fmt::format("run {} --quiet --threads 2 --out {}", file.string(), b.string()));
  REQUIRE(two.code == 0);
  CHECK(slurp(a / "replications.csv") == slurp(b / "replications.csv"));
  CHECK(slurp(a / "metrics.csv") == slurp(b / "metrics.csv"));
}

TEST_CASE("larder check validates and summarises", "[cli]") {
  const fs::path file = write_scenario("check.yaml", kSmall);
  const Outcome o = larder(fmt::format("check {}", file.string()));
  INFO(o.err);
  REQUIRE(o.code == 0);
  CHECK(o.out.find("is valid") != std::string::npos);
  CHECK(o.out.find("store-item-days") != std::string::npos);
  // 1 store x 2 items x 60 open days, 53 of them scored.
  CHECK(o.out.find("120 open store-item-days per replication (106 scored)") != std::string::npos);
  CHECK(o.out.find("estimate") != std::string::npos);
}

TEST_CASE(
    "the options -r and --seed are read by the scenario keys' rules; nothing is created on refusal",
    "[cli]") {
  // Issue 23: --seed -1, 2^64 and 1e26 became 18446744073709551615; -r 1e3 said "not in range".
  const fs::path file = write_scenario("options.yaml", kSmall);
  const fs::path out = scratch("options-out");
  for (const char* seed : {"-1", "18446744073709551616", "1e26", "12x", "+5"}) {
    const Outcome o =
        larder(fmt::format("run {} --quiet --seed {} --out {}", file.string(), seed, out.string()));
    INFO(seed << ": " << o.err);
    CHECK(o.code == 2);
    CHECK(o.err.find(fmt::format("--seed: error: --seed must be a whole number in [0, "
                                 "18446744073709551615] (got {})",
                                 seed)) == 0);
    CHECK(!fs::exists(out));
  }
  // The largest seed is accepted, as in the YAML.
  const Outcome top =
      larder(fmt::format("check {} --seed 18446744073709551615 --format json", file.string()));
  CHECK(top.code == 0);

  // -r 1e3 is 1000, as `replications: 1e3` is in a scenario.
  const Outcome thousand = larder(fmt::format("check {} -r 1e3", file.string()));
  INFO(thousand.err);
  CHECK(thousand.code == 0);
  CHECK(thousand.out.find("1000 replications") != std::string::npos);
  const Outcome zero = larder(fmt::format("run {} -r 0 --out {}", file.string(), out.string()));
  CHECK(zero.code == 2);
  CHECK(zero.err.find("--replications: error: --replications must be in [1, ") == 0);
  const Outcome half = larder(fmt::format("run {} -r 2.5 --out {}", file.string(), out.string()));
  CHECK(half.code == 2);
  CHECK(half.err.find("--replications must be a whole number (got 2.5)") != std::string::npos);
  const Outcome word = larder(fmt::format("run {} -r many --out {}", file.string(), out.string()));
  CHECK(word.code == 2);
  CHECK(word.err.find("--replications must be a number (got many)") != std::string::npos);
  CHECK(!fs::exists(out));

  // Memory sizes with units, and small limits shown in their own unit.
  const Outcome tiny =
      larder(fmt::format("run {} --max-memory 1K --out {}", file.string(), out.string()));
  CHECK(tiny.code == 2);
  CHECK(tiny.err.find("more than the limit of 1 KiB") != std::string::npos);
  const Outcome bad =
      larder(fmt::format("run {} --max-memory 1e30T --out {}", file.string(), out.string()));
  CHECK(bad.code == 2);
  CHECK(bad.err.find("--max-memory 1e30T: expected a size") != std::string::npos);
  CHECK(!fs::exists(out));
}

TEST_CASE("larder check describes a drill exercise for its trainer", "[cli][drill]") {
  // The expected lines are read off scenarios/drill-bakery.yaml's drill: section.
  const std::string file =
      (fs::path(LARDER_SOURCE_DIR) / "scenarios" / "drill-bakery.yaml").string();
  const Outcome o = larder(fmt::format("check {}", file));
  INFO(o.err);
  REQUIRE(o.code == 0);
  CHECK(
      o.out.find("drill         store quay, items rye, croissant, bun; 28 days after the warm-up\n"
                 "                compared with habit, newsvendor, oracle (house rule: habit)") !=
      std::string::npos);
  CHECK(o.out.find("day 12: demand x 1.6 (hidden from the trainee)") != std::string::npos);
  CHECK(o.out.find("day 20: demand x 0.7 (announced the day before)") != std::string::npos);
  const Outcome j = larder(fmt::format("check {} --format json", file));
  REQUIRE(j.code == 0);
  const auto doc = nlohmann::json::parse(j.out);
  CHECK(doc["drill"]["items"] == nlohmann::json::array({"rye", "croissant", "bun"}));
  CHECK(doc["drill"]["events"][0]["announced"] == false);
  CHECK(doc["drill"]["events"][1]["demand"] == 0.7);
  // A scenario without a drill says nothing about one.
  const Outcome plain =
      larder(fmt::format("check {}", write_scenario("nodrill.yaml", kSmall).string()));
  CHECK(plain.out.find("  drill ") == std::string::npos);
}

TEST_CASE("every worked scenario in scenarios/ is valid", "[cli]") {
  int n = 0;
  for (const auto& entry : fs::directory_iterator(fs::path(LARDER_SOURCE_DIR) / "scenarios")) {
    if (entry.path().extension() != ".yaml") continue;
    const Outcome o = larder(fmt::format("check {}", entry.path().string()));
    INFO(entry.path() << "\n" << o.err);
    CHECK(o.code == 0);
    ++n;
  }
  CHECK(n >= 3);
}

TEST_CASE("a run with substitution writes substitution.csv", "[cli]") {
  const fs::path out = scratch("leftovers-out");
  const Outcome o =
      larder(fmt::format("run {}/scenarios/leftovers.yaml --replications 2 --out {} "
                         "--quiet --format json",
                         LARDER_SOURCE_DIR, out.string()));
  INFO(o.err);
  REQUIRE(o.code == 0);
  const auto rows = lines(slurp(out / "substitution.csv"));
  REQUIRE(rows.size() == 1 + 4 * 2);  // header, 4 policies x 2 pairs
  CHECK(rows[0] == "policy,from_item,to_item,mean,stderr,ci_low,ci_high,replications");
  CHECK(rows[1].rfind("newsvendor,sourdough,rye,", 0) == 0);
  CHECK(slurp(out / "metrics.csv").find(",served_share,") != std::string::npos);
  const auto breakdown = lines(slurp(out / "breakdown.csv"));
  REQUIRE(!breakdown.empty());
  CHECK(breakdown[0] == "policy,dimension,key,metric,mean,stderr");
  CHECK(slurp(out / "breakdown.csv").find("\nnewsvendor,type,bread,waste_units,") !=
        std::string::npos);
  CHECK(slurp(out / "metrics.csv").find(",discount_revenue,") != std::string::npos);
}

TEST_CASE("larder allocate prints and writes a network plan", "[cli]") {
  const fs::path csv = scratch("allocation.csv");
  const std::string scenario = fmt::format("{}/scenarios/grouping.yaml", LARDER_SOURCE_DIR);
  const Outcome o =
      larder(fmt::format("allocate {} --policy abc --out {} --quiet", scenario, csv.string()));
  INFO(o.err);
  REQUIRE(o.code == 0);
  CHECK(o.out.find("network (target)") != std::string::npos);
  const auto rows = lines(slurp(csv));
  REQUIRE(rows.size() == 1 + 3 + 8 * 12 + 1);  // header, A/B/C, 8 stores x 12 items, network
  CHECK(rows[0] ==
        "scope,group,store,item,level,order_basis,open_days,expected_in_stock,"
        "expected_leftover_units,expected_profit,critical_ratio,demand_cv,planned_in_stock,"
        "leftover_per_day,profit_per_day,point_cost_per_day");
  CHECK(rows[1].rfind("group,A,,,", 0) == 0);
  // The why columns are filled on group rows only.
  CHECK(rows[1].back() != ',');
  CHECK(rows[4].substr(rows[4].size() - 6) == ",,,,,,");
  CHECK(rows.back().rfind("network,,,,0.7,", 0) == 0);
  // A policy that is not network_in_stock is bad input, with the names that would do.
  const Outcome bad = larder(fmt::format("allocate {} --policy flat-70", scenario));
  CHECK(bad.code == 2);
  CHECK(bad.err.find("no network_in_stock policy of that name") != std::string::npos);
  CHECK(bad.err.find("per-item") != std::string::npos);
}

TEST_CASE("larder sweep --vary ranks the policies on profit and the chosen waste metric",
          "[cli][sweep]") {
  const fs::path scenario = write_scenario("vary.yaml", kSmall);
  const fs::path out = scratch("vary-out");
  const Outcome o =
      larder(fmt::format("sweep {} --vary price=-10%,+10% --waste-metric waste_share "
                         "-r 3 --quiet --out {}",
                         scenario.string(), out.string()));
  INFO(o.err);
  REQUIRE(o.code == 0);
  CHECK(o.out.find("ranks on profit (higher is better; 1 = best)") != std::string::npos);
  CHECK(o.out.find("ranks on waste_share (lower is better; 1 = best)") != std::string::npos);
  CHECK(o.out.find("RANKING FLIPS") == std::string::npos);
  const auto rows = lines(slurp(out / "ranks.csv"));
  // Header, then 3 runs (base, -10%, +10%) x 2 policies x 2 metrics.
  REQUIRE(rows.size() == 1 + 3 * 2 * 2);
  CHECK(rows[0] == "input,value,metric,policy,mean,rank,best,best_changes");
  CHECK(rows[1].rfind("base,,profit,fixed,", 0) == 0);
  CHECK(rows[7].rfind("base,,waste_share,fixed,", 0) == 0);
  CHECK(fs::exists(out / "sensitivity.csv"));
  CHECK_THAT(slurp(out / "sweep.html"), Catch::Contains("Does the best policy stay the best?"));
  // A metric the scenario does not report, or a misspelt one, is bad input with a hint.
  const Outcome no_co2e =
      larder(fmt::format("sweep {} --vary price=-10% --waste-metric co2e_kg", scenario.string()));
  CHECK(no_co2e.code == 2);
  CHECK(no_co2e.err.find("--waste-metric co2e_kg: not a metric") != std::string::npos);
  const Outcome misspelt = larder(
      fmt::format("sweep {} --vary price=-10% --waste-metric wast_units", scenario.string()));
  CHECK(misspelt.code == 2);
  CHECK(misspelt.err.find("did you mean waste_units?") != std::string::npos);
}

TEST_CASE("larder allocate averages plans and writes a rollout table", "[cli]") {
  const fs::path csv = scratch("allocation-avg.csv");
  const fs::path rollout = scratch("rollout.csv");
  const std::string scenario = fmt::format("{}/scenarios/grouping.yaml", LARDER_SOURCE_DIR);
  const Outcome o =
      larder(fmt::format("allocate {} --policy by-type -r 2 --days 2 --out {} "
                         "--rollout {} --quiet",
                         scenario, csv.string(), rollout.string()));
  INFO(o.err);
  REQUIRE(o.code == 0);
  CHECK(o.out.find("the average of 4 plans: 2 replications x 2 days") != std::string::npos);
  CHECK(o.out.find("One more point of network in-stock costs") != std::string::npos);
  const auto rows = lines(slurp(rollout));
  REQUIRE(rows.size() == 1 + 8 * 12);
  CHECK(rows[0] ==
        "store,item,group,attribute:type,attribute:sourcing,level,expected_in_stock,order_mon,"
        "order_tue,order_wed,order_thu,order_fri,order_sat,order_sun");
  CHECK(rows[1].find(",bread,bread,make,") != std::string::npos);  // baguette
  // The rollout goes through the output checks: never over the scenario itself.
  const Outcome over = larder(fmt::format("allocate {} --policy by-type --out {} --rollout {}",
                                          scenario, csv.string(), scenario));
  CHECK(over.code == 2);
  CHECK(over.err.find("--rollout") != std::string::npos);
  // --days past the horizon is bad input.
  const Outcome far =
      larder(fmt::format("allocate {} --policy by-type --day 190 --days 10 "
                         "--out {}",
                         scenario, csv.string()));
  CHECK(far.code == 2);
  CHECK(far.err.find("--days 10") != std::string::npos);
}

TEST_CASE("bad input exits 2 with file:line:col messages", "[cli]") {
  std::string text = kSmall;
  text.replace(text.find("shelf_life_days: 2"), 18, "shelf_life_days: 0");
  const fs::path file = write_scenario("bad.yaml", text);
  const Outcome o = larder(fmt::format("run {} --quiet", file.string()));
  CHECK(o.code == 2);
  // Line 9 holds the pie item, whose shelf life is now 0.
  CHECK(o.err.find(fmt::format("{}:9:", file.string())) != std::string::npos);
  CHECK(o.err.find("error: items[1].shelf_life_days must be in [1, 365] (got 0)") !=
        std::string::npos);

  const Outcome missing = larder("check /nonexistent/nowhere.yaml");
  CHECK(missing.code == 2);
  CHECK(missing.err.find("nowhere.yaml") != std::string::npos);

  CHECK(larder("run --no-such-option").code == 2);
  CHECK(larder("run --threads 0").code == 2);
}

TEST_CASE("the version and help flags exit 0", "[cli]") {
  const Outcome v = larder("--version");
  CHECK(v.code == 0);
  CHECK(v.out.find("larder ") != std::string::npos);
  const Outcome h = larder("--help");
  CHECK(h.code == 0);
  CHECK(h.out.find("critical_fractile") != std::string::npos);
}

}  // namespace
}  // namespace larder
