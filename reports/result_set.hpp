#pragma once
// A folder of results is always one run's (README, "Output safety"). The files of a result set
// are written into a staging folder beside the output folder, which then takes the output
// folder's place in one step (Linux renameat2 RENAME_EXCHANGE); what else the old folder held
// (other commands' results, `partial/`, the marker) is carried over, so a reader, a full disk
// or a `kill -9` at any moment finds the earlier complete set or the new one, never a mix.
// Each published folder holds `.larder-run`: the run's id, the staging folder it came from,
// and the names of the set, so that the next writer can finish or discard what a crashed one
// left (stale staging folders and temporary files are removed).
//
// Where the folder cannot be swapped (it is the working folder or holds it, a mount point, a
// file system without RENAME_EXCHANGE, or its parent is not writable) the files are replaced
// one by one, each whole (write_file_atomically).

#include <filesystem>
#include <string>
#include <vector>

namespace larder {

/// One file of a result set: its name in the output folder and its whole content.
struct ResultFile {
  std::string name;
  std::string content;
};

/// The record larder keeps in every folder it published.
inline constexpr std::string_view kRunRecord = ".larder-run";

/// Replaces the result set in `dir` by `files` in one step, creating `dir` (and its parents)
/// when missing. Files named in `retired` (results of the same kind this run does not have)
/// are left out of the new folder; everything else the folder held is kept. Throws
/// std::runtime_error naming the path and the reason; then the folder is as it was.
void publish_result_set(const std::filesystem::path& dir, const std::vector<ResultFile>& files,
                        const std::vector<std::string>& retired);

/// Finishes or discards what crashed writers left at `dir`: staging folders beside it (and
/// inside it) whose process is gone, and their temporary files inside it. Safe to call on a
/// folder that does not exist.
void recover_result_folder(const std::filesystem::path& dir);

}  // namespace larder
