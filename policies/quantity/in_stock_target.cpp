// `in_stock_target`: the smallest Q with P(D <= Q - 1) >= level, i.e. the store still has a
// unit at close with probability >= level (policies.md). "In stock at close" for integer
// demand is P(D < Q) = F(Q - 1), stricter than the type 1 service P(D <= Q) (Silver, Pyke and
// Thomas 2017, service measures).

#include "policies/quantity/fractile_rule.hpp"
#include "policies/quantity/item_values.hpp"
#include "policies/registry.hpp"

namespace larder {

void register_in_stock_target(PolicyRegistry& r) {
  r.quantities.add({"in_stock_target",
                    "smallest Q with P(D <= Q - 1) >= level: a unit left at close with "
                    "probability >= level (level: number or item map; assume: family)",
                    [](PartContext& ctx) -> std::unique_ptr<QuantityMethod> {
                      auto level = read_item_values(ctx, "level", {0.0, 1.0, true, true}, true);
                      auto family = read_assume(ctx);
                      if (!level) return nullptr;
                      return std::make_unique<FractileMethod>(std::move(*level), std::move(family),
                                                              1);
                    }});
}

}  // namespace larder
