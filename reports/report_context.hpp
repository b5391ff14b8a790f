#pragma once
// What report.html shows beyond a RunResult: lines describing the network and horizon of the
// scenario, the cautions every report states, and (optionally) a sample store-item day by day.

#include <optional>
#include <string>
#include <vector>

#include "sim/runner/daily_trace.hpp"
#include "sim/scenario/scenario.hpp"

namespace larder {

struct ReportContext {
  std::vector<std::string> scenario_lines;  ///< stores, items, horizon, deliveries
  std::vector<std::string> cautions;        ///< one paragraph each
  std::optional<DailyTrace> trace;          ///< a sample store-item over the first weeks
};

/// The cautions of every report: food-safety law and use-by dates decide shelf lives, next-day
/// sale and donation; results are model estimates, not guarantees.
std::vector<std::string> report_cautions();

/// One line each about the stores, the items, the horizon and the deliveries of `scenario`.
std::vector<std::string> scenario_lines(const Scenario& scenario);

/// The context of a run of `scenario`: its lines, the cautions and `trace`.
ReportContext report_context(const Scenario& scenario, std::optional<DailyTrace> trace);

}  // namespace larder
