#include "policies/quantity/item_chain.hpp"

#include <algorithm>
#include <cmath>
#include <limits>
#include <stdexcept>

#include "sim/engine/price_tiers.hpp"
#include "sim/stats/binomial.hpp"
#include "sim/stats/count_law.hpp"

namespace larder {

std::vector<double> truncated_pmf(DemandFamily family, double mean, double variance) {
  const CountLaw law = CountLaw::from_moments(family, std::max(mean, 0.0), variance);
  std::vector<double> pmf;
  double cdf = 0.0;
  for (int k = 0; k < 100000; ++k) {
    const double next = law.cdf(k);
    pmf.push_back(next - cdf);
    cdf = next;
    if (1.0 - cdf < 1e-10) break;
  }
  pmf.back() += 1.0 - cdf;
  return pmf;
}

bool ItemChain::fits(const ChainSpec& spec) {
  const int dims = spec.life - 1 + spec.lead - 1 + (spec.discount_tier ? 1 : 0);
  double states = std::pow(spec.cap + 1.0, dims);
  // The day's table holds every morning: the evening's parts times the arrival.
  double mornings = std::pow(spec.cap + 1.0, spec.life + (spec.discount_tier ? 1 : 0));
  // The day's table costs about mornings * demand counts * picking splits to build.
  const double work = mornings * static_cast<double>(spec.demand_pmf.size()) *
                      (spec.fifo_share > 0.0 && spec.fifo_share < 1.0 ? spec.cap / 2.0 : 1.0);
  return spec.life >= 1 && spec.lead >= 1 && spec.cap >= 1 && states <= kMaxChainStates &&
         mornings <= kMaxChainStates && work <= 2e7;
}

ItemChain::ItemChain(ChainSpec spec) : spec_(std::move(spec)) {
  if (!fits(spec_)) throw std::invalid_argument("item chain: state space too large");
  radix_ = spec_.cap + 1;
  part_dims_ = spec_.life - 1 + (spec_.discount_tier ? 1 : 0);
  dims_ = part_dims_ + spec_.lead - 1;
  for (int k = 0; k < part_dims_; ++k) parts_ *= radix_;
  for (int k = 0; k < spec_.lead - 1; ++k) pipe_count_ *= radix_;
  states_ = parts_ * pipe_count_;
  // Every morning: the evening stock of yesterday (a part) and today's arrival.
  mornings_.resize(static_cast<size_t>(parts_ * radix_));
  std::vector<int> part(static_cast<size_t>(std::max(part_dims_, 1)));
  std::vector<int> shelf(static_cast<size_t>(spec_.life));
  std::vector<double> scratch(static_cast<size_t>(parts_), 0.0);
  for (std::int64_t p = 0; p < parts_; ++p) {
    std::int64_t rest = p;
    for (int k = part_dims_ - 1; k >= 0; --k) {
      part[static_cast<size_t>(k)] = static_cast<int>(rest % radix_);
      rest /= radix_;
    }
    for (int a = 0; a + 1 < spec_.life; ++a)
      shelf[static_cast<size_t>(a)] = part[static_cast<size_t>(a)];
    const int discounted = spec_.discount_tier ? part[static_cast<size_t>(spec_.life - 1)] : 0;
    for (int arrival = 0; arrival <= spec_.cap; ++arrival) {
      shelf.back() = arrival;
      mornings_[static_cast<size_t>(p * radix_ + arrival)] =
          simulate_day(shelf, discounted, scratch);
    }
  }
}

ItemChain::Morning ItemChain::simulate_day(std::span<const int> shelf, int discounted,
                                           std::vector<double>& next) const {
  const ChainSpec& c = spec_;
  const size_t life = static_cast<size_t>(c.life);
  int full_total = 0;
  for (int x : shelf) full_total += x;
  std::vector<std::int32_t> touched;
  Morning m;
  std::vector<int> s(life);
  for (size_t d = 0; d < c.demand_pmf.size(); ++d) {
    const double pd = c.demand_pmf[d];
    if (pd <= 0.0) continue;
    const int demand = static_cast<int>(d);
    const bool tiers = c.discount_tier && discounted > 0;
    const std::vector<double> acceptors =
        tiers ? binomial_pmf(demand, c.take_rate) : std::vector<double>{1.0};
    for (size_t a = 0; a < acceptors.size(); ++a) {
      const double pa = pd * acceptors[a];
      if (pa <= 0.0) continue;
      const int accept = static_cast<int>(a);
      const TierTake t = take_tiers(accept, demand - accept, full_total, discounted);
      const int lost = demand - t.full - t.discounted;
      const double base_reward =
          c.price * t.full + c.discount_price * t.discounted - c.stockout_penalty * lost;
      // Oldest-first customers: Binomial(sold, fifo_share), deterministic at 0 and 1.
      const std::vector<double> split = binomial_pmf(t.full, c.fifo_share);
      for (size_t k = 0; k < split.size(); ++k) {
        const double pk = pa * split[k];
        if (pk <= 0.0) continue;
        std::copy(shelf.begin(), shelf.end(), s.begin());
        int need = static_cast<int>(k);
        for (size_t i = 0; i < life && need > 0; ++i) {
          const int take = std::min(need, s[i]);
          s[i] -= take;
          need -= take;
        }
        need = t.full - static_cast<int>(k);
        for (size_t i = life; i-- > 0 && need > 0;) {
          const int take = std::min(need, s[i]);
          s[i] -= take;
          need -= take;
        }
        const int leaving = s[0];
        double reward = base_reward;
        std::int64_t part = 0;
        for (size_t i = 1; i < life; ++i) part = part * radix_ + std::min(s[i], c.cap);
        if (c.discount_tier) {
          reward += c.leaving_value * (discounted - t.discounted);
          part = part * radix_ + std::min(leaving, c.cap);
        } else {
          reward += c.leaving_value * leaving;
        }
        m.reward += pk * reward;
        if (next[static_cast<size_t>(part)] == 0.0)
          touched.push_back(static_cast<std::int32_t>(part));
        next[static_cast<size_t>(part)] += pk;
      }
    }
  }
  std::sort(touched.begin(), touched.end());
  for (std::int32_t p : touched) {
    m.outcomes.push_back({p, next[static_cast<size_t>(p)]});
    next[static_cast<size_t>(p)] = 0.0;
  }
  return m;
}

std::int64_t ItemChain::index(std::span<const int> slots) const {
  std::int64_t s = 0;
  for (int k = 0; k < dims_; ++k) {
    s = s * radix_ + std::clamp(slots[static_cast<size_t>(k)], 0, spec_.cap);
  }
  return s;
}

void ItemChain::slots(std::int64_t s, std::span<int> out) const {
  for (int k = dims_ - 1; k >= 0; --k) {
    out[static_cast<size_t>(k)] = static_cast<int>(s % radix_);
    s /= radix_;
  }
}

double ItemChain::action_value(std::int64_t s, int order, std::span<const double> v) const {
  // s = part * pipe_count + pipe, the pipeline's first arrival most significant.
  const std::int64_t part = s / pipe_count_;
  const std::int64_t pipe = s % pipe_count_;
  int arrival = order;
  std::int64_t shifted = 0;
  if (spec_.lead > 1) {
    const std::int64_t high = pipe_count_ / radix_;
    arrival = static_cast<int>(pipe / high);
    shifted = (pipe % high) * radix_ + order;
  }
  const Morning& m = mornings_[static_cast<size_t>(part * radix_ + arrival)];
  double value = m.reward - spec_.unit_cost * order;
  for (const Outcome& o : m.outcomes) {
    value += o.probability * v[static_cast<size_t>(o.next * pipe_count_ + shifted)];
  }
  return value;
}

template <class Choose>
double ItemChain::iterate(Choose choose, double tol, int max_iterations,
                          std::vector<int>* chosen) const {
  const size_t n = static_cast<size_t>(states_);
  std::vector<double> v(n, 0.0);
  std::vector<double> next(n, 0.0);
  double gain = 0.0;
  for (int it = 0; it < max_iterations; ++it) {
    double low = std::numeric_limits<double>::infinity();
    double high = -low;
    for (size_t s = 0; s < n; ++s) {
      next[s] = choose(static_cast<std::int64_t>(s), v, chosen);
      low = std::min(low, next[s] - v[s]);
      high = std::max(high, next[s] - v[s]);
    }
    gain = 0.5 * (low + high);
    // Relative values against state 0 keep the iterates bounded.
    const double ref = next[0];
    for (size_t s = 0; s < n; ++s) v[s] = next[s] - ref;
    if (high - low < tol) break;
  }
  return gain;
}

ItemChain::Solution ItemChain::optimal(double tol, int max_iterations) const {
  Solution sol;
  sol.order.assign(static_cast<size_t>(states_), 0);
  const auto best = [&](std::int64_t s, std::span<const double> v, std::vector<int>* chosen) {
    double top = -std::numeric_limits<double>::infinity();
    int arg = 0;
    for (int q = 0; q <= spec_.cap; ++q) {
      const double x = action_value(s, q, v);
      if (x > top + 1e-12) {
        top = x;
        arg = q;
      }
    }
    (*chosen)[static_cast<size_t>(s)] = arg;
    return top;
  };
  sol.gain = iterate(best, tol, max_iterations, &sol.order);
  return sol;
}

double ItemChain::evaluate(const std::function<int(std::span<const int>)>& order, double tol,
                           int max_iterations) const {
  std::vector<int> fixed(static_cast<size_t>(states_));
  std::vector<int> slot(static_cast<size_t>(std::max(dims_, 1)));
  for (std::int64_t s = 0; s < states_; ++s) {
    slots(s, slot);
    fixed[static_cast<size_t>(s)] =
        std::clamp(order({slot.data(), static_cast<size_t>(dims_)}), 0, spec_.cap);
  }
  const auto given = [&](std::int64_t s, std::span<const double> v, std::vector<int>*) {
    return action_value(s, fixed[static_cast<size_t>(s)], v);
  };
  return iterate(given, tol, max_iterations, nullptr);
}

}  // namespace larder
