#include "reports/result_set.hpp"

#include <fcntl.h>
#include <fmt/format.h>
#include <sys/stat.h>
#include <unistd.h>

#include <algorithm>
#include <atomic>
#include <cerrno>
#include <chrono>
#include <cstdio>
#include <nlohmann/json.hpp>
#include <optional>
#include <stdexcept>
#include <system_error>

#include "reports/atomic_file.hpp"
#include "sim/scenario/bounded_read.hpp"

namespace larder {

namespace {

namespace fs = std::filesystem;

std::string errno_text(int err) {
  return std::generic_category().message(err);
}

/// `dir` as an absolute path without a trailing separator ("out/" and "out" are one folder).
fs::path folder_path(const fs::path& dir) {
  fs::path p = fs::absolute(dir).lexically_normal();
  if (p.filename().empty() && p.has_parent_path() && p != p.root_path()) p = p.parent_path();
  return p;
}

/// What `.larder-run` says: the staging folder the published folder came from and its set.
struct RunRecord {
  std::string run;
  std::string staging;
  std::vector<std::string> files;
  std::vector<std::string> retired;
};

std::string record_text(const RunRecord& r) {
  const nlohmann::json j = {
      {"run", r.run}, {"staging", r.staging}, {"files", r.files}, {"retired", r.retired}};
  return j.dump(1) + "\n";
}

/// The record of `dir` (empty when missing or unreadable; read with a size cap).
RunRecord read_record(const fs::path& dir) {
  RunRecord r;
  std::error_code ec;
  if (!fs::is_regular_file(fs::symlink_status(dir / kRunRecord, ec))) return r;
  const BoundedText in = read_bounded((dir / kRunRecord).string(), std::size_t{1} << 20);
  if (!in.ok()) return r;
  const auto j = nlohmann::json::parse(in.text, nullptr, false);
  if (!j.is_object()) return r;
  const auto str = [&](const char* key) {
    return j.contains(key) && j[key].is_string() ? j[key].get<std::string>() : std::string();
  };
  const auto list = [&](const char* key) {
    std::vector<std::string> out;
    if (j.contains(key) && j[key].is_array()) {
      for (const auto& v : j[key])
        if (v.is_string()) out.push_back(v.get<std::string>());
    }
    return out;
  };
  r.run = str("run");
  r.staging = str("staging");
  r.files = list("files");
  r.retired = list("retired");
  return r;
}

bool listed(const std::vector<std::string>& names, const std::string& name) {
  return std::find(names.begin(), names.end(), name) != names.end();
}

/// Moves what the old folder `old` held besides the set of `record` (other commands' results,
/// subfolders, the user's files under --force) into the new folder `target`, unless there is
/// something of that name already.
bool carry_back(const fs::path& old, const fs::path& target, const RunRecord& record) {
  std::error_code ec;
  bool all = true;
  for (const auto& entry : fs::directory_iterator(old, ec)) {
    const std::string name = entry.path().filename().string();
    if (name == kRunRecord || listed(record.files, name) || listed(record.retired, name) ||
        is_stale_temporary(name)) {
      continue;
    }
    std::error_code e2;
    if (fs::exists(fs::symlink_status(target / name, e2))) continue;
    fs::rename(entry.path(), target / name, e2);
    if (e2) all = false;  // e.g. a read-only subfolder cannot change its parent
  }
  return all && !ec;
}

/// A staging folder `staging` of `target` whose writer is gone: when `target` was published from
/// it (its record names it), it holds the old folder: carry back what it held; then remove it.
void settle(const fs::path& target, const fs::path& staging) {
  const RunRecord published = read_record(target);
  std::error_code ec;
  if (!published.staging.empty() && published.staging == staging.filename().string()) {
    // What could not be carried back stays where it is, never removed with the old set.
    if (!carry_back(staging, target, published)) return;
  }
  fs::remove_all(staging, ec);
}

/// Stale staging folders of `target` in its parent folder.
void settle_stale_staging(const fs::path& target) {
  const std::string prefix = fmt::format(".{}.staging-", target.filename().string());
  std::error_code ec;
  std::vector<fs::path> stale;
  for (const auto& entry : fs::directory_iterator(target.parent_path(), ec)) {
    const std::string name = entry.path().filename().string();
    if (name.starts_with(prefix) && is_stale_temporary(name, target.filename().string())) {
      stale.push_back(entry.path());
    }
  }
  for (const fs::path& s : stale) settle(target, s);
}

/// Writes `content` to a new file `path` inside a staging folder; a failure names `final_path`.
void write_new_file(const fs::path& path, const fs::path& final_path, std::string_view content) {
  const int fd = ::open(path.c_str(), O_WRONLY | O_CREAT | O_EXCL | O_CLOEXEC, 0644);
  const auto fail = [&](const char* what, int err) {
    throw std::runtime_error(fmt::format("cannot write {}: {} {} failed: {}", final_path.string(),
                                         what, path.string(), errno_text(err)));
  };
  if (fd < 0) fail("creating", errno);
  const char* data = content.data();
  std::size_t left = content.size();
  while (left > 0) {
    const ssize_t n = ::write(fd, data, left);
    if (n < 0) {
      if (errno == EINTR) continue;
      const int err = errno;
      ::close(fd);
      fail("writing", err);
    }
    data += n;
    left -= static_cast<std::size_t>(n);
  }
  if (::fsync(fd) != 0) {
    const int err = errno;
    ::close(fd);
    fail("flushing", err);
  }
  if (::close(fd) != 0) fail("closing", errno);
}

void sync_folder(const fs::path& dir) {
  const int fd = ::open(dir.c_str(), O_RDONLY | O_DIRECTORY | O_CLOEXEC);
  if (fd < 0) return;
  ::fsync(fd);
  ::close(fd);
}

/// Removes a staging folder unless released (a failed or abandoned publish).
class StagingGuard {
 public:
  explicit StagingGuard(fs::path p) : path_(std::move(p)) {}
  StagingGuard(const StagingGuard&) = delete;
  StagingGuard& operator=(const StagingGuard&) = delete;
  ~StagingGuard() {
    std::error_code ignored;
    if (!path_.empty()) fs::remove_all(path_, ignored);
  }
  /// Keeps the folder (it holds something that could not be carried back).
  void release() { path_.clear(); }

 private:
  fs::path path_;
};

std::string unique_suffix() {
  static std::atomic<unsigned long> counter{0};
  const auto now = std::chrono::system_clock::now().time_since_epoch();
  return fmt::format("{}-{}-{}", static_cast<long>(::getpid()),
                     counter.fetch_add(1, std::memory_order_relaxed),
                     std::chrono::duration_cast<std::chrono::nanoseconds>(now).count());
}

/// Whether the folder may be swapped: not the working folder nor one holding it (the shell's
/// working folder would then be the old one, removed).
bool may_swap(const fs::path& target) {
  std::error_code ec;
  const fs::path cwd = fs::current_path(ec);
  if (ec) return false;
  const fs::path rel = cwd.lexically_relative(target);
  return rel.empty() || rel.begin()->string() == "..";
}

/// The fallback: each file replaced whole, one after the other.
void write_in_place(const fs::path& target, const std::vector<ResultFile>& files,
                    const std::vector<std::string>& retired, const RunRecord& record) {
  ensure_directory(target);
  for (const ResultFile& f : files) write_file_atomically(target / f.name, f.content);
  for (const std::string& name : retired) {
    std::error_code ec;
    fs::remove(target / name, ec);
  }
  write_file_atomically(target / kRunRecord, record_text(record));
}

}  // namespace

void recover_result_folder(const fs::path& dir) {
  const fs::path target = folder_path(dir);
  std::error_code ec;
  if (fs::is_directory(target.parent_path(), ec)) settle_stale_staging(target);
  if (!fs::is_directory(target, ec)) return;
  // Inside: stale staging folders of subfolders (partial/, drill folders) and temporary files.
  std::vector<fs::path> children;
  for (const auto& entry : fs::directory_iterator(target, ec)) {
    const std::string name = entry.path().filename().string();
    const size_t at = name.rfind(".staging-");
    if (at != std::string::npos && at > 1 && is_stale_temporary(name)) {
      children.push_back(target / name.substr(1, at - 1));
    }
  }
  for (const fs::path& child : children) settle_stale_staging(child);
  remove_stale_temporaries(target);
}

void publish_result_set(const fs::path& dir, const std::vector<ResultFile>& files,
                        const std::vector<std::string>& retired) {
  const fs::path target = folder_path(dir);
  ensure_directory(target);  // names the folder when it cannot be made; then swapped whole
  recover_result_folder(target);

  RunRecord record;
  record.run = unique_suffix();
  for (const ResultFile& f : files) record.files.push_back(f.name);
  record.retired = retired;
  const fs::path staging =
      target.parent_path() / fmt::format(".{}.staging-{}", target.filename().string(), record.run);
  record.staging = staging.filename().string();

  std::error_code ec;
  const fs::file_status status = fs::symlink_status(target, ec);
  const bool exists = fs::exists(status);
  if (exists && !fs::is_directory(status)) {
    throw std::runtime_error(
        fmt::format("cannot write {}: it exists and is not a folder", target.string()));
  }
  if ((exists && !may_swap(target)) || ::mkdir(staging.c_str(), 0777) != 0) {
    write_in_place(target, files, retired, record);
    return;
  }
  StagingGuard guard(staging);
  write_new_file(staging / kRunRecord, target / kRunRecord, record_text(record));
  for (const ResultFile& f : files) write_new_file(staging / f.name, target / f.name, f.content);

  if (exists) {
    struct stat st {};
    if (::stat(target.c_str(), &st) == 0) ::chmod(staging.c_str(), st.st_mode & 07777);
    // Ordinary files the set does not replace: linked now, so they never leave the folder.
    for (const auto& entry : fs::directory_iterator(target, ec)) {
      const std::string name = entry.path().filename().string();
      std::error_code e2;
      if (name == kRunRecord || listed(record.files, name) || listed(retired, name) ||
          is_stale_temporary(name) || !entry.is_regular_file(e2) || entry.is_symlink(e2)) {
        continue;
      }
      ::link(entry.path().c_str(), (staging / name).c_str());
    }
  }
  sync_folder(staging);

  if (!exists) {
    if (::rename(staging.c_str(), target.c_str()) != 0) {
      throw std::runtime_error(fmt::format("cannot write {}: renaming {} to it failed: {}",
                                           target.string(), staging.string(), errno_text(errno)));
    }
  } else if (::renameat2(AT_FDCWD, staging.c_str(), AT_FDCWD, target.c_str(), RENAME_EXCHANGE) !=
             0) {
    const int err = errno;
    if (err == EINVAL || err == ENOSYS || err == EBUSY || err == ENOTSUP || err == EXDEV) {
      write_in_place(target, files, retired, record);  // the guard removes the staging folder
      return;
    }
    throw std::runtime_error(fmt::format("cannot write {}: exchanging it with {} failed: {}",
                                         target.string(), staging.string(), errno_text(err)));
  } else {
    // The staging path now holds the old folder: bring back what is not part of the set. What
    // cannot be moved keeps the old folder (hidden, beside the output folder) from removal.
    if (!carry_back(staging, target, record)) guard.release();
  }
  sync_folder(target.parent_path());
}

}  // namespace larder
