#include "reports/atomic_file.hpp"

#include <fcntl.h>
#include <fmt/format.h>
#include <signal.h>
#include <unistd.h>

#include <atomic>
#include <cerrno>
#include <stdexcept>
#include <string>
#include <system_error>
#include <utility>

namespace larder {

namespace {

namespace fs = std::filesystem;

std::string errno_text(int err) {
  return std::generic_category().message(err);
}

[[noreturn]] void fail(const fs::path& path, std::string_view reason) {
  throw std::runtime_error(fmt::format("cannot write {}: {}", path.string(), reason));
}

/// A name in the same folder as `path` that no other writer (thread or process) uses.
fs::path temporary_name(const fs::path& path) {
  static std::atomic<unsigned long> counter{0};
  const auto n = counter.fetch_add(1, std::memory_order_relaxed);
  fs::path tmp = path;
  tmp.replace_filename(
      fmt::format(".{}.tmp-{}-{}", path.filename().string(), static_cast<long>(::getpid()), n));
  return tmp;
}

/// Closes the file descriptor and removes the temporary file unless released.
class TemporaryFile {
 public:
  TemporaryFile(fs::path path, int fd) : path_(std::move(path)), fd_(fd) {}
  TemporaryFile(const TemporaryFile&) = delete;
  TemporaryFile& operator=(const TemporaryFile&) = delete;
  ~TemporaryFile() {
    if (fd_ >= 0) ::close(fd_);
    if (!released_) {
      std::error_code ignored;
      fs::remove(path_, ignored);
    }
  }

  int fd() const { return fd_; }
  const fs::path& path() const { return path_; }

  /// Closes the descriptor; returns 0 or an errno value.
  int close() {
    const int rc = ::close(fd_);
    fd_ = -1;
    return rc == 0 ? 0 : errno;
  }
  /// The file has been renamed to its final name: keep it.
  void release() { released_ = true; }

 private:
  fs::path path_;
  int fd_ = -1;
  bool released_ = false;
};

/// Asks the file system to record the rename durably; best effort, as some file systems refuse.
void sync_folder(const fs::path& dir) {
  const int fd = ::open(dir.empty() ? "." : dir.c_str(), O_RDONLY | O_DIRECTORY | O_CLOEXEC);
  if (fd < 0) return;
  ::fsync(fd);
  ::close(fd);
}

/// Refuses to rename over anything but an ordinary file (a device, a FIFO, a link, a folder):
/// the commands check their outputs before working (output_path.hpp); this is the last guard.
void check_replaceable(const fs::path& path) {
  std::error_code ec;
  const fs::file_status s = fs::symlink_status(path, ec);
  if (!ec && fs::exists(s) && !fs::is_regular_file(s)) {
    fail(path, "it exists and is not an ordinary file; larder does not replace it");
  }
}

/// The process id in "<pid>-..." at the start of `rest`, or -1.
long leading_pid(std::string_view rest) {
  long pid = 0;
  size_t k = 0;
  while (k < rest.size() && k < 10 && rest[k] >= '0' && rest[k] <= '9') {
    pid = pid * 10 + (rest[k] - '0');
    ++k;
  }
  return k == 0 || k >= rest.size() || rest[k] != '-' ? -1 : pid;
}

bool process_gone(long pid) {
  if (pid <= 0 || pid > 0x7fffffff) return false;
  return ::kill(static_cast<pid_t>(pid), 0) != 0 && errno == ESRCH;
}

}  // namespace

bool is_stale_temporary(std::string_view name, std::string_view stem) {
  if (!name.starts_with('.')) return false;
  for (const std::string_view mark : {std::string_view(".tmp-"), std::string_view(".staging-")}) {
    const size_t at = name.rfind(mark);
    if (at == std::string_view::npos || at < 1) continue;
    if (!stem.empty() && name.substr(1, at - 1) != stem) continue;
    if (process_gone(leading_pid(name.substr(at + mark.size())))) return true;
  }
  return false;
}

void remove_stale_temporaries(const fs::path& dir, std::string_view stem) {
  std::error_code ec;
  for (const auto& entry : fs::directory_iterator(dir.empty() ? fs::path(".") : dir, ec)) {
    const std::string name = entry.path().filename().string();
    std::error_code ignored;
    if (name.find(".tmp-") != std::string::npos && is_stale_temporary(name, stem) &&
        !entry.is_directory(ignored)) {
      fs::remove(entry.path(), ignored);
    }
  }
}

void write_file_atomically(const fs::path& path, std::string_view content) {
  if (path.filename().empty()) fail(path, "the path names no file");
  check_replaceable(path);
  remove_stale_temporaries(path.parent_path(), path.filename().string());
  const fs::path tmp_path = temporary_name(path);
  const int fd = ::open(tmp_path.c_str(), O_WRONLY | O_CREAT | O_EXCL | O_CLOEXEC, 0644);
  if (fd < 0) {
    fail(path,
         fmt::format("cannot create temporary file {}: {}", tmp_path.string(), errno_text(errno)));
  }
  TemporaryFile tmp(tmp_path, fd);

  const char* data = content.data();
  std::size_t left = content.size();
  while (left > 0) {
    const ssize_t written = ::write(tmp.fd(), data, left);
    if (written < 0) {
      if (errno == EINTR) continue;
      fail(path, fmt::format("writing {} failed: {}", tmp_path.string(), errno_text(errno)));
    }
    data += written;
    left -= static_cast<std::size_t>(written);
  }
  if (::fsync(tmp.fd()) != 0) {
    fail(path, fmt::format("flushing {} failed: {}", tmp_path.string(), errno_text(errno)));
  }
  if (const int err = tmp.close(); err != 0) {
    fail(path, fmt::format("closing {} failed: {}", tmp_path.string(), errno_text(err)));
  }

  check_replaceable(path);
  std::error_code ec;
  fs::rename(tmp_path, path, ec);
  if (ec) {
    fail(path,
         fmt::format("renaming {} to the final name failed: {}", tmp_path.string(), ec.message()));
  }
  tmp.release();
  sync_folder(path.parent_path());
}

void ensure_directory(const fs::path& dir) {
  std::error_code ec;
  fs::create_directories(dir, ec);
  if (ec) {
    throw std::runtime_error(
        fmt::format("cannot create folder {}: {}", dir.string(), ec.message()));
  }
  if (!fs::is_directory(dir, ec)) {
    throw std::runtime_error(
        fmt::format("cannot create folder {}: a file of that name exists", dir.string()));
  }
}

AtomicFileWriter::AtomicFileWriter(fs::path path) : path_(std::move(path)) {
  if (path_.filename().empty()) fail(path_, "the path names no file");
  check_replaceable(path_);
  remove_stale_temporaries(path_.parent_path(), path_.filename().string());
  tmp_ = temporary_name(path_);
  fd_ = ::open(tmp_.c_str(), O_WRONLY | O_CREAT | O_EXCL | O_CLOEXEC, 0644);
  if (fd_ < 0) {
    fail(path_,
         fmt::format("cannot create temporary file {}: {}", tmp_.string(), errno_text(errno)));
  }
  buffer_.reserve(std::size_t{1} << 20);
}

AtomicFileWriter::~AtomicFileWriter() {
  if (fd_ >= 0) ::close(fd_);
  if (!committed_) {
    std::error_code ignored;
    fs::remove(tmp_, ignored);
  }
}

void AtomicFileWriter::write(std::string_view text) {
  buffer_.append(text);
  if (buffer_.size() >= (std::size_t{1} << 20)) drain();
}

void AtomicFileWriter::drain() {
  const char* data = buffer_.data();
  std::size_t left = buffer_.size();
  while (left > 0) {
    const ssize_t written = ::write(fd_, data, left);
    if (written < 0) {
      if (errno == EINTR) continue;
      fail(path_, fmt::format("writing {} failed: {}", tmp_.string(), errno_text(errno)));
    }
    data += written;
    left -= static_cast<std::size_t>(written);
  }
  buffer_.clear();
}

void AtomicFileWriter::commit() {
  if (committed_ || fd_ < 0) fail(path_, "the file was already committed");
  drain();
  if (::fsync(fd_) != 0) {
    fail(path_, fmt::format("flushing {} failed: {}", tmp_.string(), errno_text(errno)));
  }
  const int rc = ::close(fd_);
  fd_ = -1;
  if (rc != 0) fail(path_, fmt::format("closing {} failed: {}", tmp_.string(), errno_text(errno)));
  check_replaceable(path_);
  std::error_code ec;
  fs::rename(tmp_, path_, ec);
  if (ec) {
    fail(path_,
         fmt::format("renaming {} to the final name failed: {}", tmp_.string(), ec.message()));
  }
  committed_ = true;
  sync_folder(path_.parent_path());
}

}  // namespace larder
