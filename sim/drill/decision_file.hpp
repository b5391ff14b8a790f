#pragma once
// A drill's decisions as a CSV in the `replay` format of policies.md (`day,store,item,quantity`,
// day = the scenario day on which the order is placed): written after every session
// (decisions.csv) and read by `larder drill --decisions FILE` to score prepared decisions.
//
// Written: the house rule's orders of the warm-up, then the trainee's, for the drill items, so
// that the `replay` rule orders exactly what the drill's trainee store ordered. Read by
// decision_reader.hpp (the wrappers below read against a game).

#include <string>

#include "sim/drill/decision_reader.hpp"
#include "sim/drill/drill_game.hpp"

namespace larder {

/// The CSV text (header and rows, in order of day then the drill's item order).
std::string decisions_csv(const DrillGame& game, const DrillDecisions& decided);

/// Parses CSV text named `file` (decision_reader.hpp) against the game's scenario and turns.
inline DrillDecisions parse_decisions(const DrillGame& game, const std::string& text,
                                      const std::string& file) {
  return parse_decisions(DecisionFrame{game.scenario(), game.turns()}, text, file);
}

/// Reads a decision file with its size cap (decision_reader.hpp).
inline DrillDecisions read_decisions(const DrillGame& game, const std::string& path) {
  return read_decisions(DecisionFrame{game.scenario(), game.turns()}, path);
}

}  // namespace larder
