// The table of metric names in words: every metric of the enumeration has a line, its unit
// agrees with the metric's unit kind, and labels read as the pages show them.

#include "reports/metric_label.hpp"

#include <catch2/catch.hpp>
#include <set>

namespace larder {
namespace {

TEST_CASE("every metric has words and a unit that agrees with its kind", "[html]") {
  for (std::size_t k = 0; k < kMetricCount; ++k) {
    const Metric m = static_cast<Metric>(k);
    const MetricInfo& info = metric_info(m);
    INFO(info.name);
    const MetricLabel* l = find_metric_label(info.name);
    REQUIRE(l != nullptr);
    CHECK(!l->words.empty());
    if (info.unit == "share") CHECK(l->unit.starts_with('%'));
    if (info.unit == "money") CHECK(l->unit == "money");
    if (info.unit == "kg") CHECK(l->unit.starts_with("kg"));
    if (info.unit == "units") CHECK(!l->unit.starts_with('%'));
  }
  std::set<std::string_view> fields;
  for (const MetricLabel& l : metric_labels()) CHECK(fields.insert(l.field).second);
}

TEST_CASE("metric labels read as the pages show them", "[html]") {
  CHECK(metric_label(Metric::waste_share, "EUR") == "Waste (% of units delivered)");
  CHECK(metric_label(Metric::waste_share, "EUR", true) == "Waste (% points)");
  CHECK(metric_label(Metric::profit, "EUR") == "Profit (EUR)");
  CHECK(metric_label(Metric::profit, "") == "Profit (money)");
  CHECK(metric_label(Metric::co2e_kg, "") == "Waste (kg CO2e)");
  CHECK(metric_label(Metric::in_stock_at_close, "") ==
        "In stock at close (% of open store-item-days)");
  CHECK(metric_words(Metric::lost_units) == "Customers lost");
  // A field the table does not know shows as itself.
  CHECK(metric_label("not_a_metric", "EUR") == "not_a_metric");
  CHECK(metric_words("not_a_metric") == "not_a_metric");
  CHECK(metric_unit("not_a_metric", "EUR").empty());
}

}  // namespace
}  // namespace larder
