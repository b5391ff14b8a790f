#pragma once
// Reading a drill's decision file (`larder drill --decisions FILE`, the `replay` format of
// policies.md: `day,store,item,quantity`, day = the scenario day on which the order is placed).
// Rows of the drill store and items placed on a turn's order day are the trainee's decisions;
// rows placed before the drill are skipped (the warm-up is always the house rule's); every turn
// needs one row per drill item. Every problem is reported as file:line:col (InputError).
//
// The reader needs only the drill's scenario and its turns (not the simulated game), so the
// fuzz target of tests/fuzz/ runs it without the engine.

#include <cstddef>
#include <span>
#include <string>
#include <vector>

#include "sim/drill/drill_turns.hpp"

namespace larder {

struct Scenario;

/// What a decision file is read against: the drill's own scenario (with its `drill:` section)
/// and its turns (drill_turns).
struct DecisionFrame {
  const Scenario& scenario;
  std::span<const DrillTurn> turns;
};

/// The largest decision file read (a drill's file is a few kilobytes).
inline constexpr std::size_t kMaxDecisionFileBytes = std::size_t{16} << 20;

/// Parses CSV text named `file` into one decision per turn and drill item; throws InputError
/// with every problem found.
DrillDecisions parse_decisions(const DecisionFrame& frame, const std::string& text,
                               const std::string& file);

/// Reads a file (see parse_decisions) with the size cap, never more: a pipe or device is read
/// up to the cap only. An unreadable or larger file is an InputError too.
DrillDecisions read_decisions(const DecisionFrame& frame, const std::string& path);

}  // namespace larder
