// Fuzz target: a drill's decision file (`larder drill --decisions FILE`,
// sim/drill/decision_reader.hpp) read against a fixed drill: two stores, the drill store closed
// on Sundays, deliveries Monday to Saturday, lead time 2, a warm-up of 7 days and 14 drill days
// of two of three items. Contract checked on every input: no crash, hang or sanitizer report;
// decisions or InputError, never anything else; accepted decisions hold one order per turn and
// drill item, each in [0, 1000000]; every problem names the file and a line of the text (or
// none). Crashes found become tests in tests/fuzz_regressions.test.cpp.

#include <cstddef>
#include <cstdint>
#include <cstdio>
#include <cstdlib>
#include <string>

#include "sim/drill/decision_reader.hpp"
#include "sim/scenario/load_scenario.hpp"

namespace {

// The drill's own scenario: its horizon is the warm-up plus the drill days (as DrillGame makes
// it), so drill_turns gives the game's turns.
const char* const kScenario = R"(format: 1
name: decision_fuzz
seed: 1
horizon: { days: 21, warmup_days: 7, start_weekday: mon }
replications: 1
stores:
  - { id: quay, open_weekdays: [mon, tue, wed, thu, fri, sat] }
  - { id: hill }
logistics: { lead_time_days: 2, delivery_weekdays: [mon, tue, wed, thu, fri, sat] }
items:
  - { id: rye, price: 4.2, unit_cost: 1.1, demand: { base: 18 } }
  - { id: croissant, price: 1.9, unit_cost: 1, demand: { base: 30 } }
  - { id: bun, price: 2.5, unit_cost: 0.9, demand: { base: 12 } }
policies:
  - { name: habit, forecast: { method: oracle }, quantity: { rule: critical_fractile } }
drill: { store: quay, items: [rye, bun], days: 14, compare: [habit] }
)";

struct Fixture {
  larder::Scenario scenario;
  std::vector<larder::DrillTurn> turns;
};

const Fixture& fixture() {
  static const Fixture f = [] {
    larder::Diagnostics diag;
    auto parsed = larder::parse_scenario(kScenario, "fuzz.yaml", diag);
    if (!parsed) {
      std::fputs(diag.format().c_str(), stderr);  // the fixture itself is broken
      std::abort();
    }
    Fixture out{std::move(*parsed), {}};
    out.turns = larder::drill_turns(out.scenario);
    return out;
  }();
  return f;
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const Fixture& f = fixture();
  const std::string text(reinterpret_cast<const char*>(data), size);
  long long lines = 1;
  for (const char c : text) lines += c == '\n' ? 1 : 0;
  larder::DrillDecisions decided;
  try {
    decided = larder::parse_decisions({f.scenario, f.turns}, text, "decisions.csv");
  } catch (const larder::InputError& e) {
    const larder::Diagnostics& diag = e.diagnostics();
    if (diag.ok() || diag.items().size() > larder::Diagnostics::kMaxKept + 1) __builtin_trap();
    for (const larder::Diagnostic& d : diag.items()) {
      if (d.where.file != "decisions.csv" || d.where.line < 0 || d.where.line > lines ||
          d.message.empty())
        __builtin_trap();
    }
    return 0;
  }
  if (decided.size() != f.turns.size()) __builtin_trap();
  for (const auto& turn : decided) {
    if (turn.size() != f.scenario.drill->items.size()) __builtin_trap();
    for (const int q : turn)
      if (q < 0 || q > 1000000) __builtin_trap();
  }
  return 0;
}
