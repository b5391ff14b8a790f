#include "reports/pareto.hpp"

#include <cassert>

namespace larder {

std::vector<bool> pareto_front(std::span<const double> lower, std::span<const double> higher) {
  assert(lower.size() == higher.size());
  const size_t n = lower.size();
  std::vector<bool> front(n, true);
  for (size_t i = 0; i < n; ++i) {
    for (size_t j = 0; j < n && front[i]; ++j) {
      const bool as_good = lower[j] <= lower[i] && higher[j] >= higher[i];
      const bool better = lower[j] < lower[i] || higher[j] > higher[i];
      if (j != i && as_good && better) front[i] = false;
    }
  }
  return front;
}

}  // namespace larder
