// Result sets (result_set.hpp): a folder is always one run's files, what else it held stays,
// crashed writers' leftovers are finished or removed, and `kill -9` at random moments of
// writing over an earlier result never leaves a mix (issue 23).

#include "reports/result_set.hpp"

#include <signal.h>
#include <sys/wait.h>
#include <unistd.h>

#include <catch2/catch.hpp>
#include <chrono>
#include <fstream>
#include <random>
#include <thread>

#include "reports/atomic_file.hpp"
#include "reports/sample_run.test.hpp"

namespace larder {
namespace {

namespace fs = std::filesystem;
using test::read_all;

void put(const fs::path& p, const std::string& text) {
  fs::create_directories(p.parent_path());
  std::ofstream(p, std::ios::binary) << text;
}

/// Names in `dir` (and its parent) that a writer leaves only while it works.
std::vector<std::string> leftovers(const fs::path& dir) {
  std::vector<std::string> found;
  for (const fs::path& d : {dir, dir.parent_path()}) {
    for (const auto& e : fs::directory_iterator(d)) {
      const std::string name = e.path().filename().string();
      if (name.find(".tmp-") != std::string::npos || name.find(".staging-") != std::string::npos)
        found.push_back(name);
    }
  }
  return found;
}

/// A process id that no process has: a child that has exited and been reaped.
long gone_pid() {
  const pid_t child = ::fork();
  if (child == 0) ::_exit(0);
  int status = 0;
  ::waitpid(child, &status, 0);
  return static_cast<long>(child);
}

TEST_CASE("a result set replaces the earlier set and keeps everything else", "[output]") {
  test::ScratchDir scratch("result-set");
  const fs::path dir = scratch.path() / "out";
  publish_result_set(dir, {{"a.csv", "old a"}, {"pairs.csv", "old pairs"}}, {});
  put(dir / "notes.txt", "mine");
  put(dir / "partial" / "metrics.csv", "partial");
  put(dir / "sweep.csv", "another command's");

  publish_result_set(dir, {{"a.csv", "new a"}}, {"pairs.csv"});
  CHECK(read_all(dir / "a.csv") == "new a");
  CHECK(!fs::exists(dir / "pairs.csv"));  // retired: the new run has none
  CHECK(read_all(dir / "notes.txt") == "mine");
  CHECK(read_all(dir / "partial" / "metrics.csv") == "partial");
  CHECK(read_all(dir / "sweep.csv") == "another command's");
  CHECK(fs::is_regular_file(dir / kRunRecord));
  CHECK(leftovers(dir).empty());
}

TEST_CASE("what a crashed writer left is finished or removed", "[output]") {
  test::ScratchDir scratch("result-recover");
  const fs::path dir = scratch.path() / "out";
  const long dead = gone_pid();

  SECTION("a temporary file and an unpublished staging folder are removed") {
    publish_result_set(dir, {{"a.csv", "a"}}, {});
    put(dir / fmt::format(".breakdown.csv.tmp-{}-3", dead), "half");
    const fs::path staging = scratch.path() / fmt::format(".out.staging-{}-0-1", dead);
    put(staging / "a.csv", "never published");
    put(staging / "pairs.csv", "never published");
    recover_result_folder(dir);
    CHECK(leftovers(dir).empty());
    CHECK(read_all(dir / "a.csv") == "a");
    CHECK(!fs::exists(dir / "pairs.csv"));  // not taken from the unpublished set
  }
  SECTION("the old folder of a swap that crashed gives back what it held") {
    // As a crash right after the exchange leaves it: the record names the staging folder,
    // which now holds the old folder with a subfolder not yet carried back.
    const std::string staging_name = fmt::format(".out.staging-{}-0-1", dead);
    put(dir / "a.csv", "new a");
    put(dir / std::string(kRunRecord),
        fmt::format(R"({{"run": "x", "staging": "{}", "files": ["a.csv"], "retired": ["b.csv"]}})",
                    staging_name));
    const fs::path old = scratch.path() / staging_name;
    put(old / "a.csv", "old a");
    put(old / "b.csv", "old b");
    put(old / "partial" / "m.csv", "kept");
    recover_result_folder(dir);
    CHECK(read_all(dir / "a.csv") == "new a");
    CHECK(!fs::exists(dir / "b.csv"));
    CHECK(read_all(dir / "partial" / "m.csv") == "kept");
    CHECK(leftovers(dir).empty());
  }
  SECTION("a live writer's files are left alone") {
    publish_result_set(dir, {{"a.csv", "a"}}, {});
    const std::string mine = fmt::format(".a.csv.tmp-{}-9", static_cast<long>(::getpid()));
    put(dir / mine, "being written");
    recover_result_folder(dir);
    CHECK(fs::exists(dir / mine));
  }
}

TEST_CASE("kill -9 while writing over an earlier result never leaves a mix", "[output]") {
  // Two sets of large files (A also has pairs.csv, which B retires); a child process publishes
  // them in turn without end and is killed with SIGKILL after a random moment, 50 times. After
  // each kill the folder must hold all of A or all of B (and nothing of the other); after the
  // next writer's recovery no temporary file or staging folder is left and the user's files are
  // all there. A crash between two renames of a per-file writer would fail the first check.
  test::ScratchDir scratch("result-crash");
  const fs::path dir = scratch.path() / "out";
  const std::string big(std::size_t{256} << 10, 'x');
  const std::vector<ResultFile> set_a = {{"summary.json", "A" + big},
                                         {"metrics.csv", "A" + big},
                                         {"breakdown.csv", "A" + big},
                                         {"pairs.csv", "A" + big}};
  const std::vector<ResultFile> set_b = {
      {"summary.json", "B" + big}, {"metrics.csv", "B" + big}, {"breakdown.csv", "B" + big}};
  publish_result_set(dir, set_a, {});
  put(dir / "notes.txt", "mine");
  put(dir / "partial" / "metrics.csv", "partial");

  std::mt19937 rng(20231);  // fixed seed: the moments differ by machine load anyway
  std::uniform_int_distribution<int> pause_us(0, 80000);
  int saw_a = 0;
  int saw_b = 0;
  for (int round = 0; round < 50; ++round) {
    const pid_t child = ::fork();
    REQUIRE(child >= 0);
    if (child == 0) {
      try {
        for (int k = 0;; ++k) publish_result_set(dir, k % 2 == 0 ? set_b : set_a, {"pairs.csv"});
      } catch (...) {
        ::_exit(3);
      }
    }
    std::this_thread::sleep_for(std::chrono::microseconds(pause_us(rng)));
    ::kill(child, SIGKILL);
    int status = 0;
    REQUIRE(::waitpid(child, &status, 0) == child);
    REQUIRE(WIFSIGNALED(status));  // it was still writing: never gave up with an error

    INFO("round " << round);
    const std::string first = read_all(dir / "summary.json").substr(0, 1);
    REQUIRE((first == "A" || first == "B"));
    const auto& set = first == "A" ? set_a : set_b;
    (first == "A" ? saw_a : saw_b) += 1;
    for (const ResultFile& f : set) CHECK(read_all(dir / f.name) == f.content);
    CHECK(fs::exists(dir / "pairs.csv") == (first == "A"));

    recover_result_folder(dir);  // what the next run does first
    CHECK(leftovers(dir).empty());
    CHECK(read_all(dir / "notes.txt") == "mine");
    CHECK(read_all(dir / "partial" / "metrics.csv") == "partial");
  }
  // Both outcomes occurred, so the kills did land while sets were being replaced.
  CHECK(saw_a > 0);
  CHECK(saw_b > 0);
}

}  // namespace
}  // namespace larder
