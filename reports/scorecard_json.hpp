#pragma once
// scorecard.json: a drill's scorecard for programs and for `larder drill --summary`.
// Layout (format "larder-drill-scorecard", format_version 1):
//   facts: scenario, trainee, seed, store, items, currency, first_day (scenario day of drill
//   day 1), days, events [{day, demand, announced}], larder_version;
//   "policies": [{name, role ("trainee", "house" or "comparison"), metrics: {<model.md metric>:
//   value}, daily: {waste_units, in_stock_at_close, fill_rate, profit: [one per drill day]}}],
//   the trainee first;
//   "differences": [{policy, metrics: {<metric>: trainee minus policy}, daily: {...}}] per
//   comparison policy;
//   "weekdays": one per drill day;
//   "habits": [{item ("all" first, then each item), chasing_weight, pull_to_center: {value,
//   stderr, n}, implied_service, justified_service, orders}];
//   "trainee_days": [{item, days: [{day, ordered, open_stock, sold, sold_out, demand,
//   thrown_out}]}].
// Values that are not numbers (a share of nothing) are null.

#include <string>

#include "sim/drill/scorecard.hpp"

namespace larder {

/// The JSON text, indented by 2, with a final newline.
std::string scorecard_json_text(const Scorecard& card);

}  // namespace larder
