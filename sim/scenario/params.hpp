#pragma once
// Typed, range-checked reads from one YAML mapping. Every value keeps its file:line:col, every
// problem goes to a Diagnostics sink (reading goes on, so all problems are reported at once),
// and `finish()` reports keys that nothing asked for: a typo is never silently ignored.

#include <yaml-cpp/yaml.h>

#include <initializer_list>
#include <limits>
#include <optional>
#include <set>
#include <string>
#include <string_view>
#include <vector>

#include "sim/scenario/diagnostics.hpp"

namespace larder {

/// An allowed interval for a number; open ends exclude the bound.
struct Range {
  double min = -std::numeric_limits<double>::infinity();
  double max = std::numeric_limits<double>::infinity();
  bool min_open = false;
  bool max_open = false;

  bool contains(double v) const;
  /// Human wording of the rule, e.g. ">= 1", "in [0, 1]", "> 0".
  std::string describe() const;

  static Range at_least(double v) { return {v}; }
  static Range above(double v) { return {v, std::numeric_limits<double>::infinity(), true}; }
  static Range between(double lo, double hi) { return {lo, hi}; }
  static Range probability() { return {0.0, 1.0}; }
};

/// Location of a YAML node in `file` (1-based line and column).
Location location_of(const YAML::Node& node, const std::string& file);

/// Reads one YAML mapping. Copies share nothing mutable but the diagnostics sink.
class Params {
 public:
  /// `path` names the mapping in messages (e.g. "items[2]" or "policies[0].quantity").
  Params(YAML::Node node, std::string path, std::string file, Diagnostics& diag);

  const std::string& path() const { return path_; }
  const std::string& file() const { return file_; }
  Diagnostics& diagnostics() const { return *diag_; }
  /// `path.key` for messages.
  std::string path_of(std::string_view key) const;

  bool has(std::string_view key);
  /// The mapping as written.
  const YAML::Node& node() const { return node_; }
  Location location() const;
  /// Where the key itself is written (or the mapping itself when the key is absent).
  Location key_location(std::string_view key) const;
  /// Where the key's value is (or the mapping itself when the key is absent).
  Location location(std::string_view key) const;

  double number(std::string_view key, double fallback, Range range = {});
  std::optional<double> optional_number(std::string_view key, Range range = {});
  int integer(std::string_view key, int fallback, Range range = {});
  std::optional<int> optional_integer(std::string_view key, Range range = {});
  bool boolean(std::string_view key, bool fallback);
  std::string text(std::string_view key, std::string fallback);
  std::optional<std::string> optional_text(std::string_view key);
  /// One of `options`; an error lists them.
  std::string choice(std::string_view key, std::string fallback,
                     std::initializer_list<std::string_view> options);
  /// A nested mapping (error if present but not a mapping).
  std::optional<Params> mapping(std::string_view key);
  /// The raw node, marked as used (may be undefined).
  YAML::Node raw(std::string_view key);

  /// Reports a problem about `key`'s value.
  void error(std::string_view key, std::string message, std::string hint = {});
  /// Reports keys never asked for, with a "did you mean" hint when one is close.
  void finish();

 private:
  YAML::Node node_;
  std::string path_;
  std::string file_;
  Diagnostics* diag_;
  std::set<std::string, std::less<>> known_;
};

/// Reads a scalar node as a number, reporting a problem (and returning nullopt) if it is not one
/// or is outside `range`. `what` names the value in messages.
std::optional<double> read_number(const YAML::Node& node, const std::string& what, Range range,
                                  const std::string& file, Diagnostics& diag);

/// A value as quoted in messages: the scalar itself, or "a list", "a mapping", "nothing".
std::string describe_value(const YAML::Node& node);

/// Whether `v` is an integer value (within 1e-9).
bool is_integral(double v);

/// Levenshtein distance, for "did you mean" hints.
int edit_distance(std::string_view a, std::string_view b);

}  // namespace larder
