#include "sim/engine/customer_split.hpp"

#include <algorithm>
#include <cassert>
#include <cmath>

#include "sim/stats/binomial.hpp"

namespace larder {

SplitPlan plan_split(std::span<const double> shares, bool complete) {
  SplitPlan plan;
  plan.complete = complete;
  double rest = 1.0;  // probability mass of the categories not yet split off
  for (double share : shares) {
    const double p = rest > 0.0 ? std::min(share / rest, 1.0) : 1.0;
    plan.p.push_back(p);
    plan.log_q.push_back(p < 1.0 ? std::log1p(-p) : 0.0);
    rest -= share;
  }
  return plan;
}

int split_count(int n, const SplitPlan& plan, std::span<const double> u, std::span<int> out) {
  assert(out.size() == plan.p.size());
  const size_t k_end = plan.complete ? plan.p.size() - 1 : plan.p.size();
  assert(u.size() >= k_end);
  int left = n;
  for (size_t k = 0; k < k_end; ++k) {
    const int x = left > 0 ? binomial_inverse(u[k], left, plan.p[k], plan.log_q[k]) : 0;
    out[k] = x;
    left -= x;
  }
  if (plan.complete) {
    out[k_end] = left;
    return 0;
  }
  return left;
}

int split_count(int n, std::span<const double> shares, std::span<const double> u,
                std::span<int> out, bool complete) {
  return split_count(n, plan_split(shares, complete), u, out);
}

}  // namespace larder
