#include "sim/scenario/yaml_guard.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <unordered_map>
#include <utility>
#include <vector>

#include "sim/scenario/params.hpp"

namespace larder {

namespace {

/// Length of the UTF-8 sequence starting at `s[i]`, or 0 when it is not valid UTF-8 (RFC 3629:
/// no overlong forms, no surrogates, nothing above U+10FFFF).
std::size_t utf8_length(std::string_view s, std::size_t i) {
  const auto b = [&](std::size_t k) { return static_cast<unsigned char>(s[i + k]); };
  const auto cont = [&](std::size_t k) { return i + k < s.size() && (b(k) & 0xC0) == 0x80; };
  const unsigned char c = b(0);
  if (c < 0x80) return 1;
  if (c >= 0xC2 && c <= 0xDF) return cont(1) ? 2 : 0;
  if (c >= 0xE0 && c <= 0xEF) {
    if (!cont(1) || !cont(2)) return 0;
    if (c == 0xE0 && b(1) < 0xA0) return 0;  // overlong
    if (c == 0xED && b(1) > 0x9F) return 0;  // surrogate
    return 3;
  }
  if (c >= 0xF0 && c <= 0xF4) {
    if (!cont(1) || !cont(2) || !cont(3)) return 0;
    if (c == 0xF0 && b(1) < 0x90) return 0;  // overlong
    if (c == 0xF4 && b(1) > 0x8F) return 0;  // above U+10FFFF
    return 4;
  }
  return 0;
}

/// Reports the first byte that is not text: a control character other than tab, line feed and
/// carriage return (YAML 1.2, section 5.1), or an invalid UTF-8 sequence.
bool check_text_bytes(std::string_view text, const std::string& file, Diagnostics& diag) {
  int line = 1;
  int column = 1;
  for (std::size_t i = 0; i < text.size();) {
    const auto c = static_cast<unsigned char>(text[i]);
    const std::size_t n = utf8_length(text, i);
    const bool control = c < 0x20 && c != '\t' && c != '\n' && c != '\r';
    if (n == 0 || control || c == 0x7F) {
      diag.error({file, line, column},
                 fmt::format("the file is not YAML text: byte 0x{:02X} is {}", c,
                             n == 0 ? "not part of valid UTF-8" : "a control character"),
                 "a scenario is a YAML text file in UTF-8; is this the right file?");
      return false;
    }
    if (c == '\r' && (i + 1 >= text.size() || text[i + 1] != '\n')) {
      diag.error({file, line, column},
                 "a carriage return without a line feed: the file has old Mac line ends (CR "
                 "only), which YAML does not read as line ends",
                 "save the file with Unix (LF) or Windows (CR LF) line ends");
      return false;
    }
    if (c == '\n') {
      ++line;
      column = 1;
    } else {
      ++column;
    }
    i += n;
  }
  return true;
}

/// Measures the nesting of block collections (by indentation and `- ` markers) and flow
/// collections (`[` and `{` where a value starts), skipping comments, quoted scalars and block
/// scalars. An estimate (a list written at its key's indentation counts with its key) good
/// enough to stop a hostile file long before yaml-cpp's recursion gets deep.
class DepthScan {
 public:
  DepthScan(std::string_view text, int max_depth) : text_(text), max_depth_(max_depth) {}

  /// The first place where the depth exceeds the limit, or line 0 when it never does.
  std::pair<int, int> first_too_deep() {
    int line = 0;
    std::size_t start = 0;
    while (start <= text_.size()) {
      std::size_t end = text_.find('\n', start);
      if (end == std::string_view::npos) end = text_.size();
      ++line;
      if (const int col = scan_line(text_.substr(start, end - start)); col > 0) return {line, col};
      start = end + 1;
    }
    return {0, 0};
  }

 private:
  /// Returns the 1-based column where the limit is exceeded, or 0.
  int scan_line(std::string_view l) {
    if (!l.empty() && l.back() == '\r') l.remove_suffix(1);
    std::size_t indent = 0;
    while (indent < l.size() && l[indent] == ' ') ++indent;
    const bool blank = indent == l.size() || l[indent] == '#';
    if (block_scalar_indent_ >= 0) {  // inside a `|` or `>` scalar: its lines are text
      if (blank || static_cast<int>(indent) > block_scalar_indent_) return 0;
      block_scalar_indent_ = -1;
    }
    if (blank && quote_ == 0) return 0;
    int extra = 0;  // `- - x`: sequences nested on one line (the first is the indentation's)
    if (quote_ == 0 && flow_depth_ == 0) {
      const int n = static_cast<int>(indent);
      while (!indents_.empty() && indents_.back() > n) indents_.pop_back();
      if (indents_.empty() || indents_.back() < n) indents_.push_back(n);
      for (std::size_t k = indent; k + 1 < l.size() && l[k] == '-' && l[k + 1] == ' ';) {
        ++extra;
        k += 2;
        while (k < l.size() && l[k] == ' ') ++k;
      }
      extra = std::max(0, extra - 1);
      if (depth(extra) > max_depth_) return static_cast<int>(indent) + 1;
    }
    char last = 0;  // the last character outside quotes on this line (0: none yet)
    bool space_after_last = false;
    for (std::size_t k = quote_ == 0 && flow_depth_ == 0 ? indent : 0; k < l.size(); ++k) {
      const char c = l[k];
      if (quote_ != 0) {
        if (quote_ == '"' && c == '\\') {
          ++k;  // an escaped character
        } else if (c == quote_) {
          if (quote_ == '\'' && k + 1 < l.size() && l[k + 1] == '\'') {
            ++k;  // '' inside a single-quoted scalar
          } else {
            quote_ = 0;
            last = c;
            space_after_last = false;
          }
        }
        continue;
      }
      if (c == ' ' || c == '\t') {
        space_after_last = true;
        continue;
      }
      const bool token_start = last == 0 || last == '[' || last == '{' || last == ',' ||
                               ((last == ':' || last == '-' || last == '?') && space_after_last);
      if (c == '#' && (last == 0 || space_after_last)) break;  // a comment
      if (token_start && (c == '"' || c == '\'')) {
        quote_ = c;
      } else if (token_start && (c == '[' || c == '{')) {
        ++flow_depth_;
        if (depth(extra) > max_depth_) return static_cast<int>(k) + 1;
      } else if ((c == ']' || c == '}') && flow_depth_ > 0) {
        --flow_depth_;
      } else if (token_start && (c == '|' || c == '>') && flow_depth_ == 0) {
        block_scalar_indent_ = indents_.empty() ? 0 : indents_.back();
      }
      last = c;
      space_after_last = false;
    }
    return 0;
  }

  int depth(int extra) const { return static_cast<int>(indents_.size()) + extra + flow_depth_; }

  std::string_view text_;
  int max_depth_;
  std::vector<int> indents_;  ///< indentation of the open block collections, increasing
  int flow_depth_ = 0;
  char quote_ = 0;                ///< the quote of a scalar that goes on past the line end
  int block_scalar_indent_ = -1;  ///< indentation of the line that opened a block scalar
};

/// Expanded sizes of collections by position (aliases share their anchor's node and mark).
class ExpansionCounter {
 public:
  explicit ExpansionCounter(std::size_t cap) : cap_(cap) {}

  std::size_t count(const YAML::Node& node) {
    if (!node.IsMap() && !node.IsSequence()) return 1;
    const int pos = node.Mark().pos;
    const auto [it, inserted] = memo_.emplace(pos, kInProgress);
    if (!inserted) return it->second == kInProgress ? cap_ + 1 : it->second;  // a cycle: infinite
    std::size_t total = 1;
    for (auto child = node.begin(); child != node.end() && total <= cap_; ++child) {
      if (node.IsMap()) {
        total += count(child->first);
        total += count(child->second);
      } else {
        total += count(*child);
      }
    }
    if (total > cap_) total = cap_ + 1;
    memo_[pos] = total;
    return total;
  }

 private:
  static constexpr std::size_t kInProgress = static_cast<std::size_t>(-1);
  std::size_t cap_;
  std::unordered_map<int, std::size_t> memo_;
};

}  // namespace

bool check_yaml_text(std::string_view text, const std::string& file, Diagnostics& diag,
                     const YamlLimits& limits) {
  if (text.size() > limits.max_bytes) {
    diag.error({file, 0, 0},
               fmt::format("the file is too large for a scenario: {} bytes (the limit is {} MiB)",
                           text.size(), limits.max_bytes >> 20),
               "a scenario describes stores, items and policies in a few kilobytes; is this the "
               "right file?");
    return false;
  }
  if (!check_text_bytes(text, file, diag)) return false;
  const auto [line, column] = DepthScan(text, limits.max_depth).first_too_deep();
  if (line > 0) {
    diag.error({file, line, column},
               fmt::format("the YAML nests deeper than {} levels", limits.max_depth),
               "a scenario needs about 6 levels; is this the right file?");
    return false;
  }
  return true;
}

std::size_t expanded_node_count(const YAML::Node& root, std::size_t cap) {
  return ExpansionCounter(cap).count(root);
}

bool check_yaml_expansion(const YAML::Node& root, const std::string& file, Diagnostics& diag,
                          const YamlLimits& limits) {
  if (expanded_node_count(root, limits.max_expanded_nodes) <= limits.max_expanded_nodes) {
    return true;
  }
  diag.error(location_of(root, file),
             fmt::format("the YAML expands to more than {} nodes through its aliases (*name) "
                         "or refers to itself",
                         limits.max_expanded_nodes),
             "write the repeated parts out, or use item_defaults instead of anchors and aliases");
  return false;
}

}  // namespace larder
