// `min_display`: a presentation minimum. The store keeps at least `units` (k) units available
// on the arrival day: the order is raised to at least k - usable stock - units on order (the
// engine then rounds up to packs, which keeps it). A store practice rather than a published
// ordering method (a full-looking shelf sells): one of the store constraints of perishables
// ordering that van Donselaar, van Woensel, Broekmeulen and Fransoo (2006), "Inventory control
// of perishables in supermarkets", IJPE 104: 462-472, describe (title and abstract checked;
// details not).

#include <algorithm>

#include "policies/adjustment/item_counts.hpp"
#include "policies/registry.hpp"

namespace larder {

namespace {
class MinDisplay : public Adjuster, public AdjustmentMethod {
 public:
  explicit MinDisplay(std::vector<int> units) : units_(std::move(units)) {}
  void adjust(const OrderContext&, std::span<const OrderInput> in, std::span<const Observation>,
              std::span<int> orders) override {
    for (size_t i = 0; i < orders.size(); ++i) {
      orders[i] = std::max(orders[i], units_[i] - in[i].usable_stock - in[i].on_order);
    }
  }
  std::unique_ptr<Adjuster> make(const StoreView&) const override {
    return std::make_unique<MinDisplay>(units_);
  }

 private:
  std::vector<int> units_;
};
}  // namespace

void register_min_display(PolicyRegistry& r) {
  r.adjustments.add({"min_display",
                     "order at least units - usable stock - on order: keep k units available "
                     "on the arrival day (units: whole number or item map, required)",
                     [](PartContext& ctx) -> std::unique_ptr<AdjustmentMethod> {
                       auto units = read_item_counts(ctx, "units", true);
                       if (!units) return nullptr;
                       return std::make_unique<MinDisplay>(std::move(*units));
                     }});
}

}  // namespace larder
