#pragma once
// log Γ(x) safe to call from several threads. std::lgamma (POSIX lgamma) also stores the sign of
// Γ(x) in the global `signgam`, so two store tasks computing count probabilities at once race on
// it (found by ThreadSanitizer in the runner tests, .ci/tsan). lgamma_r (glibc, POSIX
// extension) returns the sign through a pointer instead and gives the same values.

#include <math.h>

namespace larder {

/// log |Γ(x)|, without touching global state.
inline double log_gamma(double x) {
  int sign = 0;
  return ::lgamma_r(x, &sign);
}

}  // namespace larder
