#pragma once
// The turns of a drill: one order per drill day on which a delivery arrives at the drill store
// (open and a delivery weekday), placed lead-time days earlier. Shared by the game and by the
// reader of decision files, which needs nothing else of the game; and the decisions, one per
// turn and drill item.

#include <vector>

namespace larder {

struct Scenario;

/// One order the trainee places: after the close of `order_day`, delivered on `arrival_day`.
struct DrillTurn {
  int order_day = 0;
  int arrival_day = 0;
  int drill_day = 1;  ///< of the arrival: 1 = the first drill day
};

/// The trainee's orders, [turn][k] for the drill's k-th item (units, before pack rounding).
using DrillDecisions = std::vector<std::vector<int>>;

/// The turns of `s`'s drill, in day order, over the scored days from the warm-up's end to the
/// horizon's (the drill's own scenario: `horizon.days` is the warm-up plus the drill days).
/// `s` must have a `drill:` section.
std::vector<DrillTurn> drill_turns(const Scenario& s);

}  // namespace larder
