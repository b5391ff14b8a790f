#pragma once
// Compiler-style problem reports for bad input: every problem is collected (not just the
// first) and printed as `file:line:col: error: message`, optionally followed by a hint line.

#include <cstddef>
#include <string>
#include <vector>

namespace larder {

/// A place in an input file; line and column are 1-based (0 = unknown).
struct Location {
  std::string file;
  int line = 0;
  int column = 0;
};

/// One problem found in an input file.
struct Diagnostic {
  Location where;
  std::string message;
  std::string hint;  ///< optional second line (`  hint: ...`)
};

/// Collects the problems of one input so they can be reported at once: the first kMaxKept in
/// full, the others only counted, so that a file of a million bad lines (or an endless pipe)
/// never makes the report grow without bound.
class Diagnostics {
 public:
  /// Problems kept in full; format() ends with one line counting the others.
  static constexpr std::size_t kMaxKept = 100;

  void error(Location where, std::string message, std::string hint = {});
  /// The problem that made a reader stop (a size cap, a line without an end): kept even past
  /// kMaxKept, so that the report always says why the input was not read to its end.
  void final_error(Location where, std::string message, std::string hint = {});
  bool ok() const { return items_.empty(); }
  /// The problems kept (at most kMaxKept, and a final_error).
  const std::vector<Diagnostic>& items() const { return items_; }
  /// Problems found beyond kMaxKept (counted, not kept).
  std::size_t dropped() const { return dropped_; }
  /// Counts the problems `other` dropped as dropped here too (after copying its items()).
  void count_dropped(const Diagnostics& other);
  /// All problems kept, one per line (plus hint lines), in the order found, with
  /// `file: error: ... and N more problems` after the first kMaxKept when some were dropped.
  std::string format() const;

 private:
  std::vector<Diagnostic> items_;
  std::size_t dropped_ = 0;
  std::string dropped_file_;  ///< the file of the last problem dropped
};

/// Formats one problem as `file:line:col: error: message` (+ `\n  hint: ...`).
std::string format_diagnostic(const Diagnostic& d);

/// Thrown when input is invalid; carries every problem found.
class InputError : public std::exception {
 public:
  explicit InputError(Diagnostics d);
  const char* what() const noexcept override { return text_.c_str(); }
  const Diagnostics& diagnostics() const { return diagnostics_; }

 private:
  Diagnostics diagnostics_;
  std::string text_;
};

}  // namespace larder
