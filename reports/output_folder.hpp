#pragma once
// The output folder of a run (cli.md, "Output folder"): summary.json, metrics.csv,
// replications.csv, breakdown.csv, pairs.csv, substitution.csv and report.html, published as
// one set (result_set.hpp) so a reader never finds files of two runs side by side.

#include <filesystem>
#include <string>
#include <vector>

#include "reports/result_set.hpp"
#include "sim/runner/run_result.hpp"

namespace larder {

/// The names of every file a run's result set may hold.
std::vector<std::string> run_output_names();

/// Publishes the files of the output folder into `dir` (created with its parents if needed) as
/// one set with `extra` (report.html); files of those names a run may write but this one does
/// not (pairs.csv, substitution.csv, report.html) leave the folder. Throws std::runtime_error
/// naming the path and the reason; the folder then holds the earlier set whole.
void write_run_outputs(const RunResult& result, const std::filesystem::path& dir,
                       std::vector<ResultFile> extra = {});

}  // namespace larder
