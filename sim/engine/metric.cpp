#include "sim/engine/metric.hpp"

namespace larder {

namespace {
constexpr std::array<MetricInfo, kMetricCount> kInfo = {{
    {"demand_units", "units", "primary customers (true demand)", 0},
    {"sold_units", "units", "units sold to customers at any price", 0},
    {"substitute_units", "units", "units sold to customers whose first choice was out", 0},
    {"lost_units", "units", "customers who left without buying", -1},
    {"waste_units", "units", "units discarded", -1},
    {"salvaged_units", "units", "units sold to a secondary outlet at the salvage value", 0},
    {"donated_units", "units", "units given away (not waste)", 0},
    {"delivered_units", "units", "units delivered", 0},
    {"discounted_units", "units", "units sold at a discounted price (next-day or markdown)", 0},
    {"waste_share", "share", "waste_units / delivered_units", -1},
    {"in_stock_at_close", "share", "open store-item-days with a unit left at close", +1},
    {"no_stockout_share", "share",
     "open store-item-days on which every customer was served (type 1)", +1},
    {"fill_rate", "share", "customers served by the item itself / demand (type 2)", +1},
    {"served_share", "share", "customers served by the item or a substitute / demand", +1},
    {"revenue", "money", "sales revenue at every price, plus salvage revenue", +1},
    {"full_price_revenue", "money", "units sold at full price x price", +1},
    {"discount_revenue", "money", "units sold at the next-day or markdown price x that price", 0},
    {"salvage_revenue", "money", "salvaged units x salvage value", 0},
    {"purchase_cost", "money", "delivered units x unit cost", -1},
    {"disposal_cost", "money", "wasted units x disposal cost", -1},
    {"penalty_cost", "money", "customers who left without buying x stockout penalty", -1},
    {"profit", "money", "revenue - purchase, disposal and penalty costs", +1},
    {"waste_value", "money", "wasted units x unit cost", -1},
    {"waste_kg", "kg", "wasted units x weight", -1},
    {"co2e_kg", "kg", "wasted units x CO2e per unit", -1},
    {"surplus_units", "units",
     "units that did not sell at full price before their last day's close: wasted + donated + "
     "salvaged + sold at a discount",
     -1},
    {"surplus_share", "share", "surplus_units / delivered_units", -1},
    {"surplus_kg", "kg", "surplus units x weight", -1},
    {"surplus_co2e_kg", "kg", "surplus units x CO2e per unit", -1},
    {"donated_kg", "kg", "donated units x weight", 0},
    {"donated_co2e_kg", "kg", "donated units x CO2e per unit", 0},
    {"salvaged_kg", "kg", "salvaged units x weight", 0},
    {"salvaged_co2e_kg", "kg", "salvaged units x CO2e per unit", 0},
    {"discounted_kg", "kg", "units sold at a discount x weight", 0},
    {"discounted_co2e_kg", "kg", "units sold at a discount x CO2e per unit", 0},
}};
}  // namespace

const MetricInfo& metric_info(Metric m) {
  return kInfo[static_cast<std::size_t>(m)];
}

}  // namespace larder
