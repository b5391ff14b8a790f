#include "sim/drill/order_table.hpp"

#include <algorithm>
#include <stdexcept>

namespace larder {

OrderTable::OrderTable(int lead_time, int days, int items)
    : lead_(lead_time),
      days_(days),
      items_(items),
      quantity_(static_cast<std::size_t>((days + lead_time) * items), 0) {}

std::size_t OrderTable::index(int order_day, int item) const {
  if (order_day < -lead_ || order_day >= days_ || item < 0 || item >= items_) {
    throw std::out_of_range("order table: day or item out of range");
  }
  return static_cast<std::size_t>((order_day + lead_) * items_ + item);
}

int OrderTable::get(int order_day, int item) const {
  if (order_day < -lead_ || order_day >= days_) return 0;
  return quantity_[index(order_day, item)];
}

void OrderTable::set(int order_day, int item, int quantity) {
  quantity_[index(order_day, item)] = std::max(quantity, 0);
}

namespace {

class TableRule : public OrderRule {
 public:
  explicit TableRule(const OrderTable& table) : table_(&table) {}
  void decide(const OrderContext& ctx, std::span<const OrderInput>, std::span<int> out) override {
    for (std::size_t i = 0; i < out.size(); ++i) {
      out[i] = table_->get(ctx.order_day, static_cast<int>(i));
    }
  }

 private:
  const OrderTable* table_;
};

class TableMethod : public QuantityMethod {
 public:
  explicit TableMethod(const OrderTable& table) : table_(&table) {}
  std::unique_ptr<OrderRule> make(const StoreView&) const override {
    return std::make_unique<TableRule>(*table_);
  }

 private:
  const OrderTable* table_;
};

}  // namespace

std::unique_ptr<QuantityMethod> order_table_method(const OrderTable& table) {
  return std::make_unique<TableMethod>(table);
}

}  // namespace larder
