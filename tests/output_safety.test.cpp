// Output safety (issue 10): larder writes only into a folder that is new, empty or holds an
// earlier larder result (else exit 2 and a hint to use --force), and a write that fails (a
// parent that cannot be created, no permission, a full disk) is reported naming the path, with
// exit code 1 and no partial file under a final name.

#include <sys/resource.h>
#include <sys/stat.h>
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
  // Found when the folder is claimed, before simulating (issue 23).
  CHECK(o.err.find(fmt::format("cannot write {}: creating a file there failed", out.string())) !=
        std::string::npos);
  CHECK(o.err.find("Permission denied") != std::string::npos);
  CHECK(test::slurp(out / "summary.json") == before);
  CHECK(temporaries(out).empty());
}

// --- issue 23: outputs that never replace what they point at ---------------------------------

/// A FIFO and a symbolic link to a file outside the output folder, as a non-root user can
/// make them (the device files of the report behave as the FIFO: not an ordinary file).
struct Traps {
  fs::path fifo;
  fs::path target;  ///< outside any output folder
  fs::path link;    ///< -> target
};

Traps make_traps(const std::string& name) {
  Traps t;
  t.fifo = test::scratch_path(kArea, name + "-fifo");
  REQUIRE(::mkfifo(t.fifo.c_str(), 0600) == 0);
  t.target = test::scratch_path(kArea, name + "-precious.txt");
  test::write_text(t.target, "precious");
  t.link = test::scratch_path(kArea, name + "-link");
  fs::create_symlink(t.target, t.link);
  return t;
}

void check_untouched(const Traps& t) {
  CHECK(fs::is_fifo(fs::symlink_status(t.fifo)));
  CHECK(fs::is_symlink(fs::symlink_status(t.link)));
  CHECK(test::slurp(t.target) == "precious");
}

TEST_CASE("fit, history and run refuse a FIFO or a link as output, leaving it as it was",
          "[output]") {
  const Traps t = make_traps("traps");
  const fs::path history = test::scratch_path(kArea, "h.csv");
  test::write_text(history, "date,store,item,delivered,sold,leftover,sold_out\n");
  for (const fs::path& out : {t.fifo, t.link}) {
    INFO(out.string());
    const Outcome fit =
        test::run_larder(kArea, fmt::format("fit {} --out {}", history.string(), out.string()));
    CHECK(fit.code == 2);
    CHECK(fit.err.find(fmt::format("--out {} is a", out.string())) != std::string::npos);
    const Outcome hist = test::run_larder(
        kArea,
        fmt::format("history {} --policy fixed --out {}", scenario_file().string(), out.string()));
    CHECK(hist.code == 2);
    const Outcome items = test::run_larder(
        kArea,
        fmt::format("history {} --policy fixed --out {} --items-out {}", scenario_file().string(),
                    test::scratch_path(kArea, "fine.csv").string(), out.string()));
    CHECK(items.code == 2);
    CHECK(items.err.find("--items-out") != std::string::npos);
    CHECK(!fs::exists(test::scratch_dir(kArea) / "fine.csv"));  // refused before any work
  }
  check_untouched(t);

  // A result folder that is a link, or holds a FIFO under a result's name.
  const fs::path elsewhere = test::scratch_path(kArea, "elsewhere");
  fs::create_directories(elsewhere);
  const fs::path linked = test::scratch_path(kArea, "linked-out");
  fs::create_directory_symlink(elsewhere, linked);
  const Outcome via_link = run_into(linked);
  CHECK(via_link.code == 2);
  CHECK(via_link.err.find("the output folder is a symbolic link") != std::string::npos);
  CHECK(fs::is_symlink(fs::symlink_status(linked)));
  CHECK(fs::is_empty(elsewhere));

  const fs::path out = test::scratch_path(kArea, "with-fifo");
  REQUIRE(run_into(out).code == 0);
  fs::remove(out / "metrics.csv");
  REQUIRE(::mkfifo((out / "metrics.csv").c_str(), 0600) == 0);
  fs::create_symlink(t.target, out / "report.html.keep");
  const Outcome fifo_inside = run_into(out);
  CHECK(fifo_inside.code == 2);
  CHECK(fifo_inside.err.find("metrics.csv in the output folder is a named pipe") !=
        std::string::npos);
  CHECK(fs::is_fifo(fs::symlink_status(out / "metrics.csv")));
  check_untouched(t);
}

TEST_CASE("an output that is an input of the same command is refused", "[output]") {
  const fs::path history = test::scratch_path(kArea, "self.csv");
  const std::string text = "date,store,item,delivered,sold,leftover,sold_out\n";
  test::write_text(history, text);
  const Outcome fit =
      test::run_larder(kArea, fmt::format("fit {} --out {}", history.string(), history.string()));
  CHECK(fit.code == 2);
  CHECK(fit.err.find("is the history") != std::string::npos);
  CHECK(fit.err.find("larder would overwrite its own input") != std::string::npos);
  CHECK(test::slurp(history) == text);

  // The same file under another spelling.
  const fs::path items = test::scratch_path(kArea, "items.csv");
  test::write_text(items, "item,price,unit_cost,shelf_life_days\n");
  const Outcome fit_items = test::run_larder(
      kArea, fmt::format("fit {} --items {} --out {}/./{}", history.string(), items.string(),
                         items.parent_path().string(), items.filename().string()));
  CHECK(fit_items.code == 2);
  CHECK(fit_items.err.find("is the --items file") != std::string::npos);

  const fs::path sc = scenario_file();
  const std::string before = test::slurp(sc);
  const Outcome hist = test::run_larder(
      kArea, fmt::format("history {} --policy fixed --out {}", sc.string(), sc.string()));
  CHECK(hist.code == 2);
  CHECK(hist.err.find("is the scenario") != std::string::npos);
  CHECK(test::slurp(sc) == before);

  const fs::path one = test::scratch_path(kArea, "one.csv");
  const Outcome same =
      test::run_larder(kArea, fmt::format("history {} --policy fixed --out {} --items-out {}",
                                          sc.string(), one.string(), one.string()));
  CHECK(same.code == 2);
  CHECK(same.err.find("--out and --items-out name the same file") != std::string::npos);
  CHECK(!fs::exists(one));

  // A scenario kept in the output folder under a result's name.
  const fs::path out = test::scratch_path(kArea, "self-out");
  REQUIRE(run_into(out).code == 0);
  test::write_text(out / "metrics.csv", kScenario);
  const Outcome run = test::run_larder(
      kArea, fmt::format("run {} --quiet --out {}", (out / "metrics.csv").string(), out.string()));
  CHECK(run.code == 2);
  CHECK(run.err.find("is the scenario") != std::string::npos);
  CHECK(test::slurp(out / "metrics.csv") == kScenario);
}

TEST_CASE("a run removes temporary files a crashed run left, and keeps other files", "[output]") {
  const fs::path out = test::scratch_path(kArea, "stale");
  REQUIRE(run_into(out).code == 0);
  const pid_t child = ::fork();  // a process id that no longer runs
  if (child == 0) ::_exit(0);
  ::waitpid(child, nullptr, 0);
  const std::string stale = fmt::format(".breakdown.csv.tmp-{}-4", static_cast<long>(child));
  test::write_text(out / stale, "half a file");
  test::write_text(out / "notes.txt", "mine");
  REQUIRE(run_into(out).code == 0);
  CHECK(!fs::exists(out / stale));
  CHECK(temporaries(out).empty());
  CHECK(test::slurp(out / "notes.txt") == "mine");
  CHECK(fs::is_regular_file(out / "report.html"));
}

TEST_CASE("a bad --precision creates nothing; a read-only folder is found before simulating",
          "[output]") {
  const fs::path out = test::scratch_path(kArea, "bad-precision");
  const Outcome o = run_into(out, "--precision nonsense");
  CHECK(o.code == 2);
  CHECK(!fs::exists(out));
}

TEST_CASE("a full disk: the earlier result stays whole, nothing left behind", "[output]") {
  // A 1 MiB tmpfs mounted in a private mount namespace (unshare -rm: no root needed where user
  // namespaces are allowed). The first run fits; then a file fills the disk and a second run
  // (another seed) must fail with exit 1 naming the disk, leaving the first run's files exactly.
  const fs::path base = test::scratch_path(kArea, "tmpfs");
  const fs::path mnt = base / "mnt";
  const fs::path host = base / "seen";
  fs::create_directories(mnt);
  fs::create_directories(host);
  const std::string script = fmt::format(
      "set -u; mount -t tmpfs -o size=1m larder-test {mnt} || exit 77; "
      "{bin} run {sc} --quiet --seed 5 --out {mnt}/out >/dev/null 2>{host}/err1; echo $? > "
      "{host}/rc1; cp -a {mnt}/out {host}/before; "
      "dd if=/dev/zero of={mnt}/filler bs=4k 2>/dev/null; "
      "{bin} run {sc} --quiet --seed 6 --out {mnt}/out >/dev/null 2>{host}/err2; echo $? > "
      "{host}/rc2; cp -a {mnt}/out {host}/after; ls -a {mnt} > {host}/listing",
      fmt::arg("mnt", mnt.string()), fmt::arg("bin", LARDER_BINARY),
      fmt::arg("sc", scenario_file().string()), fmt::arg("host", host.string()));
  const std::string cmd = fmt::format("unshare -rm sh -c '{}' 2>/dev/null", script);
  const int status = std::system(cmd.c_str());
  if (!WIFEXITED(status) || WEXITSTATUS(status) == 77 || !fs::exists(host / "rc2")) {
    WARN(
        "a tmpfs cannot be mounted here (unshare -rm and mount refused): the full-disk test "
        "is skipped; the RLIMIT_FSIZE case above covers the failing write");
    return;
  }
  INFO(test::slurp(host / "err1") << test::slurp(host / "err2"));
  REQUIRE(test::slurp(host / "rc1") == "0\n");
  CHECK(test::slurp(host / "rc2") == "1\n");
  CHECK(test::slurp(host / "err2").find("No space left on device") != std::string::npos);
  size_t compared = 0;
  for (const auto& e : fs::directory_iterator(host / "before")) {
    const fs::path name = e.path().filename();
    INFO(name.string());
    CHECK(test::slurp(host / "after" / name) == test::slurp(e.path()));
    ++compared;
  }
  CHECK(compared >= 6);  // the marker, .larder-run, summary, metrics, replications, ... report
  size_t after = 0;
  for ([[maybe_unused]] const auto& e : fs::directory_iterator(host / "after")) ++after;
  CHECK(after == compared);
  CHECK(temporaries(host / "after").empty());
  CHECK(test::slurp(host / "listing").find(".staging-") == std::string::npos);
}

}  // namespace
}  // namespace larder
