#include "sim/scenario/bounded_read.hpp"

#include <fcntl.h>
#include <fmt/format.h>
#include <sys/stat.h>
#include <unistd.h>

#include <algorithm>
#include <cerrno>
#include <system_error>

namespace larder {

BoundedText read_bounded(const std::string& path, std::size_t cap) {
  BoundedText out;
  const int fd = ::open(path.c_str(), O_RDONLY | O_CLOEXEC);
  if (fd < 0) {
    out.problem = std::generic_category().message(errno);
    return out;
  }
  struct stat st {};
  if (::fstat(fd, &st) == 0 && S_ISDIR(st.st_mode)) {
    ::close(fd);
    out.problem = "it is a directory";
    return out;
  }
  if (::fstat(fd, &st) == 0 && S_ISREG(st.st_mode) && static_cast<std::size_t>(st.st_size) > cap) {
    ::close(fd);
    out.too_large = true;
    return out;
  }
  std::string text;
  std::size_t block = 1 << 16;
  while (true) {
    // Never more than cap + 1 bytes: one byte past the cap says the file is larger.
    const std::size_t want = std::min(block, cap + 1 - text.size());
    const std::size_t had = text.size();
    text.resize(had + want);
    const ssize_t got = ::read(fd, text.data() + had, want);
    if (got < 0) {
      if (errno == EINTR) {
        text.resize(had);
        continue;
      }
      out.problem = std::generic_category().message(errno);
      ::close(fd);
      return out;
    }
    text.resize(had + static_cast<std::size_t>(got));
    if (got == 0) break;
    if (text.size() > cap) {
      ::close(fd);
      out.too_large = true;
      return out;
    }
    block = std::min<std::size_t>(block * 2, std::size_t{1} << 24);
  }
  ::close(fd);
  out.text = std::move(text);
  return out;
}

std::string size_in_words(std::size_t bytes) {
  if (bytes >= (std::size_t{1} << 20) && bytes % (std::size_t{1} << 20) == 0) {
    return fmt::format("{} MiB", bytes >> 20);
  }
  if (bytes >= 1024 && bytes % 1024 == 0) return fmt::format("{} KiB", bytes >> 10);
  return fmt::format("{} bytes", bytes);
}

}  // namespace larder
