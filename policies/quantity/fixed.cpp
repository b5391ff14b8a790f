// `fixed`: the same quantity on every delivery day, one number or a map item -> number. The
// habit of a store that always bakes the same tray.

#include <cmath>

#include "policies/quantity/item_values.hpp"
#include "policies/registry.hpp"

namespace larder {

namespace {
class FixedOrder : public OrderRule, public QuantityMethod {
 public:
  explicit FixedOrder(std::vector<int> q) : q_(std::move(q)) {}
  void decide(const OrderContext&, std::span<const OrderInput>, std::span<int> out) override {
    for (size_t i = 0; i < out.size(); ++i) out[i] = q_[i];
  }
  std::unique_ptr<OrderRule> make(const StoreView&) const override {
    return std::make_unique<FixedOrder>(q_);
  }

 private:
  std::vector<int> q_;
};
}  // namespace

void register_fixed(PolicyRegistry& r) {
  r.quantities.add({"fixed", "the same quantity every delivery day (quantity: number or item map)",
                    [](PartContext& ctx) -> std::unique_ptr<QuantityMethod> {
                      auto q = read_item_values(ctx, "quantity", {0.0, 1e9}, true);
                      if (!q) return nullptr;
                      std::vector<int> units;
                      for (double v : *q) units.push_back(static_cast<int>(std::lround(v)));
                      return std::make_unique<FixedOrder>(std::move(units));
                    }});
}

}  // namespace larder
