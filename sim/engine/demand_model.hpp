#pragma once
// The true demand of every store-item-day (model.md, Demand): the mean
// base(i) * size(s) * weekday(i, wd(t)) * event(t) and the count's law. Counts are drawn by
// inversion of a uniform, so the same uniform always gives the same (or a monotonically
// shifted) count: the basis of common random numbers.

#include <vector>

#include "sim/scenario/scenario.hpp"
#include "sim/stats/count_law.hpp"
#include "sim/stats/inversion_table.hpp"

namespace larder {

class DemandModel {
 public:
  explicit DemandModel(const Scenario& scenario);

  /// Mean demand of store-item on `day` (0 when the store is closed).
  double mean(int store, int item, int day) const;
  /// The law of the demand count of store-item on `day`.
  CountLaw law(int store, int item, int day) const;
  /// The law on an open day of `weekday` without events (the planner's prior in policies.md).
  CountLaw weekday_law(int store, int item, int weekday) const;
  /// The count for uniform `u` (0 on closed days). Fast when no event touches the day.
  int sample(int store, int item, int day, double u) const;
  /// The draw tables of every item of a store on `day`, contiguous by item, when the day is
  /// open and no event touches it (the fast path); nullptr otherwise.
  const InversionTable* plain_tables(int store, int day) const;
  /// The law of an item's count when its day's mean is `mean` (shocks and goodwill multiply
  /// the scenario's mean).
  CountLaw law_with_mean(int item, double mean) const;
  /// Bytes held per store-item on average (weekday means and draw tables).
  std::size_t bytes_per_store_item() const;

 private:
  std::size_t index(int store, int item, int weekday) const;

  const Scenario* scenario_;
  std::vector<double> weekday_mean_;      ///< [store][weekday][item]
  std::vector<InversionTable> tables_;    ///< [store][weekday][item]
  std::vector<unsigned char> plain_day_;  ///< [store][day]: 1 = open, no event multiplier
  std::vector<unsigned char> open_day_;   ///< [store][day]
  std::vector<double> event_factor_;      ///< [store][day]
};

}  // namespace larder
