#include "cli/progress.hpp"

#include <fmt/format.h>
#include <unistd.h>

#include <cmath>
#include <cstdio>

namespace larder {

std::string format_duration(double seconds) {
  const long s = std::lround(std::max(seconds, 0.0));
  if (s < 60) return fmt::format("{}s", s);
  if (s < 3600) return fmt::format("{}m {:02}s", s / 60, s % 60);
  return fmt::format("{}h {:02}m", s / 3600, (s % 3600) / 60);
}

Progress::Progress(std::string what, bool quiet)
    : what_(std::move(what)),
      quiet_(quiet),
      terminal_(isatty(fileno(stderr)) != 0),
      start_(std::chrono::steady_clock::now()),
      last_(start_) {}

void Progress::update(int done, int total) {
  if (quiet_ || total <= 0) return;
  const auto now = std::chrono::steady_clock::now();
  const double elapsed = std::chrono::duration<double>(now - start_).count();
  const double since = std::chrono::duration<double>(now - last_).count();
  const bool last = done >= total;
  // Redraw a bar at most ~10 times a second; print a plain line at most every 5 seconds.
  if (terminal_ ? (since < 0.1 && !last) : (since < 5.0 || last)) return;
  last_ = now;
  const double rate = elapsed > 0 ? done / elapsed : 0.0;
  const double eta = rate > 0 ? (total - done) / rate : 0.0;
  if (terminal_) {
    constexpr int kWidth = 30;
    const int filled = static_cast<int>(kWidth * static_cast<double>(done) / total);
    fmt::print(stderr, "\r[{}{}] {}/{} {}  {:.1f}/s  ETA {}   ", std::string(filled, '#'),
               std::string(kWidth - filled, '.'), done, total, what_, rate, format_duration(eta));
    drawn_ = true;
  } else {
    fmt::print(stderr, "progress: {}/{} {} ({:.1f}/s, about {} left)\n", done, total, what_, rate,
               format_duration(eta));
  }
  std::fflush(stderr);
}

void Progress::finish() {
  if (drawn_) fmt::print(stderr, "\n");
  drawn_ = false;
}

}  // namespace larder
