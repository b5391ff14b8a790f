// `replay`: order quantities read from a CSV of past orders, to score what a store really did
// (or what a trainee decided) on the same simulated demand as the other policies. This is a
// historical replay (trace-driven simulation of the decisions), not a published ordering rule.
//
// The file (`file`, relative to the scenario file's folder) has a header and one row per
// order: columns `store,item,quantity` and either `day` (the scenario day on which the order
// is placed, -lead_time .. horizon.days - 1; negative days are the opening orders placed
// before the horizon) or `date` (ISO YYYY-MM-DD, day = date - horizon.start_date), in any
// order. Days without a row for an item order 0; usable stock and units on order are ignored.
// Parsing is strict: every bad row is reported as `file:line:column: error: ...` (unknown
// columns, unknown store or item ids, fields that are not whole numbers or dates, days outside
// the horizon, duplicate rows, and orders that would arrive on a day the store is closed or
// gets no delivery, which the engine never places). The parser is `parse_replay_orders`
// (replay_file.hpp); this file opens the file and replays the orders.

#include <fmt/format.h>

#include <algorithm>
#include <filesystem>
#include <fstream>
#include <optional>
#include <string>
#include <vector>

#include "policies/quantity/replay_file.hpp"
#include "policies/registry.hpp"

namespace larder {

namespace {

/// Reads and checks the whole file; orders per store, sorted by day and item. nullopt when
/// anything was wrong (everything found is reported).
std::optional<ReplayOrders> read_orders(PartContext& ctx, const std::string& written) {
  Params& p = ctx.params;
  Diagnostics& diag = p.diagnostics();
  const Scenario& sc = ctx.scenario;
  std::filesystem::path path(written);
  if (path.is_relative()) path = std::filesystem::path(sc.file).parent_path() / path;
  const std::string name = path.string();
  std::ifstream in(path, std::ios::binary);
  if (written.empty() || std::filesystem::is_directory(path) || !in) {
    p.error("file", fmt::format("{}: cannot read '{}'", p.path_of("file"), name),
            "the path is relative to the scenario file's folder");
    return std::nullopt;
  }
  return parse_replay_orders(in, name, sc, diag);
}

/// One store's replay: the rows of the order day, or 0.
class ReplayRule : public OrderRule {
 public:
  explicit ReplayRule(const std::vector<ReplayOrder>& orders) : orders_(&orders) {}
  void decide(const OrderContext& ctx, std::span<const OrderInput>, std::span<int> out) override {
    std::fill(out.begin(), out.end(), 0);
    const auto first =
        std::lower_bound(orders_->begin(), orders_->end(), ReplayOrder{ctx.order_day, 0, 0});
    for (auto o = first; o != orders_->end() && o->day == ctx.order_day; ++o) {
      if (static_cast<size_t>(o->item) < out.size())
        out[static_cast<size_t>(o->item)] = o->quantity;
    }
  }

 private:
  const std::vector<ReplayOrder>* orders_;
};

class Replay : public QuantityMethod {
 public:
  explicit Replay(ReplayOrders orders) : orders_(std::move(orders)) {}
  std::unique_ptr<OrderRule> make(const StoreView& view) const override {
    return std::make_unique<ReplayRule>(orders_[static_cast<size_t>(view.store)]);
  }

 private:
  ReplayOrders orders_;  ///< per store, sorted by day and item
};

}  // namespace

void register_replay(PolicyRegistry& r) {
  r.quantities.add(
      {"replay",
       "quantities from a CSV of past orders: columns store,item,quantity and day (the day the "
       "order is placed) or date (needs horizon.start_date); file: path relative to the "
       "scenario; days without a row order 0",
       [](PartContext& ctx) -> std::unique_ptr<QuantityMethod> {
         const auto file = ctx.params.optional_text("file");
         if (!file) {
           if (!ctx.params.has("file")) {
             ctx.params.error({}, fmt::format("{} needs 'file'", ctx.params.path()),
                              "a CSV of past orders with columns store,item,day,quantity (or "
                              "date instead of day), relative to the scenario file");
           }
           return nullptr;
         }
         auto orders = read_orders(ctx, *file);
         if (!orders) return nullptr;
         return std::make_unique<Replay>(std::move(*orders));
       }});
}

}  // namespace larder
