// replay: quantities from a CSV of past orders reach the shelf exactly, shifted by the lead
// time (cases worked by hand: the file is generated here and every delivery is predicted from
// it), and bad rows are reported one by one as file:line:column.

#include <fmt/format.h>
#include <unistd.h>

#include <catch2/catch.hpp>
#include <filesystem>
#include <fstream>

#include "policies/quantity/part_fixture.test.hpp"
#include "sim/engine/store_run.hpp"
#include "sim/scenario/iso_date.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

namespace fs = std::filesystem;

/// A fresh folder for one test case's files, removed afterwards.
class TempFolder {
 public:
  explicit TempFolder(const std::string& name)
      : path_(fs::temp_directory_path() /
              fmt::format("larder-replay-{}-{}", name, static_cast<long>(::getpid()))) {
    fs::remove_all(path_);
    fs::create_directories(path_);
  }
  ~TempFolder() {
    std::error_code ec;
    fs::remove_all(path_, ec);
  }
  std::string file(const std::string& name, const std::string& text) const {
    const fs::path p = path_ / name;
    std::ofstream(p, std::ios::binary) << text;
    return p.string();
  }
  std::string path(const std::string& name) const { return (path_ / name).string(); }

 private:
  fs::path path_;
};

constexpr int kDays = 12;
constexpr int kLead = 2;
const char* const kStores[] = {"north", "south"};
const char* const kItems[] = {"loaf", "bun"};

/// The hand-made order history: some quantity for every store, item and day from -lead to the
/// last day, except every fourth day of the loaf (no row: the store orders 0).
std::optional<int> past_order(int store, int item, int day) {
  if (item == 0 && (day + 8) % 4 == 3) return std::nullopt;
  return 10 + 3 * (day + kLead) + 5 * item + store;
}

std::string history(bool dated) {
  std::string csv = dated ? "date,store,item,quantity\n" : "store,item,day,quantity\n";
  const CivilDate start{2027, 3, 1};
  for (int day = -kLead; day < kDays; ++day) {
    for (int s = 0; s < 2; ++s) {
      for (int i = 0; i < 2; ++i) {
        const auto q = past_order(s, i, day);
        if (!q) continue;
        csv += dated ? fmt::format("{},{},{},{}\n", to_iso(add_days(start, day)), kStores[s],
                                   kItems[i], *q)
                     : fmt::format("{},{},{},{}\n", kStores[s], kItems[i], day, *q);
      }
    }
  }
  return csv;
}

std::string scenario(const std::string& file, const std::string& extra_store = "") {
  return fmt::format(R"(format: 1
name: replay
seed: 3
horizon: {{ days: {}, warmup_days: 0, start_date: 2027-03-01 }}
replications: 3
stores: [ {{ id: north }}, {{ id: south {} }} ]
logistics: {{ lead_time_days: {} }}
items:
  - {{ id: loaf, price: 3, unit_cost: 1, demand: {{ base: 20 }} }}
  - {{ id: bun, price: 1, unit_cost: 0.3, demand: {{ base: 40 }} }}
policies:
  - {{ name: past, forecast: {{ method: oracle }}, quantity: {{ rule: replay, file: {} }} }}
)",
                     kDays, extra_store, kLead, file);
}

TEST_CASE("replay delivers the file's quantities, shifted by the lead time, through the engine",
          "[policies][quantity][replay]") {
  TempFolder dir("engine");
  for (const bool dated : {false, true}) {
    DYNAMIC_SECTION((dated ? "date column" : "day column")) {
      const std::string file = dir.file(dated ? "dated.csv" : "days.csv", history(dated));
      const Scenario s = test::scenario_from(scenario(file));
      const std::vector<Policy> policies = test::policies_for(s);
      const DemandModel demand(s);
      const SimSetup setup{s, demand, policies, 11};
      long expected_total = 0;
      for (int store = 0; store < 2; ++store) {
        StoreRun run(setup, 0, store);
        std::vector<std::int64_t> before(2, 0);
        for (int day = 0; day < kDays; ++day) {
          run.run_days(day, day + 1);
          for (int i = 0; i < 2; ++i) {
            // The delivery of day d is the order placed on day d - lead, or 0 without a row.
            const std::int64_t got = run.tallies(0)[static_cast<size_t>(i)].delivered - before[i];
            before[static_cast<size_t>(i)] += got;
            INFO("store " << kStores[store] << " item " << kItems[i] << " day " << day);
            CHECK(got == past_order(store, i, day - kLead).value_or(0));
            expected_total += past_order(store, i, day - kLead).value_or(0);
          }
        }
      }
      // The Monte Carlo runner: the same deliveries in every replication.
      const RunResult r = test::run_scenario(s);
      const Estimate delivered = test::metric_estimate(r, 0, Metric::delivered_units);
      CHECK(delivered.mean == static_cast<double>(expected_total));
      CHECK(delivered.stderr_ == 0.0);
    }
  }
}

TEST_CASE("replay reads its file relative to the scenario's folder",
          "[policies][quantity][replay]") {
  TempFolder dir("relative");
  dir.file("orders.csv", "store,item,day,quantity\nsouth,bun,4,17\n");
  qty_test::PartHarness h(scenario("orders.csv"), dir.path("s.yaml"));
  std::vector<OrderInput> in(2);
  in[1].usable_stock = 50;                          // ignored: the file says what was ordered
  CHECK(h.order(4, in) == std::vector<int>{0, 0});  // store 0 (north) has no rows
  CHECK(qty_test::build_problems(scenario("missing.csv"), dir.path("s.yaml")) ==
        fmt::format("{}:12:81: error: policies[0].quantity.file: cannot read '{}'\n"
                    "  hint: the path is relative to the scenario file's folder\n",
                    dir.path("s.yaml"), dir.path("missing.csv")));
}

TEST_CASE("replay reports every bad row with file:line:column", "[policies][quantity][replay]") {
  TempFolder dir("rows");
  const std::string file = dir.file("bad.csv",
                                    "store,item,day,quantity\n"
                                    "north,loaf,0,12\n"
                                    "north,bread,1,5\n"
                                    "east,loaf,1,5\n"
                                    "north,loaf,1.5,5\n"
                                    "north,loaf,99,5\n"
                                    "north,loaf,2,-3\n"
                                    "north,loaf,2\n"
                                    "north,loaf,0,7\n"
                                    "\n"
                                    "nort,bun,3,4\n"
                                    "south,bun,5,4\n");
  // south is closed on Saturdays: 2027-03-01 is a Monday, so day 5 is a Saturday and the order
  // of day 3 (lead time 2) would arrive then.
  const std::string text =
      qty_test::build_problems(scenario(file, ", open_weekdays: [mon, tue, wed, thu, fri, sun]"));
  const std::string f = dir.path("bad.csv");
  CHECK(text ==
        fmt::format("{0}:3:7: error: unknown item 'bread'\n"
                    "{0}:4:1: error: unknown store 'east'\n"
                    "{0}:5:12: error: day must be a whole number (got '1.5')\n"
                    "{0}:6:12: error: day must be in [-2, 11] (got 99)\n"
                    "  hint: orders are placed from day -2 (the opening orders, lead time 2) to "
                    "the last day of the horizon\n"
                    "{0}:7:14: error: quantity must be a whole number in [0, 1000000000] (got "
                    "'-3')\n"
                    "{0}:8:1: error: expected 4 fields (store,item,day,quantity), got 3\n"
                    "{0}:9:1: error: a second order of item 'loaf' at store 'north' placed on "
                    "day 0 (the first is on line 2)\n"
                    "{0}:11:1: error: unknown store 'nort'\n"
                    "  hint: did you mean 'north'?\n",
                    f));
  // The closed day on its own (the other rows are fine).
  const std::string closed = dir.file("closed.csv", "store,item,day,quantity\nsouth,bun,3,4\n");
  CHECK(qty_test::build_problems(
            scenario(closed, ", open_weekdays: [mon, tue, wed, thu, fri, sun]")) ==
        fmt::format("{}:2:1: error: store 'south' is closed on day 5, when an order placed on "
                    "day 3 would arrive (lead time 2)\n"
                    "  hint: remove the row, or check the lead time and the store's opening "
                    "days\n",
                    closed));
  // No delivery on Saturdays: the same row.
  std::string no_saturday = scenario(closed);
  no_saturday.replace(no_saturday.find("logistics: { "), 13,
                      "logistics: { delivery_weekdays: [mon, tue, wed, thu, fri, sun], ");
  CHECK(qty_test::build_problems(no_saturday) ==
        fmt::format("{}:2:1: error: day 5 is not a delivery day (logistics.delivery_weekdays), "
                    "when an order placed on day 3 would arrive (lead time 2)\n"
                    "  hint: remove the row, or check the lead time and the delivery weekdays\n",
                    closed));
}

TEST_CASE("replay checks the header and dates", "[policies][quantity][replay]") {
  TempFolder dir("header");
  const std::string unknown = dir.file("h1.csv", "store,item,when,quantity\nnorth,loaf,0,1\n");
  CHECK(qty_test::build_problems(scenario(unknown)) ==
        fmt::format("{0}:1:12: error: unknown column 'when'\n"
                    "  hint: columns: store, item, quantity and either day or date\n"
                    "{0}:1:1: error: the header has no column 'day' or 'date'\n"
                    "  hint: day: the scenario day on which the order is placed; date: its ISO "
                    "date\n",
                    unknown));
  const std::string dates = dir.file("h2.csv",
                                     "date,store,item,quantity\n"
                                     "2027-02-27,north,loaf,3\n"
                                     "2027-02-26,north,loaf,3\n"
                                     "2027-02-30,north,loaf,3\n"
                                     "1.3.2027,north,loaf,3\n");
  CHECK(qty_test::build_problems(scenario(dates)) ==
        fmt::format("{0}:3:1: error: date must be from 2027-02-27 to 2027-03-12 (got 2027-02-26)\n"
                    "  hint: orders are placed from 2 day(s) before horizon.start_date (the "
                    "opening orders) to the last day of the horizon\n"
                    "{0}:4:1: error: date is not a date in the calendar (got 2027-02-30)\n"
                    "{0}:5:1: error: date must be an ISO date YYYY-MM-DD (got '1.3.2027')\n",
                    dates));
  // A date column needs the calendar date of day 0.
  std::string undated = scenario(dates);
  undated.replace(undated.find(", start_date: 2027-03-01"), 24, "");
  CHECK(qty_test::build_problems(undated) ==
        fmt::format("{}:1:1: error: column 'date' needs horizon.start_date in the scenario\n"
                    "  hint: set horizon.start_date, or give the scenario day in a column 'day'\n",
                    dates));
}

}  // namespace
}  // namespace larder
