// Hostile and odd input (issue 10): every file below gets a clear `file:line:col: error:`
// message and exit code 2 from the `larder` executable, never a crash (a signal), a hang (each
// command must finish in seconds) or an unreadable message.

#include <chrono>
#include <cstdlib>
#include <fstream>
#include <pcg_random.hpp>

#include "tests/cli_runner.test.hpp"

namespace larder {
namespace {

using test::Outcome;

const char* kArea = "hostile";

const std::string kValid = R"(format: 1
name: hostile
seed: 3
horizon: { days: 40, warmup_days: 7 }
replications: 3
stores: [ { id: corner } ]
items:
  - { id: roll, price: 1.5, unit_cost: 0.4, demand: { base: 30 } }
policies:
  - name: fixed
    forecast: { method: oracle }
    quantity: { rule: fixed, quantity: 35 }
)";

/// `s` with `from` replaced by `to` (which must occur).
std::string replaced(std::string s, const std::string& from, const std::string& to) {
  const auto at = s.find(from);
  REQUIRE(at != std::string::npos);
  s.replace(at, from.size(), to);
  return s;
}

std::string edited(const std::string& from, const std::string& to) {
  return replaced(kValid, from, to);
}

/// `larder check` on `text`, timed.
Outcome check_text(const std::string& name, const std::string& text, double* seconds = nullptr) {
  const auto file = test::scratch_path(kArea, name);
  test::write_text(file, text);
  const auto start = std::chrono::steady_clock::now();
  Outcome o = test::run_larder(kArea, fmt::format("check {}", file.string()));
  if (seconds) {
    *seconds = std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  }
  return o;
}

/// Exit code 2, and every line of stderr a diagnostic or its hint naming the file.
void require_input_error(const Outcome& o, const std::string& name, const std::string& words) {
  INFO(o.err);
  REQUIRE(o.code == 2);
  // The first line is `<path>/<name>:line:col: error: ...` (the file, where, what).
  CHECK(o.err.find(test::scratch_dir(kArea).string() + "/" + name) == 0);
  CHECK(o.err.find("error: ") != std::string::npos);
  CHECK(o.err.find(words) != std::string::npos);
  CHECK(o.out.empty());
  // Printable: no control characters but line ends (a NUL would cut a message short).
  for (const char c : o.err) CHECK((static_cast<unsigned char>(c) >= 0x20 || c == '\n'));
}

TEST_CASE("an empty file and a file of blanks are refused", "[hostile]") {
  require_input_error(check_text("empty.yaml", ""), "empty.yaml", "the scenario is empty");
  require_input_error(check_text("blank.yaml", "\n  \n# nothing\n"), "blank.yaml",
                      "the scenario is empty");
}

TEST_CASE("binary garbage is refused as not text, naming the byte", "[hostile]") {
  pcg32 rng(2024);  // fixed bytes, so the test is the same every time
  std::string garbage;
  for (int i = 0; i < 4096; ++i) garbage += static_cast<char>(rng() & 0xFF);
  require_input_error(check_text("garbage.yaml", garbage), "garbage.yaml",
                      "the file is not YAML text");
  // A NUL byte in otherwise good YAML, and a UTF-16 file (what some spreadsheet exports write).
  require_input_error(check_text("nul.yaml", edited("name: hostile", std::string("name: a\0b", 9))),
                      "nul.yaml:2:8", "byte 0x00 is a control character");
  require_input_error(check_text("utf16.yaml",
                                 "\xFF\xFE"
                                 "f\0o\0r\0"),
                      "utf16.yaml:1:1", "not part of valid UTF-8");
}

TEST_CASE("a YAML alias bomb is refused before anything expands it", "[hostile]") {
  // Each anchor is a list of nine aliases of the previous one: 9^30 nodes once expanded.
  std::string bomb = "a0: &a0 [x, x, x, x, x, x, x, x, x]\n";
  for (int i = 1; i < 30; ++i) {
    bomb += fmt::format("a{}: &a{} [", i, i);
    for (int k = 0; k < 9; ++k) bomb += fmt::format("{}*a{}", k ? ", " : "", i - 1);
    bomb += "]\n";
  }
  double seconds = 0;
  const Outcome o = check_text("bomb.yaml", kValid + bomb, &seconds);
  require_input_error(o, "bomb.yaml", "expands to more than 2000000 nodes through its aliases");
  CHECK(seconds < 10.0);
  // The same bomb where the reader looks (an item's attributes).
  const Outcome inside = check_text(
      "bomb-inside.yaml",
      bomb + edited("demand: { base: 30 } }", "demand: { base: 30 }, attributes: *a29 }"));
  require_input_error(inside, "bomb-inside.yaml", "through its aliases");
}

TEST_CASE("deep nesting is refused with the limit, block or flow", "[hostile]") {
  std::string flow = "format: 1\nx: ";  // appended, not `+`: GCC 12's bogus -Warray-bounds
  flow.append(100000, '[').append(100000, ']');
  require_input_error(check_text("flow.yaml", flow), "flow.yaml:2:", "nests deeper than 64 levels");
  std::string block = "format: 1\n";
  for (int level = 0; level < 200; ++level) block += std::string(level, ' ') + "k:\n";
  require_input_error(check_text("block.yaml", block), "block.yaml:", "nests deeper than 64");
  std::string dashes = "format: 1\nx:\n";
  for (int i = 0; i < 100; ++i) dashes += "- ";
  require_input_error(check_text("dashes.yaml", dashes + "1\n"), "dashes.yaml:3:", "nests deeper");
}

TEST_CASE("numbers too large for their type are refused with the limit", "[hostile]") {
  require_input_error(
      check_text("reps.yaml", edited("replications: 3", "replications: 99999999999")),
      "reps.yaml:5:15", "replications must be in [1, 1000000]");
  require_input_error(check_text("base.yaml", edited("base: 30", "base: 1e300")),
                      "base.yaml:8:", "demand.base must be in [0, 100000000]");
  require_input_error(check_text("days.yaml", edited("days: 40", "days: 2147483648")),
                      "days.yaml:4:", "horizon.days must be in [1, 100000]");
  require_input_error(check_text("life.yaml", edited("unit_cost: 0.4,",
                                                     "unit_cost: 0.4, "
                                                     "shelf_life_days: 1e9,")),
                      "life.yaml:8:", "shelf_life_days must be in [1, 365]");
  require_input_error(check_text("price.yaml", edited("price: 1.5", "price: 1e300")), "price.yaml",
                      "price must be in [0, 1000000000]");
  // Each factor within its limit, their product not: base x weekday x size.
  const Outcome product = check_text(
      "product.yaml",
      replaced(edited("stores: [ { id: corner } ]", "stores: [ { id: corner, size: 900 } ]"),
               "base: 30", "base: 1e7, weekday: { sat: 900 }"));
  require_input_error(product, "product.yaml", "the limit is 100000000 per store-item-day");
}

TEST_CASE("zero or negative replications, zero scored days, every store closed", "[hostile]") {
  require_input_error(check_text("zero.yaml", edited("replications: 3", "replications: 0")),
                      "zero.yaml:5:15", "replications must be in [1, 1000000] (got 0)");
  require_input_error(check_text("neg.yaml", edited("replications: 3", "replications: -4")),
                      "neg.yaml:5:15", "(got -4)");
  const auto file = test::scratch_path(kArea, "ok.yaml");
  test::write_text(file, kValid);
  for (const char* r : {"0", "-1"}) {
    const Outcome o =
        test::run_larder(kArea, fmt::format("run {} -r {} --quiet --out {}", file.string(), r,
                                            test::scratch_path(kArea, "o").string()));
    INFO(o.err);
    CHECK(o.code == 2);
    CHECK(o.err.find("--replications") != std::string::npos);
  }
  require_input_error(check_text("scored.yaml", edited("warmup_days: 7", "warmup_days: 40")),
                      "scored.yaml:4:", "warmup_days must be in [0, 39]");
  require_input_error(
      check_text("closed.yaml", edited("seed: 3", "seed: 3\ncalendar: { open_weekdays: [] }")),
      "closed.yaml:4:", "open_weekdays must list at least one weekday");
  require_input_error(check_text("closed-store.yaml",
                                 edited("{ id: corner }", "{ id: corner, open_weekdays: [] }")),
                      "closed-store.yaml:6:", "open_weekdays must list at least one weekday");
}

TEST_CASE("ids with odd characters are refused and shown escaped", "[hostile]") {
  const Outcome nul =
      check_text("nul-id.yaml", edited("id: roll", "id: \"ro\\0ll\""));  // a YAML escape: NUL
  require_input_error(nul, "nul-id.yaml:8:", "(got 'ro\\x00ll')");
  const Outcome space = check_text("space-id.yaml", edited("id: roll", "id: \"ro ll/..\""));
  require_input_error(space, "space-id.yaml:8:", "must use only letters, digits");
  const Outcome escape = check_text("esc-id.yaml", edited("id: roll", "id: \"\\e[31mred\""));
  require_input_error(escape, "esc-id.yaml:8:", "\\x1B[31mred");
}

TEST_CASE("duplicate keys are refused at the second one", "[hostile]") {
  require_input_error(check_text("dup.yaml", edited("seed: 3", "seed: 3\nseed: 4")), "dup.yaml:4:1",
                      "duplicate key 'seed' in the scenario");
  require_input_error(check_text("dup-item.yaml", edited("price: 1.5,", "price: 1.5, price: 2,")),
                      "dup-item.yaml:8:", "duplicate key 'price' in items[0]");
}

TEST_CASE("substitutes: an item naming itself is refused, a cycle of two is a model", "[hostile]") {
  require_input_error(
      check_text("self.yaml", edited("demand: { base: 30 } }",
                                     "demand: { base: 30 }, substitutes: { roll: 0.3 } }")),
      "self.yaml:8:", "roll");
  // rye <-> spelt: customers of either may take the other (one attempt, README): valid, runs.
  const std::string cycle = edited(
      "  - { id: roll, price: 1.5, unit_cost: 0.4, demand: { base: 30 } }",
      "  - { id: roll, price: 1.5, unit_cost: 0.4, demand: { base: 30 }, substitutes: { bun: 0.3 } "
      "}\n  - { id: bun, price: 1.5, unit_cost: 0.4, demand: { base: 30 }, substitutes: { roll: "
      "0.3 } }");
  const auto file = test::scratch_path(kArea, "cycle.yaml");
  test::write_text(file, cycle);
  const Outcome o =
      test::run_larder(kArea, fmt::format("run {} --quiet --out {}", file.string(),
                                          test::scratch_path(kArea, "cycle-out").string()));
  INFO(o.err);
  CHECK(o.code == 0);
}

TEST_CASE("a run that would need more memory than allowed is refused before it starts",
          "[hostile]") {
  const auto file = test::scratch_path(kArea, "mem.yaml");
  test::write_text(file, kValid);
  const auto out = test::scratch_path(kArea, "mem-out");
  const Outcome small = test::run_larder(
      kArea, fmt::format("run {} --max-memory 1M --out {}", file.string(), out.string()));
  INFO(small.err);
  CHECK(small.code == 2);
  CHECK(small.err.find("this run would need about") != std::string::npos);
  CHECK(small.err.find("more than the limit of 1 MiB") != std::string::npos);
  CHECK(!test::fs::exists(out));  // nothing written

  // A million stores over 3,000 days: refused from the sizes alone, in seconds (building the
  // demand model to estimate it would itself take gigabytes).
  const auto big = test::scratch_path(kArea, "huge.yaml");
  test::write_text(big, replaced(edited("stores: [ { id: corner } ]", "stores: { count: 1000000 }"),
                                 "days: 40", "days: 3000"));
  const auto start = std::chrono::steady_clock::now();
  const Outcome huge = test::run_larder(
      kArea, fmt::format("run {} --max-memory 4G --out {}", big.string(), out.string()));
  const double seconds =
      std::chrono::duration<double>(std::chrono::steady_clock::now() - start).count();
  INFO(huge.err);
  CHECK(huge.code == 2);
  CHECK(huge.err.find("this run would need at least") != std::string::npos);
  CHECK(seconds < 30.0);
  CHECK(!test::fs::exists(out));
}

// --- issue 23: every reader bounded before it allocates -----------------------------------

TEST_CASE("readers fed a device or an endless pipe stop at their cap", "[hostile]") {
  // /dev/zero never ends and has no line ends: each reader must stop at its cap, exit 2 and
  // name the file, never read on (the test would hang) nor allocate without bound.
  const Outcome scenario = test::run_larder(kArea, "check /dev/zero");
  INFO(scenario.err);
  CHECK(scenario.code == 2);
  CHECK(scenario.err.find("/dev/zero: error: the file is too large for a scenario: more than "
                          "the limit of 16 MiB") == 0);

  // A pipe that never ends: `yes` stops when larder closes its end.
  const test::fs::path err = test::scratch_path(kArea, "pipe-err.txt");
  const int status = std::system(
      fmt::format("yes 'a: 1' | {} check /dev/stdin 2>{}", LARDER_BINARY, err.string()).c_str());
  CHECK(WIFEXITED(status));
  CHECK(WEXITSTATUS(status) == 2);
  CHECK(test::slurp(err).find("too large for a scenario") != std::string::npos);

  const auto out = test::scratch_path(kArea, "zero-fit.yaml");
  const Outcome fit = test::run_larder(kArea, fmt::format("fit /dev/zero --out {}", out.string()));
  INFO(fit.err);
  CHECK(fit.code == 2);
  CHECK(fit.err.find("/dev/zero:1:1: error: the header is longer than") == 0);
  CHECK(!test::fs::exists(out));

  const auto history = test::scratch_path(kArea, "h.csv");
  test::write_text(history, "date,store,item,delivered,sold,leftover,sold_out\n");
  const Outcome items = test::run_larder(
      kArea, fmt::format("fit {} --items /dev/zero --out {}", history.string(), out.string()));
  CHECK(items.code == 2);
  CHECK(items.err.find("/dev/zero:1:1: error: the header is too long") == 0);

  const Outcome merge = test::run_larder(
      kArea, fmt::format("merge /dev/zero --out {}", test::scratch_path(kArea, "m").string()));
  CHECK(merge.code == 2);
  CHECK(merge.err.find("not an ordinary file") != std::string::npos);

  // A replay policy reading /dev/zero.
  const Outcome replay =
      check_text("replay-zero.yaml", edited("quantity: { rule: fixed, quantity: 35 }",
                                            "quantity: { rule: replay, file: /dev/zero }"));
  INFO(replay.err);
  CHECK(replay.code == 2);
  CHECK(replay.err.find("line is longer than") != std::string::npos);

  const auto drill_out = test::scratch_path(kArea, "d");
  const Outcome drill = test::run_larder(
      kArea, fmt::format("drill {}/scenarios/drill-bakery.yaml --decisions /dev/zero --out {}",
                         LARDER_SOURCE_DIR, drill_out.string()));
  INFO(drill.err);
  CHECK(drill.code == 2);
  CHECK(drill.err.find("/dev/zero: error: the decision file is larger than the limit of 16 MiB") ==
        0);
  CHECK(!test::fs::exists(drill_out));
}

TEST_CASE("a history or an order file with a 100 MB line is refused without holding it",
          "[hostile]") {
  // One line of 100 MB without an end, after a good header: cut at 1 MiB, and the reader stops
  // after skipping 64 MiB of it.
  const auto big = test::scratch_path(kArea, "long-line.csv");
  {
    std::ofstream f(big, std::ios::binary);
    f << "date,store,item,delivered,sold,leftover,sold_out\n";
    const std::string block(1 << 20, 'x');
    for (int k = 0; k < 100; ++k) f << block;
  }
  const Outcome fit =
      test::run_larder(kArea, fmt::format("fit {} --out {}", big.string(),
                                          test::scratch_path(kArea, "long-fit.yaml").string()));
  INFO(fit.err);
  CHECK(fit.code == 2);
  CHECK(fit.err.find(":2:1: error: line is longer than 1048576 bytes and goes on past") !=
        std::string::npos);
}

// --- issue 23, item 9: messages that name the cause, warnings for likely mistakes ------------

TEST_CASE("tabs, old Mac line ends, 1e400 and over-long names are named as the cause",
          "[hostile]") {
  require_input_error(check_text("tab.yaml", replaced(kValid, "  - name: fixed\n    forecast",
                                                      "  - name: fixed\n\tforecast")),
                      "tab.yaml", "is indented with a tab; YAML indents with spaces only");
  std::string cr = kValid;
  for (char& c : cr)
    if (c == '\n') c = '\r';
  require_input_error(check_text("cr.yaml", cr), "cr.yaml",
                      "a carriage return without a line feed: the file has old Mac line ends");
  require_input_error(check_text("huge-number.yaml", edited("base: 30", "base: 1e400")),
                      "huge-number.yaml", "is too large for a number (got 1e400)");
  std::string long_name = "name: ";
  long_name.append(256, 'n');
  require_input_error(check_text("long-name.yaml", edited("name: hostile", long_name)),
                      "long-name.yaml", "name must be at most 200 characters (got 256)");
}

TEST_CASE("likely mistakes are warned about, and the scenario still runs", "[hostile]") {
  std::string closures = "calendar:\n  events:\n";
  for (int d = 7; d < 40; ++d) {
    closures += fmt::format("    - {{ day: {}, closed: true, stores: [shut] }}\n", d);
  }
  const std::string text = replaced(
      replaced(edited("demand: { base: 30 }",
                      "demand: { base: 30, distribution: normal, cv: 38 }, "
                      "pack_size: 12, shelf_capacity: 10"),
               "stores: [ { id: corner } ]", "stores: [ { id: corner }, { id: shut } ]"),
      "horizon: { days: 40, warmup_days: 7 }",
      "horizon: { days: 40, warmup_days: 7 }\nlogistics: { lead_time_days: 40 }\n" + closures);
  const Outcome o = check_text("mistakes.yaml", text);
  INFO(o.err);
  REQUIRE(o.code == 0);
  const std::string file = (test::scratch_dir(kArea) / "mistakes.yaml").string();
  CHECK(o.err.find(file + ": warning: items[0] 'roll': shelf_capacity 10 is below pack_size "
                          "12: no pack fits on the shelf, so the item is never delivered") !=
        std::string::npos);
  CHECK(o.err.find("cv 38 is a spread of 38 times the mean; cv is a ratio (0.38 for 38%)") !=
        std::string::npos);
  CHECK(o.err.find("logistics.lead_time_days 40 is not shorter than the horizon of 40 days") !=
        std::string::npos);
  CHECK(o.err.find("stores[1] 'shut' is closed on every scored day") != std::string::npos);
  CHECK(o.err.find("stores[0]") == std::string::npos);  // the open store: no warning
}

TEST_CASE("unit_cost 0 is named as why critical_fractile cannot order", "[hostile]") {
  // With c = 0 (and nothing recovered, s = 0) the critical ratio (p - c + g) / (p - s + g) is 1
  // (Nahmias, the newsvendor chapter): no leftover costs anything. The cause is the zero cost,
  // not a recovery of "the full cost".
  const Outcome o =
      check_text("free.yaml", edited("unit_cost: 0.4", "unit_cost: 0") +
                                  "  - { name: nv, forecast: { method: oracle }, quantity: { rule: "
                                  "critical_fractile } }\n");
  require_input_error(o, "free.yaml",
                      "item 'roll' has unit_cost 0, so a unit left over costs nothing and the "
                      "rule would order without limit");
  CHECK(o.err.find("recover the full cost") == std::string::npos);
}

TEST_CASE("an unclosed quote in an order file is named at the quote", "[hostile]") {
  const auto orders = test::scratch_path(kArea, "quote-orders.csv");
  test::write_text(orders, "day,store,item,quantity\n3,corner,\"roll,5\n");
  const Outcome o = check_text(
      "quote.yaml", edited("quantity: { rule: fixed, quantity: 35 }",
                           fmt::format("quantity: {{ rule: replay, file: {} }}", orders.string())));
  INFO(o.err);
  CHECK(o.code == 2);
  // Column 10 of line 2 (counted by hand: `3,corner,` is 9 characters).
  CHECK(o.err.find(orders.string() +
                   ":2:10: error: the quote opening this field is never closed") == 0);
  CHECK(o.err.find("expected 4 fields") == std::string::npos);
}

TEST_CASE("a file that is not the expected input is refused without repeating its text",
          "[hostile]") {
  // A file read by mistake (or on purpose: `replay file: /etc/shadow` run by someone allowed to
  // read it) must not have its content printed: messages may be shown to others.
  const auto secret = test::scratch_path(kArea, "secret.txt");
  test::write_text(secret,
                   "root:$6$S3CRETHASHxq:19000:0:99999:7:::\ndaemon:S3CRET2:19000:0:99999:7:::\n");
  const auto refused = [&](const Outcome& o, const std::string& words) {
    INFO(o.err);
    CHECK(o.code == 2);
    CHECK(o.err.find(words) != std::string::npos);
    CHECK(o.err.find("S3CRET") == std::string::npos);
  };
  refused(test::run_larder(kArea, fmt::format("check {}", secret.string())),
          ":1:1: error: not a larder scenario: it has none of the keys format, name, stores, "
          "items, policies");
  const auto one_value = test::scratch_path(kArea, "one-value.txt");
  test::write_text(one_value, "S3CRET-token-0123\n");
  refused(test::run_larder(kArea, fmt::format("check {}", one_value.string())),
          "a scenario must be a mapping of keys to values such as `format: 1` (got a single "
          "value)");
  refused(
      check_text("secret-replay.yaml",
                 edited("quantity: { rule: fixed, quantity: 35 }",
                        fmt::format("quantity: {{ rule: replay, file: {} }}", secret.string()))),
      ":1:1: error: not an order file: the first line names none of the columns");
  refused(test::run_larder(
              kArea, fmt::format("drill {}/scenarios/drill-bakery.yaml --decisions {} --out {}",
                                 LARDER_SOURCE_DIR, secret.string(),
                                 test::scratch_path(kArea, "secret-drill").string())),
          ":1:1: error: not a decision file: the first line names none of the columns");
  const auto fitted = test::scratch_path(kArea, "secret-fit.yaml");
  refused(test::run_larder(kArea, fmt::format("fit {} --out {}", secret.string(), fitted.string())),
          ":1:1: error: not a sales history: the first line names none of its columns");
  const auto history = test::scratch_path(kArea, "secret-h.csv");
  test::write_text(history, "date,store,item,delivered,sold,leftover,sold_out\n");
  refused(test::run_larder(kArea, fmt::format("fit {} --items {} --out {}", history.string(),
                                              secret.string(), fitted.string())),
          ":1:1: error: the header has no column 'item'");
  refused(test::run_larder(kArea, fmt::format("drill --summary {} --out {}", secret.string(),
                                              test::scratch_path(kArea, "secret-class").string())),
          "error: not a scorecard: not JSON, or cut short (at byte 1)");
  refused(test::run_larder(kArea, fmt::format("merge {} --out {}", secret.string(),
                                              test::scratch_path(kArea, "secret-merge").string())),
          "not a larder shard file");
  CHECK(!test::fs::exists(fitted));
}

}  // namespace
}  // namespace larder
