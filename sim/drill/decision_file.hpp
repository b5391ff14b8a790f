#pragma once
// A drill's decisions as a CSV in the `replay` format of policies.md (`day,store,item,quantity`,
// day = the scenario day on which the order is placed): written after every session
// (decisions.csv) and read by `larder drill --decisions FILE` to score prepared decisions.
//
// Written: the house rule's orders of the warm-up, then the trainee's, for the drill items, so
// that the `replay` rule orders exactly what the drill's trainee store ordered. Read: rows of
// the drill store and items placed on a turn's order day are the trainee's decisions; rows
// placed before the drill are skipped (the warm-up is always the house rule's); every turn needs
// one row per drill item. Every problem is reported as file:line:col (InputError).

#include <cstddef>
#include <string>

#include "sim/drill/drill_game.hpp"

namespace larder {

/// The CSV text (header and rows, in order of day then the drill's item order).
std::string decisions_csv(const DrillGame& game, const DrillDecisions& decided);

/// Parses CSV text named `file` into one decision per turn and drill item; throws InputError
/// with every problem found.
DrillDecisions parse_decisions(const DrillGame& game, const std::string& text,
                               const std::string& file);

/// The largest decision file read (a drill's file is a few kilobytes).
inline constexpr std::size_t kMaxDecisionFileBytes = std::size_t{16} << 20;

/// Reads a file (see parse_decisions) with the size cap, never more: a pipe or device is read
/// up to the cap only. An unreadable or larger file is an InputError too.
DrillDecisions read_decisions(const DrillGame& game, const std::string& path);

}  // namespace larder
