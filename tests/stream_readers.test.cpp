// The readers of files that can be pipes (issue 23): a scenario, a `replay` order file, a drill's
// decision file, a sales history and an item file, each fed by a pipe (`/dev/stdin`) and by a
// named FIFO with a stream that is too large or never ends: endless lines, one endless line,
// endless bad or repeated rows. Each must stop by itself with exit 2 and an error that names the
// limit, in a report of bounded size (at most Diagnostics::kMaxKept problems, then a count), with
// bounded memory, and without reading the stream to its end (the stream never ends: a reader
// that did not stop would hang until `timeout` ends it with 124).
//
// Peak memory is the largest resident set of the command's processes (getrusage of a fresh
// Python parent), so the bound holds for this command alone. The bound, 1 GiB, is far above what
// a bounded reader needs (64 KiB blocks, or its cap of 16 MiB for files kept whole) and far
// below what the unbounded readers took (2-4 GB for a 1 GB line, issue 23).

#include <sys/stat.h>

#include <cstdlib>
#include <sstream>
#include <string>
#include <utility>
#include <vector>

#include "tests/cli_runner.test.hpp"

namespace larder {
namespace {

const char* kArea = "stream";

struct Fed {
  int code = -1;             ///< larder's exit code (124: stopped by timeout, it did not stop)
  long long max_rss_kb = 0;  ///< the largest resident set of the command's processes
  std::string err;
};

/// Runs `producer | larder ARGS` (`{in}` in ARGS and in `files` replaced by /dev/stdin), or with
/// `fifo`, `larder ARGS` reading a named FIFO that `producer` writes ({in} = the FIFO's path).
/// `files` are written first (name, text), e.g. a scenario naming {in} as its replay file.
Fed feed(const std::string& name, const std::string& producer, const std::string& args, bool fifo,
         const std::vector<std::pair<std::string, std::string>>& files = {}) {
  const test::fs::path dir = test::scratch_path(kArea, name + (fifo ? "-fifo" : "-pipe"));
  test::fs::create_directories(dir);
  const std::string in = fifo ? (dir / "in.fifo").string() : "/dev/stdin";
  const auto with_in = [&](std::string s) {
    for (auto at = s.find("{in}"); at != std::string::npos; at = s.find("{in}", at + in.size())) {
      s.replace(at, 4, in);
    }
    for (const auto& [file, text] : files) {
      const std::string key = "{" + file + "}";
      for (auto at = s.find(key); at != std::string::npos; at = s.find(key)) {
        s.replace(at, key.size(), (dir / file).string());
      }
    }
    return s;
  };
  for (const auto& [file, text] : files) test::write_text(dir / file, with_in(text));
  const std::string command = fmt::format("timeout 120 {} {}", LARDER_BINARY, with_in(args));
  std::string script = "#!/bin/sh\n";
  if (fifo) {
    REQUIRE(::mkfifo(in.c_str(), 0600) == 0);
    // The writer is ended after larder, in case larder never opened the FIFO.
    script += fmt::format(
        "({}) >{} &\nwriter=$!\n{}\ncode=$?\nkill $writer 2>/dev/null\n"
        "exit $code\n",
        producer, in, command);
  } else {
    script += fmt::format("({}) | {}\n", producer, command);
  }
  test::write_text(dir / "run.sh", script);
  const test::fs::path err = dir / "stderr.txt";
  const test::fs::path report = dir / "report.txt";
  const std::string python = fmt::format(
      "import resource, subprocess, sys\n"
      "r = subprocess.run(['sh', '{}'], stdout=subprocess.DEVNULL, stderr=open('{}', 'wb'))\n"
      "print(resource.getrusage(resource.RUSAGE_CHILDREN).ru_maxrss, r.returncode)\n",
      (dir / "run.sh").string(), err.string());
  test::write_text(dir / "measure.py", python);
  const int status = std::system(
      fmt::format("{} {} >{}", LARDER_PYTHON, (dir / "measure.py").string(), report.string())
          .c_str());
  REQUIRE(WIFEXITED(status));
  REQUIRE(WEXITSTATUS(status) == 0);
  Fed f;
  std::istringstream(test::slurp(report)) >> f.max_rss_kb >> f.code;
  f.err = test::slurp(err);
  return f;
}

/// Exit 2, `words` in the report, a report of a few kilobytes, memory within the bound.
void require_stopped(const Fed& f, const std::string& words) {
  INFO(f.err.substr(0, 4000));
  INFO("exit " << f.code << ", peak resident set " << f.max_rss_kb / 1024 << " MiB");
  CHECK(f.code == 2);
  CHECK(f.err.find(words) != std::string::npos);
  CHECK(f.err.size() < 64 * 1024);
  CHECK(f.max_rss_kb < 1024 * 1024);
}

/// A producer of the line `head`, then endless lines of `line`, `pad` blanks and `tail` (blanks
/// around CSV fields are dropped, so a padded row reads as the row without them; long lines make
/// the stream reach a cap quickly).
std::string endless(const std::string& head, const std::string& line, int pad = 0,
                    const std::string& tail = "") {
  return fmt::format("printf '%s\\n' '{}'; yes \"{}$(printf '%{}s' ''){}\"", head, line, pad, tail);
}

const std::string kScenario = R"(format: 1
name: fed
seed: 3
horizon: { days: 40, warmup_days: 7 }
replications: 2
stores: [ { id: corner } ]
items:
  - { id: roll, price: 1.5, unit_cost: 0.4, demand: { base: 30 } }
policies:
  - name: past
    forecast: { method: oracle }
    quantity: { rule: replay, file: {in} }
)";

TEST_CASE("readers fed by a pipe or a FIFO stop at their caps, with bounded reports and memory",
          "[hostile][stream]") {
  for (const bool fifo : {false, true}) {
    SECTION(fifo ? "a named FIFO" : "a pipe on /dev/stdin") {
      // Scenario: endless short lines, and one line that never ends; kept whole up to 16 MiB.
      require_stopped(feed("scenario-lines", "yes 'a: 1'", "check {in}", fifo),
                      "error: the file is too large for a scenario: more than the limit of 16 MiB");
      require_stopped(feed("scenario-line", "yes | tr -d '\\n'", "check {in}", fifo),
                      "too large for a scenario");

      // Replay order file: a good header, then endless blank lines (skipped, never kept) up to
      // its cap of 256 MiB; then endless copies of one order (each a problem: at most 100 kept).
      require_stopped(feed("replay-blank", endless("day,store,item,quantity", "", 4000),
                           "check {scenario.yaml}", fifo, {{"scenario.yaml", kScenario}}),
                      "error: the order file is larger than the limit of 256 MiB");
      const Fed repeated =
          feed("replay-repeated", endless("day,store,item,quantity", "3,corner,roll,", 2000, "5"),
               "check {scenario.yaml}", fifo, {{"scenario.yaml", kScenario}});
      require_stopped(repeated, "the order file is larger than the limit of 256 MiB");
      CHECK(repeated.err.find("a second order of item 'roll' at store 'corner' placed on day 3 "
                              "(the first is on line 2)") != std::string::npos);
      CHECK(repeated.err.find("more problems") != std::string::npos);

      // Decision file: kept whole up to 16 MiB.
      const std::string drill = std::string(LARDER_SOURCE_DIR) + "/scenarios/drill-bakery.yaml";
      const Fed decisions =
          feed("decisions", endless("day,store,item,quantity", "30,quay,rye,", 1000, "5"),
               fmt::format("drill {} --decisions {{in}} --out {}", drill,
                           (test::scratch_dir(kArea) / "never").string()),
               fifo);
      require_stopped(decisions, "error: the decision file is larger than the limit of 16 MiB");
      CHECK(!test::fs::exists(test::scratch_dir(kArea) / "never"));

      // History (streamed, never kept): endless bad rows stop the reader after 100000
      // problems; one endless line stops it after 64 MiB of it.
      const std::string header = "date,store,item,delivered,sold,leftover,sold_out";
      const std::string fitted = (test::scratch_dir(kArea) / "fitted.yaml").string();
      const Fed bad_rows = feed("history-rows", endless(header, "2027-03-01,corner,roll"),
                                fmt::format("fit {{in}} --out {}", fitted), fifo);
      require_stopped(bad_rows, "more problems; larder read no further than line 100001");
      CHECK(bad_rows.err.find(":2:1: error: expected 7 fields") != std::string::npos);
      require_stopped(
          feed("history-line", fmt::format("echo {}; yes | tr -d '\\n'", header),
               fmt::format("fit {{in}} --out {}", fitted), fifo),
          ":2:1: error: line is longer than 1048576 bytes and goes on past 64 MiB without an end");
      CHECK(!test::fs::exists(fitted));

      // Item file: endless copies of one item up to its cap of 256 MiB.
      const Fed items =
          feed("items", endless("item,price,unit_cost,shelf_life_days", "roll,1.5,0.4,", 2000, "1"),
               fmt::format("fit {{history.csv}} --items {{in}} --out {}", fitted), fifo,
               {{"history.csv", header + "\n2027-03-01,corner,roll,10,8,2,0\n"}});
      require_stopped(items, "error: the item file is larger than the limit of 256 MiB");
      CHECK(items.err.find(":3:1: error: item 'roll' is given twice (first on line 2)") !=
            std::string::npos);
    }
  }
}

TEST_CASE("a file of a million bad rows gives 100 problems and a count", "[hostile][stream]") {
  // Within the decision file's cap, every row bad: the report keeps the first 100.
  const std::string drill = std::string(LARDER_SOURCE_DIR) + "/scenarios/drill-bakery.yaml";
  const Fed f = feed("decisions-bad", "echo day,store,item,quantity; yes x | head -n 1000000",
                     fmt::format("drill {} --decisions {{in}} --out {}", drill,
                                 (test::scratch_dir(kArea) / "never-bad").string()),
                     false);
  require_stopped(f, ":2:1: error: expected 4 fields, got 1");
  CHECK(f.err.find(":101:1: error: expected 4 fields, got 1") != std::string::npos);
  CHECK(f.err.find(":102:1:") == std::string::npos);
  // 999900 more bad rows and the missing orders of the drill's turns.
  CHECK(f.err.find("/dev/stdin: error: ... and ") != std::string::npos);
}

}  // namespace
}  // namespace larder
