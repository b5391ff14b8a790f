#include "policies/adjustment/item_counts.hpp"

#include <fmt/format.h>

#include <cmath>

#include "policies/quantity/item_values.hpp"

namespace larder {

std::optional<std::vector<int>> read_item_counts(PartContext& ctx, std::string_view key,
                                                 bool required) {
  const auto values = read_item_values(ctx, key, Range::between(0.0, 1e9), required);
  if (!values) return std::nullopt;
  std::vector<int> out;
  for (size_t i = 0; i < values->size(); ++i) {
    const double v = (*values)[i];
    if (!is_integral(v)) {
      const bool one = ctx.params.raw(key).IsScalar();
      ctx.params.error(key, fmt::format("{} must be a whole number (got {})",
                                        one ? ctx.params.path_of(key)
                                            : fmt::format("{}.{}", ctx.params.path_of(key),
                                                          ctx.scenario.items[i].id),
                                        v));
      return std::nullopt;
    }
    out.push_back(static_cast<int>(std::lround(v)));
  }
  return out;
}

}  // namespace larder
