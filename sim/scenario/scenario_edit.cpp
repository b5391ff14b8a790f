#include "sim/scenario/scenario_edit.hpp"

#include <fmt/format.h>

#include <functional>
#include <sstream>

namespace larder {

std::optional<Setting> parse_setting(const std::string& text) {
  const size_t eq = text.find('=');
  if (eq == std::string::npos || eq == 0) return std::nullopt;
  Setting s;
  s.path = text.substr(0, eq);
  // Values split at commas outside brackets, so `[mon, tue]` stays one value.
  std::string current;
  int depth = 0;
  for (char c : text.substr(eq + 1)) {
    if (c == '[' || c == '{') ++depth;
    if (c == ']' || c == '}') --depth;
    if (c == ',' && depth == 0) {
      s.values.push_back(current);
      current.clear();
    } else {
      current += c;
    }
  }
  s.values.push_back(current);
  for (const auto& v : s.values) {
    if (v.empty()) return std::nullopt;
  }
  return s;
}

namespace {

std::vector<std::string> split_path(const std::string& path) {
  std::vector<std::string> out;
  std::stringstream in(path);
  for (std::string step; std::getline(in, step, '.');) out.push_back(step);
  return out;
}

/// Calls `visit` on every node the path reaches; the last step may create a missing key.
std::string walk(YAML::Node node, const std::vector<std::string>& steps, size_t k,
                 const std::string& where, const std::function<std::string(YAML::Node)>& visit) {
  if (k == steps.size()) return visit(node);
  const std::string& step = steps[k];
  const std::string here = where.empty() ? step : where + "." + step;
  if (node.IsSequence()) {
    bool found = false;
    for (size_t i = 0; i < node.size(); ++i) {
      YAML::Node e = node[i];
      bool match = step == "*" || step == std::to_string(i);
      for (const char* key : {"name", "id"}) {
        if (!match && e.IsMap() && e[key] && e[key].IsScalar()) {
          match = e[key].Scalar() == step;
        }
      }
      if (!match) continue;
      found = true;
      const std::string error = walk(e, steps, k + 1, here, visit);
      if (!error.empty()) return error;
    }
    return found ? std::string{}
                 : fmt::format("{} has no element named '{}'", where.empty() ? "the file" : where,
                               step);
  }
  if (node.IsMap() || (!node.IsDefined() || node.IsNull())) {
    if (step == "*")
      return fmt::format("{}: '*' picks list elements, and this is not a list", where);
    if (!node[step] && k + 1 < steps.size()) {
      return fmt::format("{} has no key '{}'", where.empty() ? "the file" : where, step);
    }
    return walk(node[step], steps, k + 1, here, visit);
  }
  return fmt::format("{} is a single value; it has no '{}'", where, step);
}

std::string walk_path(YAML::Node root, const std::string& path,
                      const std::function<std::string(YAML::Node)>& visit) {
  const auto steps = split_path(path);
  for (const auto& s : steps) {
    if (s.empty()) return fmt::format("'{}' has an empty step", path);
  }
  return walk(root, steps, 0, "", visit);
}

}  // namespace

std::string set_path(YAML::Node root, const std::string& path, const std::string& value) {
  YAML::Node parsed;
  try {
    parsed = YAML::Load(value);
  } catch (const YAML::Exception& e) {
    return fmt::format("'{}' is not a YAML value ({})", value, e.msg);
  }
  return walk_path(root, path, [&](YAML::Node n) {
    n = YAML::Clone(parsed);
    return std::string{};
  });
}

std::vector<double> numbers_at(const YAML::Node& root, const std::string& path,
                               std::string& error) {
  std::vector<double> out;
  error = walk_path(YAML::Clone(root), path, [&](YAML::Node n) {
    double v = 0.0;
    if (!n.IsScalar() || !YAML::convert<double>::decode(n, v)) {
      return fmt::format("{} is not a number here", path);
    }
    out.push_back(v);
    return std::string{};
  });
  return out;
}

std::string scale_path(YAML::Node root, const std::string& path, double factor) {
  return walk_path(root, path, [&](YAML::Node n) {
    double v = 0.0;
    if (!n.IsScalar() || !YAML::convert<double>::decode(n, v)) {
      return fmt::format("{} is not a number here", path);
    }
    n = fmt::format("{}", v * factor);
    return std::string{};
  });
}

}  // namespace larder
