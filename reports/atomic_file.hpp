#pragma once
// Writing result files so that a reader (or an interrupted run) never sees a half-written file
// under its final name: the content goes to a temporary file in the same folder, is flushed to
// disk, and is then renamed over the final name (cli.md, "Output folder").

#include <filesystem>
#include <string_view>

namespace larder {

/// Writes `content` to `path` atomically: either the old file (or no file) or the whole new file
/// is visible under `path`, never a part. The parent folder must exist. On failure the temporary
/// file is removed and std::runtime_error names the path and the reason.
void write_file_atomically(const std::filesystem::path& path, std::string_view content);

/// Creates `dir` and any missing parents; does nothing if it is already a folder. Throws
/// std::runtime_error naming the path and the reason if it cannot be created or is not a folder.
void ensure_directory(const std::filesystem::path& dir);

}  // namespace larder
