#pragma once
// Ctrl-C during `larder run` (cli.md: exit 130, partial results kept under a marked name). The
// first SIGINT only raises a flag that the runner reads between batches of replications, so the
// command can write what has finished; the handler then resets to the default, so a second
// Ctrl-C ends the process at once (result files are still whole: they are written atomically).

#include <signal.h>

#include <atomic>

namespace larder {

/// While alive, SIGINT sets stop_flag() instead of ending the process; the previous handling is
/// restored on destruction. One at a time (the flag is process-wide, like the signal).
class InterruptGuard {
 public:
  InterruptGuard();
  ~InterruptGuard();
  InterruptGuard(const InterruptGuard&) = delete;
  InterruptGuard& operator=(const InterruptGuard&) = delete;

  /// The flag for RunOptions::stop.
  const std::atomic<bool>& stop_flag() const;
  /// Whether SIGINT arrived since this guard was made.
  bool interrupted() const;

 private:
  struct sigaction previous_;  ///< restored on destruction
};

}  // namespace larder
