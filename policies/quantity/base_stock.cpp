// `base_stock`: order up to a fixed level of the inventory position: level minus every unit on
// hand that can still be sold (any remaining life) minus every unit on order, never below 0
// (the order-up-to rule of periodic review on the inventory position; Silver, Pyke and Thomas
// 2017; for perishables as in Nahmias 1982). Units that will sell before the delivery arrives
// count too, so with a lead time above one the level covers the lead-time demand as well.

#include <algorithm>
#include <cmath>
#include <cstdint>

#include "policies/quantity/item_values.hpp"
#include "policies/registry.hpp"

namespace larder {

namespace {
/// Every unit on hand (all of it can still be sold tomorrow) and every unit on order; without
/// an age profile, the usable stock and the units on order.
int inventory_position(const OrderInput& in) {
  if (in.stock_by_age.empty() && in.pipeline.empty()) return in.usable_stock + in.on_order;
  long units = 0;
  for (std::int32_t x : in.stock_by_age) units += x;
  for (std::int32_t x : in.pipeline) units += x;
  return static_cast<int>(std::min(units, 2000000000L));
}

class BaseStock : public OrderRule, public QuantityMethod {
 public:
  explicit BaseStock(std::vector<int> level) : level_(std::move(level)) {}
  void decide(const OrderContext&, std::span<const OrderInput> in, std::span<int> out) override {
    for (size_t i = 0; i < out.size(); ++i) {
      out[i] = std::max(0, level_[i] - inventory_position(in[i]));
    }
  }
  std::unique_ptr<OrderRule> make(const StoreView&) const override {
    return std::make_unique<BaseStock>(level_);
  }

 private:
  std::vector<int> level_;
};
}  // namespace

void register_base_stock(PolicyRegistry& r) {
  r.quantities.add({"base_stock",
                    "order up to a level of the inventory position: level - every unit on hand - "
                    "every unit on order (level: number or item map)",
                    [](PartContext& ctx) -> std::unique_ptr<QuantityMethod> {
                      auto level = read_item_values(ctx, "level", {0.0, 1e9}, true);
                      if (!level) return nullptr;
                      std::vector<int> units;
                      for (double v : *level) units.push_back(static_cast<int>(std::lround(v)));
                      return std::make_unique<BaseStock>(std::move(units));
                    }});
}

}  // namespace larder
