#include "sim/engine/tally.hpp"

#include <cassert>

namespace larder {

void Tally::add(const Tally& o) {
  demand += o.demand;
  served_by_item += o.served_by_item;
  substitute += o.substitute;
  bargain += o.bargain;
  sold_next_day += o.sold_next_day;
  sold_markdown += o.sold_markdown;
  lost += o.lost;
  wasted += o.wasted;
  salvaged += o.salvaged;
  donated += o.donated;
  delivered += o.delivered;
  open_days += o.open_days;
  in_stock_days += o.in_stock_days;
  no_stockout_days += o.no_stockout_days;
}

namespace {
double ratio(std::int64_t num, std::int64_t den, double if_empty) {
  return den == 0 ? if_empty : static_cast<double>(num) / static_cast<double>(den);
}
}  // namespace

MetricVector compute_metrics(std::span<const Tally> per_item, std::span<const Item> items) {
  assert(per_item.size() == items.size());
  Tally t;
  MetricVector v{};
  for (size_t i = 0; i < items.size(); ++i) {
    const Tally& c = per_item[i];
    const Item& it = items[i];
    t.add(c);
    const auto d = [](std::int64_t n) { return static_cast<double>(n); };
    const std::int64_t discounted = c.sold_next_day + c.sold_markdown;
    at(v, Metric::full_price_revenue) += d(c.sold() - discounted) * it.price;
    if (it.next_day) at(v, Metric::discount_revenue) += d(c.sold_next_day) * it.next_day->price;
    if (it.markdown) at(v, Metric::discount_revenue) += d(c.sold_markdown) * it.markdown->price;
    at(v, Metric::salvage_revenue) += d(c.salvaged) * it.salvage_value;
    at(v, Metric::purchase_cost) += d(c.delivered) * it.unit_cost;
    at(v, Metric::disposal_cost) += d(c.wasted) * it.disposal_cost;
    at(v, Metric::penalty_cost) += d(c.lost) * it.stockout_penalty;
    at(v, Metric::waste_value) += d(c.wasted) * it.unit_cost;
    const double kg = it.weight_kg.value_or(0.0);
    const double co2e = it.co2e_kg.value_or(0.0);
    at(v, Metric::waste_kg) += d(c.wasted) * kg;
    at(v, Metric::co2e_kg) += d(c.wasted) * co2e;
    at(v, Metric::donated_kg) += d(c.donated) * kg;
    at(v, Metric::donated_co2e_kg) += d(c.donated) * co2e;
    at(v, Metric::salvaged_kg) += d(c.salvaged) * kg;
    at(v, Metric::salvaged_co2e_kg) += d(c.salvaged) * co2e;
    at(v, Metric::discounted_kg) += d(discounted) * kg;
    at(v, Metric::discounted_co2e_kg) += d(discounted) * co2e;
    const std::int64_t surplus = c.wasted + c.donated + c.salvaged + discounted;
    at(v, Metric::surplus_kg) += d(surplus) * kg;
    at(v, Metric::surplus_co2e_kg) += d(surplus) * co2e;
  }
  at(v, Metric::demand_units) = static_cast<double>(t.demand);
  at(v, Metric::sold_units) = static_cast<double>(t.sold());
  at(v, Metric::discounted_units) = static_cast<double>(t.sold_next_day + t.sold_markdown);
  at(v, Metric::substitute_units) = static_cast<double>(t.substitute);
  at(v, Metric::lost_units) = static_cast<double>(t.lost);
  at(v, Metric::waste_units) = static_cast<double>(t.wasted);
  at(v, Metric::salvaged_units) = static_cast<double>(t.salvaged);
  at(v, Metric::donated_units) = static_cast<double>(t.donated);
  const std::int64_t surplus =
      t.wasted + t.donated + t.salvaged + t.sold_next_day + t.sold_markdown;
  at(v, Metric::surplus_units) = static_cast<double>(surplus);
  at(v, Metric::surplus_share) = ratio(surplus, t.delivered, 0.0);
  at(v, Metric::delivered_units) = static_cast<double>(t.delivered);
  at(v, Metric::waste_share) = ratio(t.wasted, t.delivered, 0.0);
  at(v, Metric::in_stock_at_close) = ratio(t.in_stock_days, t.open_days, 0.0);
  at(v, Metric::no_stockout_share) = ratio(t.no_stockout_days, t.open_days, 1.0);
  at(v, Metric::fill_rate) = ratio(t.served_by_item, t.demand, 1.0);
  at(v, Metric::served_share) = ratio(t.served_by_item + t.substitute, t.demand, 1.0);
  at(v, Metric::revenue) = at(v, Metric::full_price_revenue) + at(v, Metric::discount_revenue) +
                           at(v, Metric::salvage_revenue);
  at(v, Metric::profit) = at(v, Metric::revenue) - at(v, Metric::purchase_cost) -
                          at(v, Metric::disposal_cost) - at(v, Metric::penalty_cost);
  return v;
}

}  // namespace larder
