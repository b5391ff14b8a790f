#include "policies/quantity/item_values.hpp"

#include <fmt/format.h>

namespace larder {

std::optional<std::vector<double>> read_item_values(PartContext& ctx, std::string_view key,
                                                    Range range, bool required) {
  Params& p = ctx.params;
  const auto& items = ctx.scenario.items;
  if (!p.has(key)) {
    if (required) {
      p.error({}, fmt::format("{} needs '{}'", p.path(), key),
              fmt::format("give one number for every item, or a map from item id to number"));
    }
    return std::nullopt;
  }
  const YAML::Node node = p.raw(key);
  const std::string what = p.path_of(key);
  if (node.IsScalar()) {
    const auto v = read_number(node, what, range, p.file(), p.diagnostics());
    if (!v) return std::nullopt;
    return std::vector<double>(items.size(), *v);
  }
  if (!node.IsMap()) {
    p.error(key, fmt::format("{} must be a number or a map from item id to number", what));
    return std::nullopt;
  }
  std::vector<std::optional<double>> values(items.size());
  bool ok = true;
  for (const auto& kv : node) {
    const std::string id = kv.first.as<std::string>("");
    size_t i = 0;
    while (i < items.size() && items[i].id != id) ++i;
    if (i == items.size()) {
      p.diagnostics().error(location_of(kv.first, p.file()),
                            fmt::format("{}: unknown item '{}'", what, id));
      ok = false;
      continue;
    }
    values[i] =
        read_number(kv.second, fmt::format("{}.{}", what, id), range, p.file(), p.diagnostics());
    ok = ok && values[i].has_value();
  }
  std::string missing;
  for (size_t i = 0; i < items.size(); ++i) {
    if (!values[i] && ok) missing += (missing.empty() ? "" : ", ") + items[i].id;
  }
  if (!missing.empty()) {
    p.error(key, fmt::format("{} has no value for item(s) {}", what, missing),
            "list every item, or give one number for all");
    ok = false;
  }
  if (!ok) return std::nullopt;
  std::vector<double> out;
  for (const auto& v : values) out.push_back(*v);
  return out;
}

}  // namespace larder
