#pragma once
// scorecard.html: a drill's scorecard as one self-contained page (html_page: inline CSS and
// SVG, no scripts, nothing fetched): the totals of the trainee and each comparison policy, the
// differences, the cumulative profit difference day by day as a line chart, the day-by-day
// table, and the habit readings with plain sentences.

#include <string>

#include "sim/drill/scorecard.hpp"

namespace larder {

std::string scorecard_html(const Scorecard& card);

}  // namespace larder
