#pragma once
// Lines of a text input read in blocks, for the streaming CSV readers: `\n` and `\r\n` ends, a
// UTF-8 byte order mark at the start dropped, and lines cut at a maximum length so that a
// binary file without line ends cannot make a reader hold all of it.

#include <cstddef>
#include <istream>
#include <string>
#include <vector>

namespace larder {

class LineReader {
 public:
  /// Longest line kept (bytes); longer lines are cut and flagged.
  static constexpr std::size_t kMaxLine = std::size_t{1} << 20;

  explicit LineReader(std::istream& in);
  /// The next line without its end in `line`; false at the end of the input. `too_long` is set
  /// when the line was longer than kMaxLine (its first kMaxLine bytes are kept).
  bool next(std::string& line, bool& too_long);
  /// 1-based number of the line last returned.
  int line_number() const { return line_number_; }

 private:
  std::streambuf* buf_;
  std::vector<char> block_;
  std::size_t pos_ = 0;
  std::size_t end_ = 0;
  bool eof_ = false;
  int line_number_ = 0;
};

}  // namespace larder
