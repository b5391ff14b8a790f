#pragma once
// The trainee's store orders as a quantity rule: a table of quantities by order day and item
// that the drill fills in (the house rule's orders for the warm-up and the items not drilled,
// the trainee's decisions for the drill items) before it runs the engine. Unlike `replay`,
// the table lives outside the rule, so a drill can fill it in day by day between runs.

#include <memory>
#include <vector>

#include "policies/quantity_rule.hpp"

namespace larder {

/// Order quantities for order days -lead .. days - 1 (placed after the close of that day), one
/// per item; 0 where nothing was set.
class OrderTable {
 public:
  OrderTable(int lead_time, int days, int items);
  int get(int order_day, int item) const;
  void set(int order_day, int item, int quantity);
  int lead_time() const { return lead_; }
  int days() const { return days_; }
  int items() const { return items_; }

 private:
  std::size_t index(int order_day, int item) const;
  int lead_;
  int days_;
  int items_;
  std::vector<int> quantity_;
};

/// A quantity method whose rules order what `table` says (it must outlive the method's rules).
std::unique_ptr<QuantityMethod> order_table_method(const OrderTable& table);

}  // namespace larder
