#pragma once
// `parallel_tasks(n, body)`: body(0) … body(n − 1) on TBB's threads, as tbb::parallel_for, and
// the one place the runner starts parallel work. Under ThreadSanitizer (.ci/tsan) it also tells
// the sanitizer what TBB guarantees: everything before the call happens before every task, and
// every task happens before the return. TBB hands tasks over inside libtbb.so, which is not
// instrumented, so without these two edges the sanitizer reports every value a task reads from
// the caller (or the caller reads from a task) as a race.

#include <tbb/parallel_for.h>

#if defined(__has_feature)
#if __has_feature(thread_sanitizer)
#define LARDER_TSAN_ANNOTATE 1
#endif
#endif
#if defined(__SANITIZE_THREAD__)
#define LARDER_TSAN_ANNOTATE 1
#endif
#ifdef LARDER_TSAN_ANNOTATE
#include <sanitizer/tsan_interface.h>
#endif

namespace larder {

/// Runs body(i) for i in [0, n) in parallel; returns when all are done.
template <class Body>
void parallel_tasks(int n, const Body& body) {
#ifdef LARDER_TSAN_ANNOTATE
  // A fixed address, never written: a task must acquire before it reads its captures.
  static constexpr char kSync = 0;
  void* const sync = const_cast<char*>(&kSync);
  __tsan_release(sync);
  tbb::parallel_for(0, n, [&body](int i) {
    __tsan_acquire(const_cast<char*>(&kSync));
    body(i);
    __tsan_release(const_cast<char*>(&kSync));
  });
  __tsan_acquire(sync);
#else
  tbb::parallel_for(0, n, body);
#endif
}

}  // namespace larder
