// Bounded reads (issue 23): a whole-text reader never reads more than its cap + 1 bytes, from a
// file, a pipe or a device; the line reader stops on a line without end or past its total cap.

#include "sim/scenario/bounded_read.hpp"

#include <fmt/format.h>
#include <unistd.h>

#include <catch2/catch.hpp>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "sim/scenario/line_reader.hpp"

namespace larder {
namespace {

TEST_CASE("read_bounded: the whole file under the cap, a refusal above it", "[hostile]") {
  const auto path = std::filesystem::temp_directory_path() /
                    fmt::format("larder-bounded-{}.txt", static_cast<long>(::getpid()));
  std::ofstream(path, std::ios::binary) << "0123456789";
  CHECK(read_bounded(path.string(), 10).text == "0123456789");
  CHECK(read_bounded(path.string(), 10).ok());
  CHECK(read_bounded(path.string(), 9).too_large);
  CHECK(read_bounded(path.string(), 9).text.empty());
  std::filesystem::remove(path);
  CHECK(read_bounded(path.string(), 9).problem == "No such file or directory");
  CHECK(read_bounded(path.parent_path().string(), 9).problem == "it is a directory");
  // A device without end: the cap decides, not the file.
  const BoundedText zero = read_bounded("/dev/zero", 1 << 20);
  CHECK(zero.too_large);
  CHECK(size_in_words(std::size_t{16} << 20) == "16 MiB");
  CHECK(size_in_words(1536) == "1536 bytes");
  CHECK(size_in_words(2048) == "2 KiB");
}

TEST_CASE("LineReader stops on a line longer than its skip bound and at a total cap", "[hostile]") {
  // One line longer than the skip bound without an end, then a line that is never reached.
  std::string text(LineReader::kMaxSkip + 2 * LineReader::kMaxLine, 'z');
  text += "\nnever";
  std::istringstream in(text);
  LineReader r(in);
  std::string line;
  bool too_long = false;
  REQUIRE(r.next(line, too_long));
  CHECK(too_long);
  CHECK(line.size() == LineReader::kMaxLine);
  CHECK(r.stopped_early());
  CHECK(!r.over_size());
  CHECK(!r.next(line, too_long));

  std::istringstream rows("a\nb\nc\n" + std::string(200000, 'r'));
  LineReader capped(rows, 100000);  // blocks of 64 KiB: stops after the second block
  std::vector<std::string> got;
  while (capped.next(line, too_long)) got.push_back(line);
  CHECK(got == std::vector<std::string>{"a", "b", "c"});
  CHECK(capped.over_size());
}

}  // namespace
}  // namespace larder
