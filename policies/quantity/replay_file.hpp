#pragma once
// The order file of the `replay` quantity rule (policies/quantity/replay.cpp): a CSV with a
// header and one row per order, columns store,item,quantity and either day or date. Parsing is
// strict; every bad row is reported as file:line:column. A function of the text and the scenario
// only, so the fuzz target and tests call it without files.

#include <cstddef>
#include <istream>
#include <optional>
#include <string>
#include <vector>

#include "sim/scenario/diagnostics.hpp"
#include "sim/scenario/scenario.hpp"

namespace larder {

/// One order of a replay file: `quantity` units of item index `item`, placed on scenario `day`.
struct ReplayOrder {
  int day = 0;
  int item = 0;
  int quantity = 0;
  friend bool operator<(const ReplayOrder& a, const ReplayOrder& b) {
    return a.day != b.day ? a.day < b.day : a.item < b.item;
  }
};

/// Orders per store (scenario store index), each sorted by day and item.
using ReplayOrders = std::vector<std::vector<ReplayOrder>>;

/// The largest order file read (its orders are kept): about 10 million orders.
inline constexpr std::size_t kMaxReplayFileBytes = std::size_t{256} << 20;

/// Reads a whole order file from `in` (called `name` in messages) against the scenario's store
/// and item ids, horizon, calendar and logistics. Every problem goes to `diag`; nullopt when
/// there was any.
std::optional<ReplayOrders> parse_replay_orders(std::istream& in, const std::string& name,
                                                const Scenario& sc, Diagnostics& diag);

}  // namespace larder
