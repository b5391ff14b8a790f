#include "sim/scenario/line_reader.hpp"

#include <cstring>

namespace larder {

LineReader::LineReader(std::istream& in, std::size_t max_bytes)
    : buf_(in.rdbuf()), block_(std::size_t{1} << 16), max_bytes_(max_bytes) {
  eof_ = buf_ == nullptr;
}

bool LineReader::next(std::string& line, bool& too_long) {
  line.clear();
  too_long = false;
  bool any = false;
  std::size_t skipped = 0;
  if (stopped_early_) return false;
  while (true) {
    if (pos_ == end_) {
      if (eof_) break;
      if (max_bytes_ > 0 && read_bytes_ >= max_bytes_) {
        stopped_early_ = over_size_ = eof_ = true;
        line.clear();  // a line cut by the cap is not a line
        return false;
      }
      if (too_long && skipped > kMaxSkip) {
        stopped_early_ = eof_ = true;
        break;
      }
      const std::streamsize got =
          buf_->sgetn(block_.data(), static_cast<std::streamsize>(block_.size()));
      pos_ = 0;
      end_ = got > 0 ? static_cast<std::size_t>(got) : 0;
      read_bytes_ += end_;
      if (end_ == 0) {
        eof_ = true;
        break;
      }
    }
    any = true;
    const char* start = block_.data() + pos_;
    const void* nl = std::memchr(start, '\n', end_ - pos_);
    const std::size_t len = nl != nullptr
                                ? static_cast<std::size_t>(static_cast<const char*>(nl) - start)
                                : end_ - pos_;
    if (!too_long) {
      const std::size_t room = kMaxLine - line.size();
      if (len > room) {
        line.append(start, room);
        too_long = true;
      } else {
        line.append(start, len);
      }
    } else {
      skipped += len;
    }
    pos_ += len;
    if (nl != nullptr) {
      ++pos_;
      break;
    }
  }
  if (!any) return false;
  ++line_number_;
  if (!line.empty() && line.back() == '\r') line.pop_back();
  if (line_number_ == 1 && line.rfind("\xEF\xBB\xBF", 0) == 0) line.erase(0, 3);
  return true;
}

}  // namespace larder
