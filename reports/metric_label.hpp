#pragma once
// Metric names for people: the one table that maps a field name of the output files
// (`waste_share`, `in_stock_at_close`) to words with a unit ("Waste (% of units delivered)").
// Every page (report, sweep, allocation, scorecard) takes its row labels, axis titles and
// sentences from here. The table is keyed by the field name, so a metric added to
// sim/engine/metric.cpp needs one line here (a test checks every metric has one); a field
// without a line shows as its field name.

#include <span>
#include <string>
#include <string_view>

#include "sim/engine/metric.hpp"

namespace larder {

/// One metric in words: `words` ("Waste") and the unit of its values ("% of units
/// delivered", "units", "kg CO2e"; "money" stands for the run's currency).
struct MetricLabel {
  std::string_view field;
  std::string_view words;
  std::string_view unit;
};

/// The whole table, in the order of the Metric enumeration (then fields to come).
std::span<const MetricLabel> metric_labels();

/// The line of `field`, or nullptr when the table has none.
const MetricLabel* find_metric_label(std::string_view field);

/// The words of a metric ("Waste"); the field name itself when the table has no line.
std::string metric_words(std::string_view field);
std::string metric_words(Metric m);

/// The unit as a page shows it: "money" becomes `currency` (or stays "money" without one);
/// with `difference`, a share's unit is "% points".
std::string metric_unit(std::string_view field, std::string_view currency, bool difference = false);
std::string metric_unit(Metric m, std::string_view currency, bool difference = false);

/// "Waste (% of units delivered)", "Profit (EUR)"; with `difference`, "Waste (% points)".
std::string metric_label(std::string_view field, std::string_view currency,
                         bool difference = false);
std::string metric_label(Metric m, std::string_view currency, bool difference = false);

}  // namespace larder
