#pragma once
// Writing result files so that a reader (or an interrupted run) never sees a half-written file
// under its final name: the content goes to a temporary file in the same folder, is flushed to
// disk, and is then renamed over the final name (cli.md, "Output folder").

#include <filesystem>
#include <string>
#include <string_view>

namespace larder {

/// Writes `content` to `path` atomically: either the old file (or no file) or the whole new file
/// is visible under `path`, never a part. The parent folder must exist. On failure the temporary
/// file is removed and std::runtime_error names the path and the reason.
void write_file_atomically(const std::filesystem::path& path, std::string_view content);

/// Whether `name` is a temporary file of a larder writer (`.<file>.tmp-<pid>-<n>` or a staging
/// folder `.<folder>.staging-<pid>-...`) whose process no longer runs: what a crash (kill -9,
/// power loss) left behind. `stem` non-empty: only temporaries of that final name.
bool is_stale_temporary(std::string_view name, std::string_view stem = {});

/// Removes the stale temporary files (not folders) in `dir` (see is_stale_temporary); errors are
/// ignored, as the files are only clutter.
void remove_stale_temporaries(const std::filesystem::path& dir, std::string_view stem = {});

/// Creates `dir` and any missing parents; does nothing if it is already a folder. Throws
/// std::runtime_error naming the path and the reason if it cannot be created or is not a folder.
void ensure_directory(const std::filesystem::path& dir);

/// A file written piece by piece that appears under its final name only at `commit`: the
/// content goes to a temporary file in the same folder (removed when the writer is destroyed
/// without committing), so a large output streams without being held in memory and a reader
/// never sees part of it. Errors throw std::runtime_error naming the path and the reason.
class AtomicFileWriter {
 public:
  /// Creates the temporary file next to `path` (whose folder must exist).
  explicit AtomicFileWriter(std::filesystem::path path);
  ~AtomicFileWriter();
  AtomicFileWriter(const AtomicFileWriter&) = delete;
  AtomicFileWriter& operator=(const AtomicFileWriter&) = delete;

  /// Appends `text` (buffered).
  void write(std::string_view text);
  /// Writes what is buffered, flushes it to disk and renames the file to its final name.
  void commit();

 private:
  void drain();

  std::filesystem::path path_;
  std::filesystem::path tmp_;
  int fd_ = -1;
  std::string buffer_;
  bool committed_ = false;
};

}  // namespace larder
