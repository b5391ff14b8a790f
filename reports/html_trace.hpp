#pragma once
// The section of report.html that follows one store-item day by day (sim/runner/daily_trace):
// per policy a line chart of demand, deliveries, sales, stock left at close and units leaving
// unsold, the totals, and the days as a collapsed table.

#include <string>

#include "sim/runner/daily_trace.hpp"

namespace larder {

/// The section; says which policies could not be traced and why. Empty when `trace` has
/// neither traced nor left-out policies.
std::string html_trace_section(const DailyTrace& trace);

}  // namespace larder
