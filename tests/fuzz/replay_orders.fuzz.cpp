// Fuzz target: a `replay` order file (policies/quantity/replay_file.hpp) read against a fixed
// scenario with two stores, two items, a start date, a closed weekday, delivery weekdays and a
// lead time of 2. Contract checked on every input: no crash, hang or sanitizer report; orders or
// problems, never both or neither; accepted orders within the scenario (store, item, day range,
// quantity range), sorted and never two for one store, item and day; every problem names the
// file and a line of the text. Crashes found become tests in tests/fuzz_regressions.test.cpp.

#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <sstream>
#include <string>

#include "policies/quantity/replay_file.hpp"
#include "sim/scenario/load_scenario.hpp"

namespace {

const char* const kScenario = R"(format: 1
name: replay_fuzz
seed: 1
horizon: { days: 30, warmup_days: 0, start_date: 2027-03-01 }
replications: 1
stores:
  - { id: north }
  - { id: south, open_weekdays: [mon, tue, wed, thu, fri, sat] }
logistics: { lead_time_days: 2, delivery_weekdays: [mon, tue, wed, thu, fri] }
items:
  - { id: loaf, price: 3, unit_cost: 1, demand: { base: 20 } }
  - { id: bun, price: 1, unit_cost: 0.3, demand: { base: 40 } }
policies:
  - { name: past, forecast: { method: oracle }, quantity: { rule: critical_fractile } }
)";

const larder::Scenario& scenario() {
  static const larder::Scenario s = [] {
    larder::Diagnostics diag;
    auto parsed = larder::parse_scenario(kScenario, "fuzz.yaml", diag);
    if (!parsed) {
      std::fputs(diag.format().c_str(), stderr);  // the fixture itself is broken
      std::abort();
    }
    return std::move(*parsed);
  }();
  return s;
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const larder::Scenario& sc = scenario();
  const std::string text(reinterpret_cast<const char*>(data), size);
  std::istringstream in(text);
  larder::Diagnostics diag;
  const auto orders = larder::parse_replay_orders(in, "orders.csv", sc, diag);
  if (orders.has_value() != diag.ok()) __builtin_trap();
  long long lines = 1;
  for (const char c : text) lines += c == '\n' ? 1 : 0;
  for (const larder::Diagnostic& d : diag.items()) {
    if (d.where.file != "orders.csv" || d.where.line < 1 || d.where.line > lines + 1 ||
        d.message.empty())
      __builtin_trap();
  }
  (void)diag.format();
  if (!orders) return 0;
  if (orders->size() != sc.stores.size()) __builtin_trap();
  for (const auto& store : *orders) {
    for (std::size_t k = 0; k < store.size(); ++k) {
      const larder::ReplayOrder& o = store[k];
      if (o.item < 0 || o.item >= static_cast<int>(sc.items.size()) ||
          o.day < -sc.logistics.lead_time_days || o.day >= sc.horizon.days || o.quantity < 0 ||
          o.quantity > 1000000000)
        __builtin_trap();
      if (k > 0 && !(store[k - 1] < o)) __builtin_trap();  // sorted, no duplicate
    }
  }
  return 0;
}
