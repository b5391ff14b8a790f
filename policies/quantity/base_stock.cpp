// `base_stock`: order up to a fixed level, level minus usable stock on the arrival day minus
// units on order, never below 0 (the order-up-to rule of periodic review; Silver, Pyke and
// Thomas 2017).

#include <algorithm>
#include <cmath>

#include "policies/quantity/item_values.hpp"
#include "policies/registry.hpp"

namespace larder {

namespace {
class BaseStock : public OrderRule, public QuantityMethod {
 public:
  explicit BaseStock(std::vector<int> level) : level_(std::move(level)) {}
  void decide(const OrderContext&, std::span<const OrderInput> in, std::span<int> out) override {
    for (size_t i = 0; i < out.size(); ++i) {
      out[i] = std::max(0, level_[i] - in[i].usable_stock - in[i].on_order);
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
                    "order up to a level: level - usable stock - units on order (level: number "
                    "or item map)",
                    [](PartContext& ctx) -> std::unique_ptr<QuantityMethod> {
                      auto level = read_item_values(ctx, "level", {0.0, 1e9}, true);
                      if (!level) return nullptr;
                      std::vector<int> units;
                      for (double v : *level) units.push_back(static_cast<int>(std::lround(v)));
                      return std::make_unique<BaseStock>(std::move(units));
                    }});
}

}  // namespace larder
