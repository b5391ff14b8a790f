// `shelf_cap`: a shelf-space limit. The order is cut so that usable stock on the arrival day +
// units on order + the order <= `capacity` (one number or an item map), counted in whole packs:
// the order becomes min(order rounded up to packs, room rounded down to packs), so the engine's
// rounding up to packs cannot break the limit. A store practice rather than a published
// ordering method: shelf space is one of the store constraints of perishables ordering that
// van Donselaar, van Woensel, Broekmeulen and Fransoo (2006), "Inventory control of perishables
// in supermarkets", IJPE 104: 462-472, describe (title and abstract checked; details not).

#include <algorithm>

#include "policies/adjustment/item_counts.hpp"
#include "policies/adjustment/packs.hpp"
#include "policies/registry.hpp"

namespace larder {

namespace {
class ShelfCap : public Adjuster, public AdjustmentMethod {
 public:
  ShelfCap(std::vector<int> capacity, std::vector<int> pack)
      : capacity_(std::move(capacity)), pack_(std::move(pack)) {}
  void adjust(const OrderContext&, std::span<const OrderInput> in, std::span<const Observation>,
              std::span<int> orders) override {
    for (size_t i = 0; i < orders.size(); ++i) {
      const int room = std::max(0, capacity_[i] - in[i].usable_stock - in[i].on_order);
      orders[i] = std::min(round_up_to_pack(std::max(orders[i], 0), pack_[i]),
                           round_down_to_pack(room, pack_[i]));
    }
  }
  std::unique_ptr<Adjuster> make(const StoreView&) const override {
    return std::make_unique<ShelfCap>(capacity_, pack_);
  }

 private:
  std::vector<int> capacity_;
  std::vector<int> pack_;
};
}  // namespace

void register_shelf_cap(PolicyRegistry& r) {
  r.adjustments.add({"shelf_cap",
                     "cut the order so that usable stock + on order + order <= capacity, in "
                     "whole packs (capacity: whole number or item map, required)",
                     [](PartContext& ctx) -> std::unique_ptr<AdjustmentMethod> {
                       auto capacity = read_item_counts(ctx, "capacity", true);
                       if (!capacity) return nullptr;
                       std::vector<int> pack;
                       for (const Item& item : ctx.scenario.items) pack.push_back(item.pack_size);
                       return std::make_unique<ShelfCap>(std::move(*capacity), std::move(pack));
                     }});
}

}  // namespace larder
