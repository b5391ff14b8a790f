// `pack_round`: rounds each order up to whole case packs of the item (the case-pack rounding
// of retail replenishment; Broekmeulen and van Donselaar 2009 order "the smallest number of
// case packs" that reaches the level). The engine also rounds every final order up to packs;
// listing `pack_round` applies it at that point of the chain, so later adjustments see packs.

#include <algorithm>

#include "policies/adjustment/packs.hpp"
#include "policies/registry.hpp"

namespace larder {

namespace {
class PackRound : public Adjuster, public AdjustmentMethod {
 public:
  explicit PackRound(std::vector<int> pack) : pack_(std::move(pack)) {}
  void adjust(const OrderContext&, std::span<const OrderInput>, std::span<const Observation>,
              std::span<int> orders) override {
    for (size_t i = 0; i < orders.size(); ++i) {
      orders[i] = round_up_to_pack(std::max(orders[i], 0), pack_[i]);
    }
  }
  std::unique_ptr<Adjuster> make(const StoreView&) const override {
    return std::make_unique<PackRound>(pack_);
  }

 private:
  std::vector<int> pack_;
};
}  // namespace

void register_pack_round(PolicyRegistry& r) {
  r.adjustments.add({"pack_round", "round the order up to whole case packs (no parameters)",
                     [](PartContext& ctx) -> std::unique_ptr<AdjustmentMethod> {
                       std::vector<int> pack;
                       for (const Item& item : ctx.scenario.items) pack.push_back(item.pack_size);
                       return std::make_unique<PackRound>(std::move(pack));
                     }});
}

}  // namespace larder
