#pragma once
// The scorecard of a drill as plain text (printed at the end of `larder drill`, and written
// as scorecard.txt): the totals of the trainee and every comparison policy, the trainee's
// difference against each, the day-by-day differences, and the habit readings with a plain
// reading of each.

#include <string>

#include "sim/drill/scorecard.hpp"

namespace larder {

std::string scorecard_text(const Scorecard& card);

/// One sentence per habit reading for people ("your orders ..."), shared by the text and HTML
/// pages.
std::vector<std::string> habit_sentences(const HabitReading& h);

}  // namespace larder
