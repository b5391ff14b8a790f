#include "reports/atomic_file.hpp"

#include <unistd.h>

#include <atomic>
#include <catch2/catch.hpp>
#include <fstream>
#include <sstream>
#include <stdexcept>
#include <thread>

#include "reports/sample_run.test.hpp"

namespace fs = std::filesystem;
using larder::test::folder_entries;
using larder::test::ScratchDir;

using larder::test::read_all;

TEST_CASE("write_file_atomically writes the whole content and leaves no temporary", "[reports]") {
  ScratchDir dir("atomic-new");
  const fs::path file = dir.path() / "summary.json";
  using namespace std::string_literals;
  const std::string content = "{\"a\": 1}\nsecond line, with \0 a zero byte\n"s;
  REQUIRE(content.size() == 41);  // the zero byte is kept
  larder::write_file_atomically(file, content);
  CHECK(read_all(file) == content);
  CHECK(folder_entries(dir.path()) == std::vector<std::string>{"summary.json"});
}

TEST_CASE("write_file_atomically writes an empty file", "[reports]") {
  ScratchDir dir("atomic-empty");
  const fs::path file = dir.path() / "empty.csv";
  larder::write_file_atomically(file, "");
  CHECK(fs::exists(file));
  CHECK(fs::file_size(file) == 0);
}

TEST_CASE("write_file_atomically replaces an existing file whole", "[reports]") {
  ScratchDir dir("atomic-replace");
  const fs::path file = dir.path() / "metrics.csv";
  larder::write_file_atomically(file, std::string(10000, 'x'));
  larder::write_file_atomically(file, "short\n");
  CHECK(read_all(file) == "short\n");
  CHECK(folder_entries(dir.path()) == std::vector<std::string>{"metrics.csv"});
}

TEST_CASE("write_file_atomically into a missing folder throws and creates nothing", "[reports]") {
  ScratchDir dir("atomic-missing");
  const fs::path file = dir.path() / "no-such-folder" / "summary.json";
  try {
    larder::write_file_atomically(file, "content");
    FAIL("expected std::runtime_error");
  } catch (const std::runtime_error& e) {
    const std::string message = e.what();
    CHECK_THAT(message, Catch::Contains(file.string()));
    CHECK_THAT(message, Catch::Contains("No such file or directory"));
  }
  CHECK(folder_entries(dir.path()).empty());
}

TEST_CASE("write_file_atomically that cannot rename keeps the old entry and removes the temporary",
          "[reports]") {
  ScratchDir dir("atomic-rename");
  // A non-empty folder under the final name: refused before writing (it is not an ordinary
  // file, issue 23); were it to appear while writing, the rename would fail the same way.
  const fs::path target = dir.path() / "summary.json";
  fs::create_directories(target / "inside");
  CHECK_THROWS_WITH(larder::write_file_atomically(target, "content"),
                    Catch::Contains(target.string()) && Catch::Contains("not an ordinary file"));
  CHECK(fs::is_directory(target / "inside"));
  CHECK(folder_entries(dir.path()) == std::vector<std::string>{"summary.json"});
}

TEST_CASE("write_file_atomically into a read-only folder throws and leaves nothing", "[reports]") {
  if (::geteuid() == 0) {
    WARN("running as root: folder permissions are not enforced, skipping");
    return;
  }
  ScratchDir dir("atomic-readonly");
  const fs::path folder = dir.path() / "locked";
  fs::create_directories(folder);
  fs::permissions(folder, fs::perms::owner_read | fs::perms::owner_exec);
  CHECK_THROWS_AS(larder::write_file_atomically(folder / "summary.json", "content"),
                  std::runtime_error);
  fs::permissions(folder, fs::perms::owner_all);
  CHECK(folder_entries(folder).empty());
}

TEST_CASE("a reader never sees a half-written file", "[reports]") {
  // One thread keeps replacing the file with either 1 MB of 'a' or 2 MB of 'b'; the reader must
  // only ever see one of the two complete contents.
  ScratchDir dir("atomic-reader");
  const fs::path file = dir.path() / "replications.csv";
  const std::string a(1 << 20, 'a');
  const std::string b(2 << 20, 'b');
  larder::write_file_atomically(file, a);

  std::atomic<bool> done{false};
  std::thread writer([&] {
    for (int i = 0; i < 20; ++i) larder::write_file_atomically(file, i % 2 == 0 ? b : a);
    done = true;
  });
  int reads = 0;
  int torn = 0;
  while (!done || reads == 0) {
    const std::string seen = read_all(file);
    if (seen != a && seen != b) ++torn;
    ++reads;
  }
  writer.join();
  CHECK(torn == 0);
  CHECK(reads > 0);
  CHECK(read_all(file) == a);  // the 20th write (i = 19) wrote a
  CHECK(folder_entries(dir.path()) == std::vector<std::string>{"replications.csv"});
}

TEST_CASE("ensure_directory creates nested folders and accepts existing ones", "[reports]") {
  ScratchDir dir("ensure-dir");
  const fs::path nested = dir.path() / "larder-out" / "two-shops";
  larder::ensure_directory(nested);
  CHECK(fs::is_directory(nested));
  larder::ensure_directory(nested);  // already there: no error
  CHECK(fs::is_directory(nested));
}

TEST_CASE("ensure_directory throws when a file holds the name", "[reports]") {
  ScratchDir dir("ensure-file");
  const fs::path file = dir.path() / "larder-out";
  larder::write_file_atomically(file, "not a folder");
  CHECK_THROWS_WITH(larder::ensure_directory(file), Catch::Contains(file.string()));
  CHECK_THROWS_WITH(larder::ensure_directory(file / "below"), Catch::Contains("below"));
}
