#pragma once
// A sample store-item day by day, for people to see what a policy does (report.html): in
// replication 0, at the first store, the item with the largest base demand, every policy's
// demand, delivery, sales, stock left at close and units leaving unsold over the first weeks.
// The days are those of the run itself (the same seed and streams), warm-up included.

#include <span>
#include <string>
#include <vector>

#include "policies/policy.hpp"

namespace larder {

/// One policy's day at the traced store-item (the Observation of that day, plus demand).
struct TraceDay {
  int demand = 0;     ///< primary customers (0 on closed days)
  int delivered = 0;  ///< units delivered in the morning
  int sold = 0;       ///< units sold at any price
  int leftover = 0;   ///< sellable units on the shelf at close
  int wasted = 0;     ///< units discarded at close
  int salvaged = 0;   ///< units sent to salvage at close
  int donated = 0;    ///< units donated at close
  bool open = false;
  /// Units that left the shelf unsold: wasted, salvaged or donated.
  int unsold_out() const { return wasted + salvaged + donated; }
};

struct PolicyTrace {
  std::string policy;
  std::vector<TraceDay> days;  ///< day 0, 1, ...
};

struct DailyTrace {
  int replication = 0;
  std::string store;
  std::string item;
  int warmup_days = 0;                ///< days before this index are not scored
  std::vector<PolicyTrace> traces;    ///< the policies that can run alone, in policy order
  std::vector<std::string> left_out;  ///< network-planned policies (they need every store)
};

/// The item with the largest base demand (the first of equals).
int traced_item(const Scenario& scenario);

/// Runs store 0 of `replication` for the first min(max_days, horizon) days with every policy
/// and records the traced item. Policies whose quantity rule is planned across the network
/// are not recorded: their levels come from every store's forecasts, which one store run does
/// not have (they run with their target level and are listed in `left_out`).
DailyTrace daily_trace(const Scenario& scenario, std::span<const Policy> policies,
                       int replication = 0, int max_days = 42);

}  // namespace larder
