#pragma once
// One line typed at the drill prompt, read into the day's orders or a command:
// - numbers, one per item in the order shown, separated by blanks or commas ("12 8 0");
//   `=` in place of a number repeats that item's previous order ("12 = 0");
// - `r` or `=` alone: repeat every previous order;
// - `?` or `h`: help; `q`: quit (the decisions so far are saved).
// Anything else is an error with a one-line message; the caller asks the same day again.

#include <optional>
#include <span>
#include <string>
#include <string_view>
#include <vector>

namespace larder {

struct OrderLine {
  enum class Kind { orders, help, quit, error };
  Kind kind = Kind::error;
  std::vector<int> quantities;  ///< kind == orders: one per item
  std::string message;          ///< kind == error: what was wrong and what to type
};

/// Largest order the prompt accepts for one item.
inline constexpr int kMaxOrderUnits = 100000;

/// Reads `line` for items named `items` whose previous orders are `previous` (nullopt: none).
OrderLine parse_order_line(std::string_view line, std::span<const std::string> items,
                           std::span<const std::optional<int>> previous);

}  // namespace larder
