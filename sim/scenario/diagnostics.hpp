#pragma once
// Compiler-style problem reports for bad input: every problem is collected (not just the
// first) and printed as `file:line:col: error: message`, optionally followed by a hint line.

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

/// Collects every problem of one input so they can be reported at once.
class Diagnostics {
 public:
  void error(Location where, std::string message, std::string hint = {});
  bool ok() const { return items_.empty(); }
  const std::vector<Diagnostic>& items() const { return items_; }
  /// All problems, one per line (plus hint lines), in the order found.
  std::string format() const;

 private:
  std::vector<Diagnostic> items_;
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
