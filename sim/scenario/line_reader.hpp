#pragma once
// Lines of a text input read in blocks, for the streaming CSV readers: `\n` and `\r\n` ends, a
// UTF-8 byte order mark at the start dropped, and lines cut at a maximum length so that a
// binary file without line ends cannot make a reader hold all of it; an over-long line is
// skipped up to a bound and an optional total cap stops the reader (issue 23).

#include <cstddef>
#include <istream>
#include <string>
#include <vector>

namespace larder {

class LineReader {
 public:
  /// Longest line kept (bytes); longer lines are cut and flagged.
  static constexpr std::size_t kMaxLine = std::size_t{1} << 20;
  /// The most bytes of one over-long line skipped to find its end; past it the reader stops
  /// (a file without line ends, or /dev/zero, is not scanned without end).
  static constexpr std::size_t kMaxSkip = std::size_t{64} << 20;

  /// Reads `in`; `max_bytes` (0 = no limit) stops the reader once that many bytes were read
  /// (for readers that keep every row: item files, replay files).
  explicit LineReader(std::istream& in, std::size_t max_bytes = 0);
  /// The next line without its end in `line`; false at the end of the input. `too_long` is set
  /// when the line was longer than kMaxLine (its first kMaxLine bytes are kept).
  bool next(std::string& line, bool& too_long);
  /// 1-based number of the line last returned.
  int line_number() const { return line_number_; }
  /// Whether the reader stopped before the end of the input: an over-long line went on past
  /// kMaxSkip, or more than `max_bytes` were read. The caller reports it; next() returns false.
  bool stopped_early() const { return stopped_early_; }
  /// Whether it stopped because of `max_bytes`.
  bool over_size() const { return over_size_; }

 private:
  std::streambuf* buf_;
  std::vector<char> block_;
  std::size_t pos_ = 0;
  std::size_t end_ = 0;
  bool eof_ = false;
  int line_number_ = 0;
  std::size_t max_bytes_ = 0;
  std::size_t read_bytes_ = 0;
  bool stopped_early_ = false;
  bool over_size_ = false;
};

}  // namespace larder
