#include "cli/interrupt.hpp"

#include <csignal>
#include <cstring>

namespace larder {

namespace {

// The one piece of global mutable state in larder, and why: a signal handler receives no context
// pointer, and the only objects it may touch are lock-free atomics (and volatile sig_atomic_t) of
// static storage duration ([support.signal]). The handler only stores true; the runner only reads.
std::atomic<bool> g_interrupted{false};
static_assert(std::atomic<bool>::is_always_lock_free, "the SIGINT flag must be lock-free");

void on_sigint(int /*signal*/) {
  g_interrupted.store(true);
}

}  // namespace

InterruptGuard::InterruptGuard() : previous_{} {
  g_interrupted.store(false);
  struct sigaction action;
  std::memset(&action, 0, sizeof action);
  action.sa_handler = on_sigint;
  sigemptyset(&action.sa_mask);
  action.sa_flags = SA_RESETHAND;  // a second Ctrl-C ends the process (the default action)
  sigaction(SIGINT, &action, &previous_);
}

InterruptGuard::~InterruptGuard() {
  sigaction(SIGINT, &previous_, nullptr);
}

const std::atomic<bool>& InterruptGuard::stop_flag() const {
  return g_interrupted;
}

bool InterruptGuard::interrupted() const {
  return g_interrupted.load();
}

}  // namespace larder
