#pragma once
// Reading a whole input file with a size cap decided before anything is allocated: at most
// `cap + 1` bytes are ever read, in blocks, so a pipe, a device (/dev/zero) or a file that grows
// cannot make larder hold more than the cap (README, "Limits"). For the readers that parse a
// whole text: scenarios, decision files, shard files, scorecards.

#include <cstddef>
#include <optional>
#include <string>

namespace larder {

/// What reading a file gave.
struct BoundedText {
  std::string text;        ///< the content (empty unless `ok()`)
  bool too_large = false;  ///< the file holds more than the cap
  std::string problem;     ///< why it could not be read ("" = read, or too large)
  bool ok() const { return !too_large && problem.empty(); }
};

/// Reads `path` (a file, FIFO or device; not a folder) up to `cap` bytes.
BoundedText read_bounded(const std::string& path, std::size_t cap);

/// "16 MiB", "512 KiB" or "100 bytes": a cap in words for messages.
std::string size_in_words(std::size_t bytes);

}  // namespace larder
