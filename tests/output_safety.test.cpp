// Output safety (issue 10): larder writes only into a folder that is new, empty or holds an
// earlier larder result (else exit 2 and a hint to use --force), and a write that fails (a
// parent that cannot be created, no permission, a full disk) is reported naming the path, with
// exit code 1 and no partial file under a final name.

#include <sys/resource.h>
#include <sys/wait.h>
#include <unistd.h>

#include <csignal>
#include <nlohmann/json.hpp>

#include "reports/output_claim.hpp"
#include "reports/output_folder.hpp"
#include "tests/cli_runner.test.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

namespace fs = std::filesystem;
using test::Outcome;

const char* kArea = "output";

const std::string kScenario = R"(format: 1
name: safety
seed: 5
horizon: { days: 30, warmup_days: 0 }
replications: 3
stores: [ { id: corner } ]
items:
  - { id: roll, price: 1.5, unit_cost: 0.4, demand: { base: 30 } }
policies:
  - name: fixed
    forecast: { method: oracle }
    quantity: { rule: fixed, quantity: 35 }
  - name: fractile
    forecast: { method: oracle }
    quantity: { rule: critical_fractile }
)";

fs::path scenario_file() {
  const fs::path p = test::scratch_path(kArea, "safety.yaml");
  test::write_text(p, kScenario);
  return p;
}

Outcome run_into(const fs::path& out, const std::string& extra = "") {
  return test::run_larder(kArea, fmt::format("run {} --quiet --out {} {}", scenario_file().string(),
                                             out.string(), extra));
}

/// Files under `dir` whose name marks them as temporary (what a failed write could leave).
std::vector<std::string> temporaries(const fs::path& dir) {
  std::vector<std::string> found;
  std::error_code ec;
  for (const auto& e : fs::recursive_directory_iterator(dir, ec)) {
    const std::string name = e.path().filename().string();
    if (name.find(".tmp-") != std::string::npos) found.push_back(name);
  }
  return found;
}

TEST_CASE("a folder holding other files is not written without --force", "[output]") {
  const fs::path out = test::scratch_path(kArea, "documents");
  fs::create_directories(out);
  test::write_text(out / "notes.txt", "mine");
  test::write_text(out / "summary.json", "{\"not\": \"larder\"}");
  const Outcome refused = run_into(out);
  INFO(refused.err);
  CHECK(refused.code == 2);
  CHECK(refused.err.find(fmt::format("{}: error: the output folder exists, is not empty and "
                                     "holds no larder result",
                                     out.string())) == 0);
  CHECK(refused.err.find("--force") != std::string::npos);
  CHECK(test::slurp(out / "summary.json") == "{\"not\": \"larder\"}");  // untouched
  CHECK(!fs::exists(out / "metrics.csv"));
  CHECK(!fs::exists(out / kOutputMarker));

  const Outcome forced = run_into(out, "--force");
  INFO(forced.err);
  CHECK(forced.code == 0);
  CHECK(test::slurp(out / "notes.txt") == "mine");  // only larder's own names are replaced
  CHECK(nlohmann::json::parse(test::slurp(out / "summary.json")).contains("larder_version"));
  CHECK(fs::is_regular_file(out / kOutputMarker));
  // Now it holds a larder result: a rerun needs no --force.
  CHECK(run_into(out).code == 0);
}

TEST_CASE("new, empty and earlier larder folders are written; a file is not a folder", "[output]") {
  const fs::path fresh = test::scratch_path(kArea, "fresh/deeper/results");
  CHECK(run_into(fresh).code == 0);
  CHECK(fs::is_regular_file(fresh / "report.html"));
  CHECK(fs::is_regular_file(fresh / kOutputMarker));

  const fs::path empty = test::scratch_path(kArea, "empty");
  fs::create_directories(empty);
  CHECK(run_into(empty).code == 0);

  // A result of a larder from before the marker: its summary.json says so.
  const fs::path older = test::scratch_path(kArea, "older");
  fs::create_directories(older);
  test::write_text(older / "summary.json", "{\"larder_version\": \"0.0.9\"}");
  test::write_text(older / "metrics.csv", "old");
  CHECK(run_into(older).code == 0);
  CHECK(test::slurp(older / "metrics.csv") != "old");

  const fs::path file = test::scratch_path(kArea, "plain-file");
  test::write_text(file, "x");
  const Outcome o = run_into(file);
  CHECK(o.code == 2);
  CHECK(o.err.find("the output folder is a file") != std::string::npos);
  CHECK(test::slurp(file) == "x");
}

TEST_CASE("sweep and merge refuse a foreign folder too", "[output]") {
  const fs::path out = test::scratch_path(kArea, "foreign");
  fs::create_directories(out);
  test::write_text(out / "notes.txt", "mine");
  const Outcome sweep = test::run_larder(
      kArea, fmt::format("sweep {} --quiet -r 2 --set items.roll.price=1.5,2 --out {}",
                         scenario_file().string(), out.string()));
  INFO(sweep.err);
  CHECK(sweep.code == 2);
  CHECK(sweep.err.find("--force") != std::string::npos);
  CHECK(!fs::exists(out / "sweep.csv"));

  const fs::path shard = test::scratch_path(kArea, "shard");
  REQUIRE(test::run_larder(kArea, fmt::format("run {} --quiet --shard 1/1 --out {}",
                                              scenario_file().string(), shard.string()))
              .code == 0);
  const Outcome merge = test::run_larder(
      kArea, fmt::format("merge {} --quiet --out {}", shard.string(), out.string()));
  INFO(merge.err);
  CHECK(merge.code == 2);
  CHECK(!fs::exists(out / "summary.json"));
  CHECK(test::run_larder(
            kArea, fmt::format("merge {} --quiet --force --out {}", shard.string(), out.string()))
            .code == 0);
}

TEST_CASE("a folder that cannot be created is reported with its path, exit 1", "[output]") {
  // Through a regular file: fails for root too.
  const fs::path file = test::scratch_path(kArea, "a-file");
  test::write_text(file, "x");
  const fs::path out = file / "results";
  const Outcome o = run_into(out);
  INFO(o.err);
  CHECK(o.code == 1);
  CHECK(o.err.find(fmt::format("larder: error: cannot create folder {}", out.string())) == 0);
}

TEST_CASE("a full disk leaves the earlier result whole and no temporary file", "[output]") {
  const fs::path out = test::scratch_path(kArea, "full");
  REQUIRE(run_into(out).code == 0);
  const std::string before = test::slurp(out / "summary.json");
  const RunResult result = test::run_scenario(
      test::scenario_from(std::string(kScenario).replace(kScenario.find("seed: 5"), 7, "seed: 6")));
  // In a child process, a file size limit of 2 KiB (POSIX setrlimit RLIMIT_FSIZE) makes write()
  // fail with EFBIG, as a full disk makes it fail with ENOSPC (the same path in
  // write_file_atomically); SIGXFSZ is ignored so that the write returns the error. (The
  // executable cannot be used here: MPI_Init writes files of its own first.)
  const std::string expected = fmt::format("cannot write {}", (out / "summary.json").string());
  const pid_t child = ::fork();
  REQUIRE(child >= 0);
  if (child == 0) {
    std::signal(SIGXFSZ, SIG_IGN);
    const rlimit limit{2048, 2048};
    ::setrlimit(RLIMIT_FSIZE, &limit);
    int code = 3;  // wrote everything: the limit did not bite
    try {
      write_run_outputs(result, out);
    } catch (const std::runtime_error& e) {
      const std::string what = e.what();
      code = what.find(expected) == 0 && what.find("File too large") != std::string::npos ? 0 : 4;
    }
    ::_exit(code);
  }
  int status = 0;
  REQUIRE(::waitpid(child, &status, 0) == child);
  REQUIRE(WIFEXITED(status));
  CHECK(WEXITSTATUS(status) == 0);                     // the error named the file and why
  CHECK(test::slurp(out / "summary.json") == before);  // the earlier result, whole
  CHECK(temporaries(out).empty());
}

TEST_CASE("a folder without write permission is reported, nothing partial left", "[output]") {
  if (::geteuid() == 0) {
    WARN(
        "running as root, who may write anywhere: the permission case is skipped (the "
        "path-through-a-file and full-disk cases cover the failure path)");
    return;
  }
  const fs::path out = test::scratch_path(kArea, "locked");
  REQUIRE(run_into(out).code == 0);
  const std::string before = test::slurp(out / "summary.json");
  fs::permissions(out, fs::perms::owner_read | fs::perms::owner_exec);
  const Outcome o = run_into(out);
  fs::permissions(out, fs::perms::owner_all);
  INFO(o.err);
  CHECK(o.code == 1);
  CHECK(o.err.find(fmt::format("cannot write {}", (out / "summary.json").string())) !=
        std::string::npos);
  CHECK(o.err.find("Permission denied") != std::string::npos);
  CHECK(test::slurp(out / "summary.json") == before);
  CHECK(temporaries(out).empty());
}

}  // namespace
}  // namespace larder
