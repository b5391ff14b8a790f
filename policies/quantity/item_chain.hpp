#pragma once
// The exact Markov decision process of one store-item with daily orders (model.md, one day of
// one store): stock by remaining life, units on order, and the discounted tier (next-day
// discount) as the state; one order a day arriving `lead` days later; Poisson, negative binomial
// or normal demand with FIFO/LIFO picking (Binomial(sold, fifo_share) from the oldest end) and
// the tier rule of price_tiers.hpp. Solved for the largest long-run profit per day by relative
// value iteration (Puterman, Markov Decision Processes, 1994, section 8.5.5; the perishable
// model as in Hendrix, Ortega, Haijema, Buisman and Garcia 2019, "On computing optimal policies
// in perishable inventory control using value iteration", Computational and Mathematical
// Methods 1(4) e1027), or evaluated for a given ordering rule.
//
// Small systems only: the state space is (cap + 1)^(life - 1 + lead - 1 [+ 1 with a discounted
// tier]); `fits` says whether it is within kMaxChainStates.

#include <cstdint>
#include <functional>
#include <span>
#include <vector>

#include "sim/scenario/scenario.hpp"

namespace larder {

/// Everything the chain needs of one item at one demand level.
struct ChainSpec {
  int life = 1;             ///< shelf life in days
  int lead = 1;             ///< days from order to arrival (1: tomorrow morning)
  double fifo_share = 1.0;  ///< share of full-price units taken from the oldest end
  /// P(D = k) for k = 0..K, the tail folded into the last entry.
  std::vector<double> demand_pmf;
  double price = 0.0;
  double unit_cost = 0.0;         ///< charged per unit ordered
  double stockout_penalty = 0.0;  ///< per customer who leaves without buying
  /// Value of a unit leaving at the end of its life (salvage value, 0 when donated, minus the
  /// disposal cost when discarded); with a discounted tier, units on their last day move to the
  /// tier instead and this applies to the tier's unsold units.
  double leaving_value = 0.0;
  bool discount_tier = false;  ///< next-day discount: last-day leftovers sell one more day
  double discount_price = 0.0;
  double take_rate = 0.0;  ///< share of customers who take a discounted unit when one is shown
  int cap = 0;             ///< largest order, and largest count per state slot

  bool operator==(const ChainSpec&) const = default;
};

/// The largest state space the chain is built for.
inline constexpr std::int64_t kMaxChainStates = 20000;

/// State: stock slots a = 0..life-2 (units sellable for a + 1 more days from tomorrow), then the
/// discounted units shown tomorrow (with a discounted tier), then units arriving on days
/// 1..lead-1 after the order day, each in 0..cap.
class ItemChain {
 public:
  /// Builds the day's transition tables. Requires fits(spec).
  explicit ItemChain(ChainSpec spec);

  /// Whether the state space is small enough to build.
  static bool fits(const ChainSpec& spec);
  /// Number of states.
  std::int64_t states() const { return states_; }
  /// Index of a state given as its slots (clipped to the cap).
  std::int64_t index(std::span<const int> slots) const;
  /// The slots of state `s`.
  void slots(std::int64_t s, std::span<int> out) const;
  /// Slots per state: life - 1 [+ 1] + lead - 1.
  int dims() const { return dims_; }

  struct Solution {
    double gain = 0.0;       ///< long-run profit per day
    std::vector<int> order;  ///< best order per state
  };
  /// The optimal policy by relative value iteration (span of the gain bounds below `tol`).
  Solution optimal(double tol = 1e-7, int max_iterations = 5000) const;
  /// Long-run profit per day of the rule `order(slots)` (policy evaluation by the same
  /// iteration).
  double evaluate(const std::function<int(std::span<const int>)>& order, double tol = 1e-7,
                  int max_iterations = 5000) const;

 private:
  struct Outcome {
    std::int32_t next;  ///< index of (evening stock, discounted units) among the parts
    double probability;
  };
  /// The morning's stock (shelf by age with today's arrival, discounted units): expected reward
  /// of the day and the distribution of the evening's parts.
  struct Morning {
    double reward = 0.0;
    std::vector<Outcome> outcomes;
  };
  /// `next` is scratch of parts_ zeros, returned zeroed.
  Morning simulate_day(std::span<const int> shelf, int discounted, std::vector<double>& next) const;
  std::int64_t morning_index(std::span<const int> slots, int arrival) const;
  /// Value of taking `order` in state `s`, given the current relative values.
  double action_value(std::int64_t s, int order, std::span<const double> v) const;
  template <class Choose>
  double iterate(Choose choose, double tol, int max_iterations, std::vector<int>* chosen) const;

  ChainSpec spec_;
  int radix_ = 1;
  int part_dims_ = 0;  ///< life - 1 [+ 1]
  int dims_ = 0;
  std::int64_t parts_ = 1;       ///< (evening stock, discounted) combinations
  std::int64_t pipe_count_ = 1;  ///< radix^(lead - 1)
  std::int64_t states_ = 1;
  std::vector<Morning> mornings_;  ///< by (part, arrival)
};

/// P(D = k), k = 0..K, of the count law with this mean and variance (CountLaw::from_moments),
/// with K the smallest count whose upper tail is below 1e-10, the tail folded into P(D = K).
std::vector<double> truncated_pmf(DemandFamily family, double mean, double variance);

}  // namespace larder
