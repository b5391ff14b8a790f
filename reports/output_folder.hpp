#pragma once
// The output folder of a run (cli.md, "Output folder"): summary.json, metrics.csv,
// replications.csv, breakdown.csv, pairs.csv and substitution.csv, each written atomically so
// an interrupted run never leaves a half-written file under its final name.

#include <filesystem>

#include "sim/runner/run_result.hpp"

namespace larder {

/// Writes the files of the output folder into `dir`, creating it (and its parents) if needed;
/// replaces files of those names. Throws std::runtime_error naming the path and the reason when a
/// folder or file cannot be written.
void write_run_outputs(const RunResult& result, const std::filesystem::path& dir);

}  // namespace larder
