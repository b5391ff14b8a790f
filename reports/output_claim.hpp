#pragma once
// Whose folder is it? `larder run`, `sweep` and `merge` write into an output folder and replace
// files there. So that a mistyped `--out` never overwrites someone's documents, larder only
// writes into a folder that is missing, empty, or already holds a larder result (the marker
// file below, written by every command that writes results, or an older larder
// `summary.json`), unless `--force` is given.

#include <filesystem>
#include <string_view>

namespace larder {

/// The marker file larder writes into every output folder it claims.
inline constexpr std::string_view kOutputMarker = ".larder-output";

/// Whether `dir` (an existing folder) holds a result larder wrote: the marker, or a
/// summary.json carrying `larder_version`.
bool holds_larder_result(const std::filesystem::path& dir);

/// Makes `dir` ready for results: creates it and its parents when missing (std::runtime_error
/// naming the path when that fails: exit code 1). Throws InputError (exit code 2) when `dir`
/// is a file, or a folder that is not empty and holds no larder result and `force` is false.
/// Refuses a symbolic link (InputError). Finishes or removes what a crashed run left there
/// (result_set.hpp), writes the marker and checks a file can be created in it
/// (check_writable), so a read-only folder is found before the work, not after.
void claim_output_folder(const std::filesystem::path& dir, bool force);

/// Creates and removes a file in `dir`; throws std::runtime_error naming `dir` and the reason
/// (no permission, read-only or immutable, full) when that fails: exit code 1.
void check_writable(const std::filesystem::path& dir);

}  // namespace larder
