#include "sim/scenario/diagnostics.hpp"

#include <fmt/format.h>

#include <string_view>

namespace larder {

void Diagnostics::error(Location where, std::string message, std::string hint) {
  if (items_.size() >= kMaxKept) {
    ++dropped_;
    dropped_file_ = std::move(where.file);
    return;
  }
  items_.push_back({std::move(where), std::move(message), std::move(hint)});
}

void Diagnostics::final_error(Location where, std::string message, std::string hint) {
  items_.push_back({std::move(where), std::move(message), std::move(hint)});
}

void Diagnostics::count_dropped(const Diagnostics& other) {
  if (other.dropped_ == 0) return;
  dropped_ += other.dropped_;
  dropped_file_ = other.dropped_file_;
}

namespace {

/// Control characters (a NUL in an id, an escape sequence) shown as \xNN, so a message is one
/// visible line and a NUL never cuts it short.
std::string printable(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  for (const char c : text) {
    const auto b = static_cast<unsigned char>(c);
    if (b < 0x20 || b == 0x7F) {
      out += fmt::format("\\x{:02X}", b);
    } else {
      out += c;
    }
  }
  return out;
}

}  // namespace

std::string format_diagnostic(const Diagnostic& d) {
  std::string out;
  const std::string message = printable(d.message);
  const std::string file = printable(d.where.file);
  if (d.where.line > 0) {
    out = fmt::format("{}:{}:{}: error: {}", file, d.where.line, d.where.column, message);
  } else {
    out = fmt::format("{}: error: {}", file, message);
  }
  if (!d.hint.empty()) out += fmt::format("\n  hint: {}", printable(d.hint));
  return out;
}

std::string Diagnostics::format() const {
  std::string out;
  const auto count_line = [&] {
    Diagnostic more;
    more.where.file = dropped_file_;
    more.message = fmt::format("... and {} more problems", dropped_);
    out += format_diagnostic(more);
    out += '\n';
  };
  for (std::size_t k = 0; k < items_.size(); ++k) {
    if (k == kMaxKept && dropped_ > 0) count_line();
    out += format_diagnostic(items_[k]);
    out += '\n';
  }
  if (dropped_ > 0 && items_.size() <= kMaxKept) count_line();
  return out;
}

InputError::InputError(Diagnostics d) : diagnostics_(std::move(d)), text_(diagnostics_.format()) {}

}  // namespace larder
