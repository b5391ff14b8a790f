#pragma once
// The decision summary at the top of report.html: per policy against the baseline, one sentence
// in plain words and a table of the changes per year in tonnes wasted, tonnes of CO2e, customers
// lost and profit with their paired 95% intervals (decision.hpp), and a chart of each policy's
// CO2e (or waste) per year against its fill rate, the baseline ringed.

#include <string>

#include "sim/runner/run_result.hpp"

namespace larder {

/// The section (empty when the run has no policy besides the baseline).
std::string html_decision_section(const RunResult& result);

}  // namespace larder
