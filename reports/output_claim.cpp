#include "reports/output_claim.hpp"

#include <fcntl.h>
#include <fmt/format.h>
#include <unistd.h>

#include <cerrno>
#include <nlohmann/json.hpp>
#include <stdexcept>
#include <system_error>

#include "reports/atomic_file.hpp"
#include "reports/result_set.hpp"
#include "sim/scenario/bounded_read.hpp"
#include "sim/scenario/diagnostics.hpp"

namespace larder {

namespace {

namespace fs = std::filesystem;

[[noreturn]] void refuse(const fs::path& dir, std::string message, std::string hint) {
  Diagnostics d;
  d.error({dir.string(), 0, 0}, std::move(message), std::move(hint));
  throw InputError(std::move(d));
}

bool larder_summary(const fs::path& file) {
  std::error_code ec;
  if (!fs::is_regular_file(file, ec)) return false;  // a FIFO named summary.json: never opened
  const BoundedText in = read_bounded(file.string(), std::size_t{16} << 20);
  if (!in.ok()) return false;  // a summary is far smaller
  const auto j = nlohmann::json::parse(in.text, nullptr, false);
  return j.is_object() && j.contains("larder_version");
}

/// Whether `dir` holds anything but the marker (or a marker being written by another process
/// of the same run: MPI ranks claim the folder at the same time).
bool holds_other_files(const fs::path& dir) {
  std::error_code ec;
  for (const auto& entry : fs::directory_iterator(dir, ec)) {
    const std::string name = entry.path().filename().string();
    std::string_view base = name;
    if (name == kRunRecord || is_stale_temporary(name)) continue;
    if (base.starts_with(".")) base.remove_prefix(1);  // a temporary file: .<name>.tmp-...
    if (!base.starts_with(kOutputMarker)) return true;
  }
  return false;
}

}  // namespace

bool holds_larder_result(const fs::path& dir) {
  std::error_code ec;
  return fs::is_regular_file(dir / kOutputMarker, ec) ||
         fs::is_regular_file(dir / kRunRecord, ec) || larder_summary(dir / "summary.json");
}

void claim_output_folder(const fs::path& dir, bool force) {
  std::error_code ec;
  if (fs::is_symlink(fs::symlink_status(dir, ec))) {
    refuse(dir,
           "the output folder is a symbolic link; larder replaces the folder's results as a "
           "whole and would replace the link",
           "give the folder it points to as --out");
  }
  const fs::file_status status = fs::status(dir, ec);
  if (fs::exists(status) && !fs::is_directory(status)) {
    refuse(dir, "the output folder is a file", "choose another --out");
  }
  if (fs::is_directory(status) && !force && holds_other_files(dir) && !holds_larder_result(dir)) {
    refuse(dir,
           fmt::format("the output folder exists, is not empty and holds no larder result; "
                       "larder would replace files in it"),
           "choose another --out, or pass --force to write into it anyway");
  }
  recover_result_folder(dir);  // what a crashed run left: finished or removed
  ensure_directory(dir);
  if (!fs::is_regular_file(dir / kOutputMarker, ec)) {
    write_file_atomically(dir / kOutputMarker,
                          "This folder holds results written by larder; larder may replace the "
                          "files it wrote here.\n");
  }
  check_writable(dir);
}

void check_writable(const fs::path& dir) {
  const fs::path probe = dir / fmt::format(".larder-probe.tmp-{}-0", static_cast<long>(::getpid()));
  const int fd = ::open(probe.c_str(), O_WRONLY | O_CREAT | O_EXCL | O_CLOEXEC, 0644);
  if (fd < 0) {
    throw std::runtime_error(fmt::format("cannot write {}: creating a file there failed: {}",
                                         dir.string(), std::generic_category().message(errno)));
  }
  ::close(fd);
  std::error_code ignored;
  fs::remove(probe, ignored);
}

}  // namespace larder
