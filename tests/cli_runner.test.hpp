#pragma once
// Running the `larder` executable from a test: a scratch folder per test file, the exit code,
// stdout and stderr of one command, and small file helpers. For the cross-cutting tests of
// hostile input, numeric edge cases, properties and output safety.

#include <fmt/format.h>
#include <sys/wait.h>
#include <unistd.h>

#include <array>
#include <catch2/catch.hpp>
#include <cstdio>
#include <filesystem>
#include <fstream>
#include <sstream>
#include <string>

namespace larder::test {

namespace fs = std::filesystem;

struct Outcome {
  int code = -1;  ///< exit code; -1 when the process ended by a signal (a crash)
  std::string out;
  std::string err;
};

/// The folder of this process and `area` that scratch paths live in.
inline fs::path scratch_dir(const std::string& area) {
  return fs::temp_directory_path() / fmt::format("larder-{}-{}", area, ::getpid());
}

/// A fresh path `name` under a folder of this process and `area` (removed first).
inline fs::path scratch_path(const std::string& area, const std::string& name) {
  const fs::path p = scratch_dir(area) / name;
  std::error_code ec;
  fs::permissions(p, fs::perms::owner_all, fs::perm_options::add, ec);  // after read-only tests
  fs::remove_all(p, ec);
  fs::create_directories(p.parent_path());
  return p;
}

inline std::string slurp(const fs::path& p) {
  std::ifstream in(p, std::ios::binary);
  std::stringstream s;
  s << in.rdbuf();
  return s.str();
}

inline void write_text(const fs::path& p, const std::string& text) {
  std::ofstream(p, std::ios::binary) << text;
}

/// Runs `larder ARGS` (ARGS as a shell would split them), capturing everything.
inline Outcome run_larder(const std::string& area, const std::string& args) {
  const fs::path err = scratch_path(area, "stderr.txt");
  const std::string cmd = fmt::format("{} {} 2>{}", LARDER_BINARY, args, err.string());
  Outcome o;
  FILE* pipe = ::popen(cmd.c_str(), "r");
  REQUIRE(pipe != nullptr);
  std::array<char, 4096> buf{};
  size_t n = 0;
  while ((n = std::fread(buf.data(), 1, buf.size(), pipe)) > 0) o.out.append(buf.data(), n);
  const int status = ::pclose(pipe);
  o.code = WIFEXITED(status) ? WEXITSTATUS(status) : -1;
  o.err = slurp(err);
  return o;
}

}  // namespace larder::test
