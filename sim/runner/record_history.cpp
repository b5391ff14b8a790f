#include "sim/runner/record_history.hpp"

#include <cmath>

namespace larder {

CivilDate history_start_date(const Scenario& scenario) {
  if (scenario.horizon.start_date) {
    if (const auto d = parse_iso_date(*scenario.horizon.start_date); d && is_real_date(*d)) {
      return *d;
    }
  }
  const CivilDate monday{2027, 1, 4};
  const int shift = (scenario.horizon.start_weekday - weekday_of_date(monday) + 7) % 7;
  return add_days(monday, shift);
}

HistoryRecorder::HistoryRecorder(const Scenario& scenario, std::span<const Policy> policies,
                                 int policy, int replication, tbb::task_arena& arena)
    : scenario_(scenario),
      policy_(policy),
      demand_(scenario),
      setup_{scenario, demand_, policies, scenario.seed},
      runs_(setup_, replication, 1, arena) {
  if (!scenario.stores.empty() && runs_.run(0, 0).hourly()) {
    columns_.has_sold_out_time = true;
    columns_.first_hour = scenario.calendar.open_hour;
    columns_.hours = scenario.hours();
  }
}

void HistoryRecorder::run(const std::function<void(const HistoryRow&)>& sink,
                          const std::function<void(int, int)>& progress) {
  const Scenario& sc = scenario_;
  const int days = sc.horizon.days;
  const CivilDate start = history_start_date(sc);
  const int open_minute = sc.calendar.open_hour * 60;
  HistoryRow row;
  row.hourly_sales.assign(static_cast<size_t>(columns_.hours), 0);
  for (int t = 0; t < days; ++t) {
    runs_.run_until(t + 1);
    row.date = add_days(start, t);
    for (size_t s = 0; s < sc.stores.size(); ++s) {
      const StoreRun& run = runs_.run(0, static_cast<int>(s));
      if (!run.is_open(t)) continue;
      row.store = sc.stores[s].id;
      const std::span<const Observation> obs = run.observations(policy_);
      for (size_t i = 0; i < sc.items.size(); ++i) {
        const Observation& o = obs[i];
        const int item = static_cast<int>(i);
        row.item = sc.items[i].id;
        row.delivered = o.delivered;
        row.sold = o.sold;
        row.leftover = o.leftover;
        row.sold_out = o.sold_out;
        row.sold_out_minute.reset();
        if (columns_.has_sold_out_time && o.sold_out) {
          const float h = run.sellout_hour(policy_, item);
          if (!std::isnan(h)) {
            row.sold_out_minute =
                open_minute + static_cast<int>(std::floor(static_cast<double>(h) * 60.0));
          }
        }
        if (columns_.hours > 0) run.sales_by_hour(policy_, item, row.hourly_sales);
        sink(row);
      }
    }
    if (progress) progress(t + 1, days);
  }
}

}  // namespace larder
