#include "sim/scenario/diagnostics.hpp"

#include <fmt/format.h>

namespace larder {

void Diagnostics::error(Location where, std::string message, std::string hint) {
  items_.push_back({std::move(where), std::move(message), std::move(hint)});
}

std::string format_diagnostic(const Diagnostic& d) {
  std::string out;
  if (d.where.line > 0) {
    out = fmt::format("{}:{}:{}: error: {}", d.where.file, d.where.line, d.where.column, d.message);
  } else {
    out = fmt::format("{}: error: {}", d.where.file, d.message);
  }
  if (!d.hint.empty()) out += fmt::format("\n  hint: {}", d.hint);
  return out;
}

std::string Diagnostics::format() const {
  std::string out;
  for (const auto& d : items_) {
    out += format_diagnostic(d);
    out += '\n';
  }
  return out;
}

InputError::InputError(Diagnostics d) : diagnostics_(std::move(d)), text_(diagnostics_.format()) {}

}  // namespace larder
