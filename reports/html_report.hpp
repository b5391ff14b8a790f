#pragma once
// report.html (cli.md, "Output folder"): one self-contained page (inline CSS and SVG, no
// scripts, no URLs) for people who would rather look than read CSV files. It says what was
// simulated and how to rerun it, compares the policies (means with 95% intervals, paired
// verdicts against the baseline, bar charts, a waste-versus-in-stock scatter), breaks the
// results down by store, item and item attribute (the numbers of breakdown.csv), compares
// planned and achieved levels of network plans, shows waste in kg and CO2e, substitution
// flows and a sample store-item day by day, and states the cautions.

#include <string>

#include "reports/report_context.hpp"
#include "sim/runner/run_result.hpp"

namespace larder {

/// The whole page.
std::string html_report(const RunResult& result, const ReportContext& context);

}  // namespace larder
