#include "cli/option_values.hpp"

#include <fmt/format.h>
#include <yaml-cpp/yaml.h>

#include <cmath>

#include "sim/scenario/diagnostics.hpp"
#include "sim/scenario/load_scenario.hpp"
#include "sim/scenario/params.hpp"
#include "sim/scenario/seed_text.hpp"

namespace larder {

namespace {

[[noreturn]] void refuse(const char* option, std::string message, std::string hint = {}) {
  Diagnostics d;
  d.error({option, 0, 0}, std::move(message), std::move(hint));
  throw InputError(std::move(d));
}

}  // namespace

std::optional<std::uint64_t> seed_option(const std::string& text) {
  if (text.empty()) return std::nullopt;
  const auto v = parse_seed_text(text);
  if (!v) {
    refuse("--seed", fmt::format("{} (got {})", seed_rule("--seed"), text),
           "the same rule as the scenario's seed: key");
  }
  return v;
}

std::optional<int> replications_option(const std::string& text) {
  if (text.empty()) return std::nullopt;
  // The scenario key's reading: a YAML number (so 1e3 is 1000), whole, in range.
  double v = 0;
  const YAML::Node node(text);
  const Range range = Range::between(1, kMaxReplications);
  const char* what = "--replications";
  if (!YAML::convert<double>::decode(node, v) || std::isnan(v)) {
    refuse(what, fmt::format("{} must be a number (got {})", what, text));
  }
  if (!range.contains(v)) {
    refuse(what, fmt::format("{} must be {} (got {})", what, range.describe(), text),
           "the same rule as the scenario's replications: key");
  }
  if (v != std::floor(v)) {
    refuse(what, fmt::format("{} must be a whole number (got {})", what, text));
  }
  return static_cast<int>(v);
}

}  // namespace larder
