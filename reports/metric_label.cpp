#include "reports/metric_label.hpp"

#include <fmt/format.h>

#include <array>

namespace larder {

namespace {

constexpr std::array kLabels = std::to_array<MetricLabel>({
    {"demand_units", "Demand", "units"},
    {"sold_units", "Units sold", "units"},
    {"substitute_units", "Sold to customers whose first choice was out", "units"},
    {"lost_units", "Customers lost", "customers who left without buying"},
    {"waste_units", "Waste", "units"},
    {"salvaged_units", "Salvaged", "units"},
    {"donated_units", "Donated", "units"},
    {"delivered_units", "Delivered", "units"},
    {"discounted_units", "Sold at a discount", "units"},
    {"waste_share", "Waste", "% of units delivered"},
    {"in_stock_at_close", "In stock at close", "% of open store-item-days"},
    {"no_stockout_share", "Every customer served", "% of open store-item-days"},
    {"fill_rate", "Fill rate", "% of demand served by the item"},
    {"served_share", "Served, substitutes included", "% of demand"},
    {"revenue", "Revenue", "money"},
    {"full_price_revenue", "Revenue at full price", "money"},
    {"discount_revenue", "Revenue at discounted prices", "money"},
    {"salvage_revenue", "Salvage revenue", "money"},
    {"purchase_cost", "Purchase cost", "money"},
    {"disposal_cost", "Disposal cost", "money"},
    {"penalty_cost", "Stockout penalty", "money"},
    {"profit", "Profit", "money"},
    {"waste_value", "Waste at cost", "money"},
    {"waste_kg", "Waste", "kg"},
    {"co2e_kg", "Waste", "kg CO2e"},
    {"surplus_units", "Surplus (not sold at full price before its last close)", "units"},
    {"surplus_share", "Surplus", "% of units delivered"},
    {"surplus_kg", "Surplus", "kg"},
    {"surplus_co2e_kg", "Surplus", "kg CO2e"},
    {"donated_kg", "Donated", "kg"},
    {"donated_co2e_kg", "Donated", "kg CO2e"},
    {"salvaged_kg", "Salvaged", "kg"},
    {"salvaged_co2e_kg", "Salvaged", "kg CO2e"},
    {"discounted_kg", "Sold at a discount", "kg"},
    {"discounted_co2e_kg", "Sold at a discount", "kg CO2e"},
});

bool is_share(std::string_view unit) {
  return unit.starts_with('%');
}

}  // namespace

std::span<const MetricLabel> metric_labels() {
  return kLabels;
}

const MetricLabel* find_metric_label(std::string_view field) {
  for (const MetricLabel& l : kLabels) {
    if (l.field == field) return &l;
  }
  return nullptr;
}

std::string metric_words(std::string_view field) {
  const MetricLabel* l = find_metric_label(field);
  return std::string(l != nullptr ? l->words : field);
}

std::string metric_words(Metric m) {
  return metric_words(metric_name(m));
}

std::string metric_unit(std::string_view field, std::string_view currency, bool difference) {
  const MetricLabel* l = find_metric_label(field);
  if (l == nullptr) return {};
  if (l->unit == "money") return std::string(currency.empty() ? "money" : currency);
  if (difference && is_share(l->unit)) return "% points";
  return std::string(l->unit);
}

std::string metric_unit(Metric m, std::string_view currency, bool difference) {
  return metric_unit(metric_name(m), currency, difference);
}

std::string metric_label(std::string_view field, std::string_view currency, bool difference) {
  const MetricLabel* l = find_metric_label(field);
  if (l == nullptr) return std::string(field);
  return fmt::format("{} ({})", l->words, metric_unit(field, currency, difference));
}

std::string metric_label(Metric m, std::string_view currency, bool difference) {
  return metric_label(metric_name(m), currency, difference);
}

}  // namespace larder
