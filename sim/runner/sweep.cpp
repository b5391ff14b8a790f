#include "sim/runner/sweep.hpp"

#include <fmt/format.h>

#include "policies/policy.hpp"
#include "sim/scenario/load_scenario.hpp"

namespace larder {

namespace {

[[noreturn]] void bad_setting(const std::string& label, const std::string& message,
                              std::string hint = {}) {
  Diagnostics d;
  d.error({label, 0, 0}, message, std::move(hint));
  throw InputError(d);
}

YAML::Node load_document(const SweepSpec& spec) {
  try {
    return YAML::Load(spec.text);
  } catch (const YAML::Exception&) {
    // The loader gives the precise message.
    Diagnostics d;
    parse_scenario(spec.text, spec.label, d);
    throw InputError(d);
  }
}

}  // namespace

std::string point_text(const SweepSpec& spec, std::span<const std::string> values,
                       std::uint64_t seed) {
  YAML::Node root = YAML::Clone(load_document(spec));
  for (size_t k = 0; k < spec.settings.size(); ++k) {
    const std::string error = set_path(root, spec.settings[k].path, values[k]);
    if (!error.empty()) {
      bad_setting(spec.label,
                  fmt::format("--set {}={}: {}", spec.settings[k].path, values[k], error),
                  "paths use dots, e.g. policies.<name>.quantity.level or items.<id>.price");
    }
  }
  root["seed"] = seed;
  YAML::Emitter out;
  out << root;
  return out.c_str();
}

namespace {

std::string full_path(const std::string& path) {
  return path.find('.') == std::string::npos ? "items.*." + path : path;
}

/// The text of the base scenario with one `--vary` value applied.
std::string varied_text(const SweepSpec& spec, const std::string& path, const std::string& value,
                        std::uint64_t seed) {
  YAML::Node root = YAML::Clone(load_document(spec));
  std::string error;
  if (value.size() > 1 && value.back() == '%') {
    double pct = 0.0;
    try {
      pct = std::stod(value.substr(0, value.size() - 1));
    } catch (const std::exception&) {
      error = fmt::format("'{}' is not a percentage", value);
    }
    if (error.empty()) error = scale_path(root, full_path(path), 1.0 + pct / 100.0);
  } else {
    error = set_path(root, full_path(path), value);
  }
  if (!error.empty()) {
    bad_setting(spec.label, fmt::format("--vary {}={}: {}", path, value, error),
                "e.g. --vary price=-10%,+10% or --vary policies.<name>.quantity.level=0.6,0.8");
  }
  root["seed"] = seed;
  YAML::Emitter out;
  out << root;
  return out.c_str();
}

}  // namespace

std::vector<SweepPoint> run_sweep(const SweepSpec& spec,
                                  const std::function<void(int, int)>& on_point) {
  // One seed for every point: the scenario's, or one drawn when it has none.
  std::uint64_t seed = 0;
  {
    Diagnostics d;
    auto base = parse_scenario(spec.text, spec.label, d);
    if (!base) throw InputError(d);
    seed = spec.seed.value_or(base->seed);
  }
  // The points: a grid, first setting slowest; or the base and each varied value alone.
  std::vector<std::vector<std::string>> grid = {{}};
  if (!spec.varies.empty()) {
    for (const Setting& s : spec.varies) {
      for (const auto& v : s.values) grid.push_back({s.path, v});
    }
  }
  for (const Setting& s : spec.settings) {
    std::vector<std::vector<std::string>> next;
    for (const auto& g : grid) {
      for (const auto& v : s.values) {
        next.push_back(g);
        next.back().push_back(v);
      }
    }
    grid = std::move(next);
  }
  std::vector<SweepPoint> out;
  for (size_t p = 0; p < grid.size(); ++p) {
    if (on_point) on_point(static_cast<int>(p), static_cast<int>(grid.size()));
    std::string label = spec.label;
    std::string text;
    if (!spec.varies.empty()) {
      if (!grid[p].empty()) label += fmt::format(" [{}={}]", grid[p][0], grid[p][1]);
      text = grid[p].empty() ? point_text(spec, {}, seed)
                             : varied_text(spec, grid[p][0], grid[p][1], seed);
    } else {
      for (size_t k = 0; k < spec.settings.size(); ++k) {
        label += fmt::format(" [{}={}]", spec.settings[k].path, grid[p][k]);
      }
      text = point_text(spec, grid[p], seed);
    }
    Diagnostics d;
    auto scenario = parse_scenario(text, label, d);
    if (!scenario) throw InputError(d);
    if (spec.replications) scenario->replications = *spec.replications;
    const std::vector<Policy> policies = build_policies(*scenario, d);
    if (!d.ok()) throw InputError(d);
    out.push_back({grid[p], run_policies(*scenario, policies, spec.options)});
  }
  return out;
}

}  // namespace larder
