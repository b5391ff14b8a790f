#include "sim/scenario/params.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cerrno>
#include <cmath>
#include <cstdlib>

namespace larder {

namespace {

std::string number_text(double v) {
  if (std::isinf(v)) return v > 0 ? "inf" : "-inf";
  return fmt::format("{}", v);
}

std::string node_text(const YAML::Node& node) {
  return describe_value(node);
}

}  // namespace

bool Range::contains(double v) const {
  if (std::isnan(v)) return false;
  const bool lo = min_open ? v > min : v >= min;
  const bool hi = max_open ? v < max : v <= max;
  return lo && hi;
}

std::string Range::describe() const {
  const bool has_min = !std::isinf(min);
  const bool has_max = !std::isinf(max);
  if (has_min && has_max) {
    return fmt::format("in {}{}, {}{}", min_open ? "(" : "[", number_text(min), number_text(max),
                       max_open ? ")" : "]");
  }
  if (has_min) return fmt::format("{} {}", min_open ? ">" : ">=", number_text(min));
  if (has_max) return fmt::format("{} {}", max_open ? "<" : "<=", number_text(max));
  return "a number";
}

Location location_of(const YAML::Node& node, const std::string& file) {
  const YAML::Mark m = node.Mark();
  if (m.line < 0) return {file, 0, 0};
  return {file, m.line + 1, m.column + 1};
}

std::string describe_value(const YAML::Node& node) {
  if (node.IsScalar()) return node.Scalar();
  if (node.IsSequence()) return "a list";
  if (node.IsMap()) return "a mapping";
  return "nothing";
}

bool is_integral(double v) {
  return std::abs(v - std::round(v)) < 1e-9;
}

int edit_distance(std::string_view a, std::string_view b) {
  std::vector<int> row(b.size() + 1);
  for (size_t j = 0; j <= b.size(); ++j) row[j] = static_cast<int>(j);
  for (size_t i = 1; i <= a.size(); ++i) {
    int diag = row[0];
    row[0] = static_cast<int>(i);
    for (size_t j = 1; j <= b.size(); ++j) {
      const int up = row[j];
      row[j] = std::min({row[j] + 1, row[j - 1] + 1, diag + (a[i - 1] == b[j - 1] ? 0 : 1)});
      diag = up;
    }
  }
  return row[b.size()];
}

std::optional<double> read_number(const YAML::Node& node, const std::string& what, Range range,
                                  const std::string& file, Diagnostics& diag) {
  double v = 0;
  if (!node.IsScalar() || !YAML::convert<double>::decode(node, v) || std::isnan(v)) {
    // A number too large for a double (1e400) is a number all the same: say what is wrong.
    if (node.IsScalar() && !node.Scalar().empty()) {
      const std::string& t = node.Scalar();
      char* end = nullptr;
      errno = 0;
      const double big = std::strtod(t.c_str(), &end);
      if (end == t.c_str() + t.size() && errno == ERANGE && std::isinf(big)) {
        diag.error(location_of(node, file),
                   fmt::format("{} is too large for a number (got {}); numbers go up to about "
                               "1.8e308, and every key has a much lower limit",
                               what, t));
        return std::nullopt;
      }
    }
    diag.error(location_of(node, file),
               fmt::format("{} must be a number (got {})", what, node_text(node)));
    return std::nullopt;
  }
  if (std::isinf(v)) {
    diag.error(location_of(node, file),
               fmt::format("{} must be a finite number (got {})", what, node.Scalar()));
    return std::nullopt;
  }
  if (!range.contains(v)) {
    diag.error(location_of(node, file),
               fmt::format("{} must be {} (got {})", what, range.describe(), node.Scalar()));
    return std::nullopt;
  }
  return v;
}

Params::Params(YAML::Node node, std::string path, std::string file, Diagnostics& diag)
    : node_(std::move(node)), path_(std::move(path)), file_(std::move(file)), diag_(&diag) {}

std::string Params::path_of(std::string_view key) const {
  return path_.empty() ? std::string(key) : fmt::format("{}.{}", path_, key);
}

bool Params::has(std::string_view key) {
  known_.emplace(key);
  return node_.IsMap() && node_[std::string(key)].IsDefined() && !node_[std::string(key)].IsNull();
}

Location Params::location() const {
  return location_of(node_, file_);
}

Location Params::location(std::string_view key) const {
  if (node_.IsMap()) {
    const YAML::Node v = node_[std::string(key)];
    if (v.IsDefined()) return location_of(v, file_);
  }
  return location();
}

Location Params::key_location(std::string_view key) const {
  if (node_.IsMap()) {
    for (const auto& kv : node_) {
      if (kv.first.IsScalar() && kv.first.Scalar() == key) return location_of(kv.first, file_);
    }
  }
  return location();
}

void Params::error(std::string_view key, std::string message, std::string hint) {
  diag_->error(location(key), std::move(message), std::move(hint));
}

YAML::Node Params::raw(std::string_view key) {
  known_.emplace(key);
  if (!node_.IsMap()) return YAML::Node(YAML::NodeType::Undefined);
  return node_[std::string(key)];
}

std::optional<double> Params::optional_number(std::string_view key, Range range) {
  if (!has(key)) return std::nullopt;
  return read_number(node_[std::string(key)], path_of(key), range, file_, *diag_);
}

double Params::number(std::string_view key, double fallback, Range range) {
  return optional_number(key, range).value_or(fallback);
}

std::optional<int> Params::optional_integer(std::string_view key, Range range) {
  const auto v = optional_number(key, range);
  if (!v) return std::nullopt;
  if (!is_integral(*v)) {
    error(key, fmt::format("{} must be a whole number (got {})", path_of(key), *v));
    return std::nullopt;
  }
  if (std::abs(*v) > std::numeric_limits<int>::max()) {
    error(key,
          fmt::format("{} is too large (got {})", path_of(key), node_[std::string(key)].Scalar()));
    return std::nullopt;
  }
  return static_cast<int>(std::lround(*v));
}

int Params::integer(std::string_view key, int fallback, Range range) {
  return optional_integer(key, range).value_or(fallback);
}

bool Params::boolean(std::string_view key, bool fallback) {
  if (!has(key)) return fallback;
  const YAML::Node n = node_[std::string(key)];
  bool v = false;
  if (!n.IsScalar() || !YAML::convert<bool>::decode(n, v)) {
    error(key, fmt::format("{} must be true or false (got {})", path_of(key), node_text(n)));
    return fallback;
  }
  return v;
}

std::optional<std::string> Params::optional_text(std::string_view key) {
  if (!has(key)) return std::nullopt;
  const YAML::Node n = node_[std::string(key)];
  if (!n.IsScalar()) {
    error(key, fmt::format("{} must be a single value (got {})", path_of(key), node_text(n)));
    return std::nullopt;
  }
  return n.Scalar();
}

std::string Params::text(std::string_view key, std::string fallback) {
  return optional_text(key).value_or(std::move(fallback));
}

std::string Params::choice(std::string_view key, std::string fallback,
                           std::initializer_list<std::string_view> options) {
  const auto v = optional_text(key);
  if (!v) return fallback;
  if (std::find(options.begin(), options.end(), *v) != options.end()) return *v;
  std::string list;
  for (auto o : options) list += (list.empty() ? "" : ", ") + std::string(o);
  error(key, fmt::format("{} must be one of {} (got {})", path_of(key), list, *v));
  return fallback;
}

std::optional<Params> Params::mapping(std::string_view key) {
  if (!has(key)) return std::nullopt;
  const YAML::Node n = node_[std::string(key)];
  if (!n.IsMap()) {
    error(key, fmt::format("{} must be a mapping of keys to values (got {})", path_of(key),
                           node_text(n)));
    return std::nullopt;
  }
  return Params(n, path_of(key), file_, *diag_);
}

void Params::finish() {
  if (!node_.IsMap()) return;
  for (const auto& kv : node_) {
    const std::string key = kv.first.as<std::string>("");
    if (known_.count(key)) continue;
    std::string best;
    int best_d = 3;
    for (const auto& k : known_) {
      const int d = edit_distance(key, k);
      if (d < best_d) best_d = d, best = k;
    }
    diag_->error(location_of(kv.first, file_),
                 fmt::format("unknown key '{}' in {}", key, path_.empty() ? "the scenario" : path_),
                 best.empty() ? std::string{} : fmt::format("did you mean '{}'?", best));
  }
}

}  // namespace larder
