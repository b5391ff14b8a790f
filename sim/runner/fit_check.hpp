#pragma once
// `larder fit --check` (the table is printed by cli/fit_command.cpp): the fitted scenario replays
// the history's own deliveries over many replications, and each item's sales per store-day and
// share of sold-out days in the history are set against the range the fitted scenario gives them
// (README, "Fitting a history").

#include <string>
#include <vector>

#include "sim/fit/scenario_writer.hpp"

namespace larder {

/// One item's statistic: the history's value and the fitted scenario's replications.
struct CheckStatistic {
  double history = 0.0;
  std::vector<double> replicated;  ///< one value per replication
  double low = 0.0, high = 0.0;    ///< 2.5% and 97.5% points of `replicated`
  double mean = 0.0, sd = 0.0;     ///< of `replicated`
  bool inside() const { return history >= low && history <= high; }
};

struct ItemCheck {
  std::string item;
  int store_days = 0;
  CheckStatistic sales;     ///< units sold per store-day
  CheckStatistic sold_out;  ///< share of store-days that sold out
};

/// Replays the history's deliveries (`replay_orders_csv`) on the fitted scenario `replications`
/// times (replications 0, 1, ... of seed 1) on `threads` threads (0 = all), over the fitted
/// stores and items and the store-item-days the history holds. `base` gives the name and
/// prices. Throws InputError when the check scenario does not load.
std::vector<ItemCheck> check_fit(const FitResult& r, const WriteOptions& base, int replications,
                                 int threads);

}  // namespace larder
