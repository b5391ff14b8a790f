// End to end with the `larder` binary: `run --shard K/N` plus `merge` writes files identical to
// a single run (the reference: the same command without --shard), merge errors exit 2 naming
// the files, and Ctrl-C (SIGINT, sent to a running process) exits 130 with the finished
// replications complete under <out>/partial/ and the final names untouched (cli.md).

#include <fcntl.h>
#include <fmt/format.h>
#include <signal.h>
#include <sys/wait.h>
#include <unistd.h>

#include <array>
#include <catch2/catch.hpp>
#include <chrono>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <map>
#include <nlohmann/json.hpp>
#include <sstream>
#include <thread>

#include "reports/sample_run.test.hpp"

namespace larder {
namespace {

namespace fs = std::filesystem;
using test::read_all;

struct Outcome {
  int code = -1;
  std::string err;
};

/// Runs `larder ARGS` with stdout discarded, capturing stderr and the exit code.
Outcome larder(const fs::path& scratch, const std::string& args) {
  const fs::path err = scratch / "stderr.txt";
  const std::string cmd = fmt::format("{} {} >/dev/null 2>{}", LARDER_BINARY, args, err.string());
  const int status = std::system(cmd.c_str());
  return {WIFEXITED(status) ? WEXITSTATUS(status) : -1, read_all(err)};
}

fs::path write_file(const fs::path& p, const std::string& text) {
  std::ofstream(p) << text;
  return p;
}

/// A network_in_stock policy and substitution, so every output file has something to carry.
const char* kScenario = R"(format: 1
name: shard-cli
seed: 515
horizon: { days: 42, warmup_days: 7 }
replications: 5
stores: [ { id: north }, { id: south, size: 0.6 } ]
items:
  - { id: loaf, price: 3, unit_cost: 1, attributes: { type: bread }, demand: { base: 12 }, substitutes: { roll: 0.4 } }
  - { id: roll, price: 1, unit_cost: 0.3, attributes: { type: bread }, demand: { base: 25 } }
  - { id: tart, price: 4, unit_cost: 2.5, shelf_life_days: 2, attributes: { type: pastry }, demand: { base: 5 } }
policies:
  - name: flat
    forecast: { method: ses_weekday, alpha: 0.2 }
    quantity: { rule: in_stock_target, level: 0.7 }
  - name: per-item
    forecast: { method: ses_weekday, alpha: 0.2 }
    quantity: { rule: network_in_stock, target: 0.7, groups: item }
baseline: flat
)";

/// report.html without the lines that say how the run went (wall time, threads, its command).
std::string report_without_volatile(const fs::path& file) {
  std::istringstream in(read_all(file));
  std::string out;
  for (std::string line; std::getline(in, line);) {
    if (line.find("of simulation") == std::string::npos &&
        line.find("<pre><code>") == std::string::npos) {
      out += line + '\n';
    }
  }
  return out;
}

std::string summary_without_volatile(const fs::path& file) {
  nlohmann::json j = nlohmann::json::parse(read_all(file));
  for (const char* key : {"command", "threads", "seconds"}) j.erase(key);
  return j.dump(2);
}

TEST_CASE("larder run --shard 1/3, 2/3, 3/3 and larder merge equal a single run, byte for byte",
          "[shard][cli]") {
  const test::ScratchDir dir("shard-cli");
  const fs::path scenario = write_file(dir.path() / "s.yaml", kScenario);
  const fs::path single = dir.path() / "single";
  REQUIRE(
      larder(dir.path(), fmt::format("run {} -q -t 2 --out {}", scenario.string(), single.string()))
          .code == 0);
  for (int k = 1; k <= 3; ++k) {
    const Outcome o =
        larder(dir.path(), fmt::format("run {} -q -t 1 --shard {}/3 --out {}", scenario.string(), k,
                                       (dir.path() / fmt::format("part{}", k)).string()));
    INFO(o.err);
    REQUIRE(o.code == 0);
    // A shard writes its shard file only (and the output-folder marker), not the final outputs
    // of a run.
    CHECK(test::folder_entries(dir.path() / fmt::format("part{}", k)) ==
          std::vector<std::string>{".larder-output", fmt::format("shard-{}-of-3.json", k)});
  }
  const fs::path merged = dir.path() / "merged";
  const Outcome m =
      larder(dir.path(), fmt::format("merge {} {} {} --out {}", (dir.path() / "part3").string(),
                                     (dir.path() / "part1").string(),
                                     (dir.path() / "part2").string(), merged.string()));
  INFO(m.err);
  REQUIRE(m.code == 0);
  CHECK(m.err.find("merged 3 shard files (5 replications)") != std::string::npos);
  for (const char* name :
       {"metrics.csv", "replications.csv", "breakdown.csv", "pairs.csv", "substitution.csv"}) {
    INFO(name);
    REQUIRE(fs::exists(merged / name));
    CHECK(read_all(merged / name) == read_all(single / name));
  }
  CHECK(summary_without_volatile(merged / "summary.json") ==
        summary_without_volatile(single / "summary.json"));
  REQUIRE(fs::exists(single / "report.html"));
  CHECK(report_without_volatile(merged / "report.html") ==
        report_without_volatile(single / "report.html"));
  // The merged result's command is the single run that reproduces it.
  const auto summary = nlohmann::json::parse(read_all(merged / "summary.json"));
  CHECK(summary["command"].get<std::string>().find("--shard") == std::string::npos);
  CHECK(summary["replications"] == 5);
}

TEST_CASE("larder merge: a missing shard, a duplicate, another seed exit 2 naming the files",
          "[shard][cli]") {
  const test::ScratchDir dir("shard-cli-errors");
  const fs::path scenario = write_file(dir.path() / "s.yaml", kScenario);
  const auto shard = [&](const std::string& folder, int k, const std::string& extra = "") {
    const Outcome o =
        larder(dir.path(), fmt::format("run {} -q --shard {}/3 --out {} {}", scenario.string(), k,
                                       (dir.path() / folder).string(), extra));
    INFO(o.err);
    REQUIRE(o.code == 0);
    return dir.path() / folder / fmt::format("shard-{}-of-3.json", k);
  };
  const fs::path a = shard("a", 1);
  const fs::path b = shard("b", 2);
  const fs::path c = shard("c", 3);
  const fs::path other_seed = shard("seed9", 2, "--seed 9");
  const fs::path copy = dir.path() / "copy.json";
  fs::copy_file(a, copy);
  const fs::path out = dir.path() / "out";

  const Outcome missing =
      larder(dir.path(), fmt::format("merge {} {} --out {}", a.string(), c.string(), out.string()));
  CHECK(missing.code == 2);
  CHECK(missing.err.find("shard 2 of 3 (replications 1 to 2) is missing") != std::string::npos);
  CHECK(missing.err.find(a.string()) != std::string::npos);  // where it looked

  const Outcome duplicate =
      larder(dir.path(), fmt::format("merge {} {} {} {} --out {}", a.string(), b.string(),
                                     c.string(), copy.string(), out.string()));
  CHECK(duplicate.code == 2);
  CHECK(duplicate.err.find(fmt::format("{}: error: shard 1 of 3 is also in {}", copy.string(),
                                       a.string())) != std::string::npos);

  const Outcome seeds =
      larder(dir.path(), fmt::format("merge {} {} {} --out {}", a.string(), other_seed.string(),
                                     c.string(), out.string()));
  CHECK(seeds.code == 2);
  CHECK(seeds.err.find(fmt::format("{}: error: seed is 9 but {} has 515", other_seed.string(),
                                   a.string())) != std::string::npos);

  const Outcome nothing =
      larder(dir.path(), fmt::format("merge {}", (dir.path() / "none").string()));
  CHECK(nothing.code == 2);
  CHECK(nothing.err.find("no such file or folder") != std::string::npos);

  CHECK(!fs::exists(out));  // nothing written on bad input

  const Outcome bad_spec = larder(dir.path(), fmt::format("run {} --shard 4/3", scenario.string()));
  CHECK(bad_spec.code == 2);
  CHECK(bad_spec.err.find("--shard: error: expected K/N") != std::string::npos);
}

/// A run long enough to interrupt: many replications of a small network.
const char* kLong = R"(format: 1
name: long-run
seed: 77
horizon: { days: 364, warmup_days: 14 }
replications: 1000000
stores: [ { id: a }, { id: b } ]
items:
  - { id: roll, price: 1.5, unit_cost: 0.4, demand: { base: 30 }, substitutes: { bun: 0.3 } }
  - { id: bun, price: 1.2, unit_cost: 0.3, demand: { base: 20 } }
  - { id: pie, price: 4, unit_cost: 1.5, shelf_life_days: 2, demand: { base: 8 } }
policies:
  - name: fixed
    forecast: { method: oracle }
    quantity: { rule: fixed, quantity: { roll: 35, bun: 22, pie: 9 } }
  - name: fractile
    forecast: { method: ses_weekday, alpha: 0.2 }
    quantity: { rule: critical_fractile }
)";

/// Starts `larder ARGS...` with stdout to /dev/null and stderr to `err`; returns its pid.
pid_t start_larder(const std::vector<std::string>& args, const fs::path& err) {
  const pid_t pid = ::fork();
  REQUIRE(pid >= 0);
  if (pid == 0) {
    const int out_fd = ::open("/dev/null", O_WRONLY);
    const int err_fd = ::open(err.c_str(), O_WRONLY | O_CREAT | O_TRUNC, 0644);
    ::dup2(out_fd, 1);
    ::dup2(err_fd, 2);
    std::vector<char*> argv{const_cast<char*>(LARDER_BINARY)};
    for (const std::string& a : args) argv.push_back(const_cast<char*>(a.c_str()));
    argv.push_back(nullptr);
    ::execv(LARDER_BINARY, argv.data());
    ::_exit(127);
  }
  return pid;
}

/// Waits until `file` holds `text` (true) or `seconds` pass (false).
bool wait_for_text(const fs::path& file, const std::string& text, int seconds) {
  const auto until = std::chrono::steady_clock::now() + std::chrono::seconds(seconds);
  while (std::chrono::steady_clock::now() < until) {
    if (read_all(file).find(text) != std::string::npos) return true;
    std::this_thread::sleep_for(std::chrono::milliseconds(50));
  }
  return false;
}

/// The exit code of `pid`, killing it if it has not ended within `seconds` (-1 then).
int wait_exit(pid_t pid, int seconds) {
  const auto until = std::chrono::steady_clock::now() + std::chrono::seconds(seconds);
  int status = 0;
  while (::waitpid(pid, &status, WNOHANG) == 0) {
    if (std::chrono::steady_clock::now() > until) {
      ::kill(pid, SIGKILL);
      ::waitpid(pid, &status, 0);
      return -1;
    }
    std::this_thread::sleep_for(std::chrono::milliseconds(20));
  }
  return WIFEXITED(status) ? WEXITSTATUS(status) : -1;
}

/// Interrupts `larder ARGS` once it has reported progress (so some replications are done).
int interrupt_larder(const std::vector<std::string>& args, const fs::path& err) {
  const pid_t pid = start_larder(args, err);
  const bool started = wait_for_text(err, "progress:", 120);
  ::kill(pid, SIGINT);
  const int code = wait_exit(pid, 120);
  INFO(read_all(err));
  REQUIRE(started);
  return code;
}

/// No file of `dir` is a temporary of the atomic writer (".name.tmp-pid-n").
bool no_temporaries(const fs::path& dir) {
  for (const std::string& name : test::folder_entries(dir)) {
    if (name.find(".tmp-") != std::string::npos) return false;
  }
  return true;
}

TEST_CASE("Ctrl-C: exit 130, finished replications whole in partial/, final files untouched",
          "[shard][cli]") {
  const test::ScratchDir dir("interrupt");
  const fs::path scenario = write_file(dir.path() / "long.yaml", kLong);
  const fs::path out = dir.path() / "out";
  // An earlier finished run's results, which an interrupted run must leave alone.
  REQUIRE(
      larder(dir.path(), fmt::format("run {} -q -r 3 --out {}", scenario.string(), out.string()))
          .code == 0);
  const std::vector<std::string> final_names = test::folder_entries(out);
  std::map<std::string, std::string> before;
  for (const std::string& name : final_names) before[name] = read_all(out / name);

  const fs::path err = dir.path() / "err.txt";
  CHECK(interrupt_larder({"run", scenario.string(), "-t", "2", "--out", out.string()}, err) == 130);
  const std::string message = read_all(err);
  CHECK(message.find("interrupted after ") != std::string::npos);

  // The final names hold the earlier run, byte for byte; nothing half-written anywhere.
  for (const std::string& name : final_names) CHECK(read_all(out / name) == before[name]);
  const fs::path partial = out / "partial";
  CHECK(test::folder_entries(out).size() == final_names.size() + 1);  // + partial/
  CHECK(no_temporaries(out));
  CHECK(no_temporaries(partial));

  // The partial results are complete files for the replications that finished.
  const auto summary = nlohmann::json::parse(read_all(partial / "summary.json"));
  const int done = summary["replications"].get<int>();
  INFO(done << " replications finished");
  CHECK(done > 0);
  CHECK(done < 1000000);
  const std::string reps = read_all(partial / "replications.csv");
  CHECK(std::count(reps.begin(), reps.end(), '\n') == 1 + 2 * done);
  CHECK(reps.back() == '\n');
  CHECK(message.find(fmt::format("after {} of 1000000 replications", done)) != std::string::npos);
  for (const char* name : {"metrics.csv", "breakdown.csv", "substitution.csv"}) {
    CHECK(!read_all(partial / name).empty());
  }
  // They are the first `done` replications of the run: identical to a run of that many.
  const fs::path exact = dir.path() / "exact";
  REQUIRE(larder(dir.path(),
                 fmt::format("run {} -q -r {} --out {}", scenario.string(), done, exact.string()))
              .code == 0);
  CHECK(reps.substr(reps.find('\n')) ==
        read_all(exact / "replications.csv").substr(reps.find('\n')));
  CHECK(read_all(partial / "metrics.csv") == read_all(exact / "metrics.csv"));
}

TEST_CASE("Ctrl-C during a shard: a partial shard file that merge refuses", "[shard][cli]") {
  const test::ScratchDir dir("interrupt-shard");
  const fs::path scenario = write_file(dir.path() / "long.yaml", kLong);
  const fs::path out = dir.path() / "out";
  const fs::path err = dir.path() / "err.txt";
  CHECK(interrupt_larder({"run", scenario.string(), "--shard", "1/2", "--out", out.string()},
                         err) == 130);
  CHECK(!fs::exists(out / "shard-1-of-2.json"));
  const fs::path partial = out / "partial" / "shard-1-of-2.json";
  REQUIRE(fs::exists(partial));
  const Outcome m = larder(dir.path(), fmt::format("merge {} --out {}", partial.string(),
                                                   (dir.path() / "merged").string()));
  CHECK(m.code == 2);
  CHECK(m.err.find(fmt::format("{}: error: shard 1 of 2 was interrupted after",
                               partial.string())) != std::string::npos);
}

}  // namespace
}  // namespace larder
