// `larder history`'s rows against the engine's own accounts and against rules outside the
// recorder: stock conservation of a one-day item (delivered = sold + leftover, everything left
// is discarded), the sold-out flag as "nothing left at close", the run's own scored-day
// metrics for the same policy and replication (RunResult, computed by the runner from its
// tallies, not from these rows), the daily trace's Observation values, and the strict history
// reader, which must accept every file the engine writes.

#include "sim/runner/record_history.hpp"

#include <catch2/catch.hpp>
#include <cmath>
#include <map>
#include <sstream>

#include "reports/history_csv.hpp"
#include "sim/engine/store_run.hpp"
#include "sim/history/history_reader.hpp"
#include "sim/runner/daily_trace.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

struct Recorded {
  HistoryColumns columns;
  std::vector<HistoryRow> rows;
};

Recorded record(const Scenario& s, const std::vector<Policy>& policies, int policy,
                int replication = 0, int threads = 1) {
  tbb::task_arena arena(threads);
  HistoryRecorder recorder(s, policies, policy, replication, arena);
  Recorded r;
  r.columns = recorder.columns();
  recorder.run([&](const HistoryRow& row) { r.rows.push_back(row); });
  return r;
}

/// Writes the rows as CSV and reads them back with the strict reader (throws on any problem).
std::vector<HistoryRow> through_csv(const Recorded& r) {
  std::string text = history_csv_header(r.columns);
  for (const HistoryRow& row : r.rows) append_history_csv_row(text, row, r.columns);
  std::istringstream in(text);
  std::vector<HistoryRow> back;
  const HistoryColumns c =
      read_history(in, "engine.csv", [&](const HistoryRow& row) { back.push_back(row); });
  CHECK(c.has_sold_out_time == r.columns.has_sold_out_time);
  CHECK(c.hours == r.columns.hours);
  return back;
}

int day_index(const CivilDate& start, const CivilDate& d) {
  for (int t = 0; t < 4000; ++t) {
    if (add_days(start, t) == d) return t;
  }
  FAIL("date out of range");
  return -1;
}

bool same(const HistoryRow& a, const HistoryRow& b) {
  return a.date == b.date && a.store == b.store && a.item == b.item && a.delivered == b.delivered &&
         a.sold == b.sold && a.leftover == b.leftover && a.sold_out == b.sold_out &&
         a.sold_out_minute == b.sold_out_minute && a.hourly_sales == b.hourly_sales;
}

// One-day items, a store closed on Sundays and one closure day, a learning policy and an
// oracle one.
const char* kOneDay = R"(
format: 1
name: history-one-day
seed: 21
horizon: { days: 50, warmup_days: 10, start_date: 2027-03-03 }
replications: 3
calendar: { events: [ { day: 20, closed: true } ] }
stores:
  - { id: corner, open_weekdays: [mon, tue, wed, thu, fri, sat] }
  - { id: main-north }
items:
  - { id: bun, price: 1, unit_cost: 0.3, demand: { base: 14 } }
  - { id: tart, price: 3, unit_cost: 1.2, demand: { base: 5, distribution: negative_binomial, cv: 0.5 } }
policies:
  - { name: learner, forecast: { method: ses_weekday, alpha: 0.2 }, quantity: { rule: critical_fractile } }
  - { name: oracle, forecast: { method: oracle }, quantity: { rule: critical_fractile } }
)";

TEST_CASE("history rows of one-day items conserve stock and match the run's metrics", "[history]") {
  const Scenario s = test::scenario_from(kOneDay);
  const std::vector<Policy> policies = test::policies_for(s);
  RunOptions o;
  o.threads = 1;
  const RunResult run = run_policies(s, policies, o);
  const CivilDate start{2027, 3, 3};
  CHECK(history_start_date(s) == start);
  for (int k = 0; k < 2; ++k) {
    for (int rep : {0, 2}) {
      INFO("policy " << k << ", replication " << rep);
      const Recorded r = record(s, policies, k, rep);
      CHECK(!r.columns.has_sold_out_time);  // no feature depends on the hour
      CHECK(r.columns.hours == 0);
      // Every open store-item-day once: corner is closed on 7 Sundays of the 50 days (starting
      // on Wednesday 2027-03-03, days 4, 11, ..., 46) and both on day 20.
      int corner_open = 0;
      for (int t = 0; t < 50; ++t) corner_open += s.is_open(0, t) ? 1 : 0;
      CHECK(corner_open == 50 - 7 - 1);
      CHECK(r.rows.size() == static_cast<size_t>((corner_open + 49) * 2));
      double sold = 0, delivered = 0, leftover = 0;
      int sold_out_days = 0;
      for (const HistoryRow& row : r.rows) {
        const int t = day_index(start, row.date);
        CHECK(s.is_open(row.store == "corner" ? 0 : 1, t));
        // A one-day item: the day's stock is its delivery, and what is left is discarded.
        CHECK(row.delivered == row.sold + row.leftover);
        CHECK(row.sold_out == (row.leftover == 0));
        if (t < 10) continue;  // warm-up days are recorded but not scored
        sold += row.sold;
        delivered += row.delivered;
        leftover += row.leftover;
        sold_out_days += row.sold_out ? 1 : 0;
      }
      const MetricVector& m = run.values[static_cast<size_t>(k)][static_cast<size_t>(rep)];
      CHECK(sold == at(m, Metric::sold_units));
      CHECK(delivered == at(m, Metric::delivered_units));
      CHECK(leftover == at(m, Metric::waste_units));
      const double open_days =
          static_cast<double>(std::count_if(r.rows.begin(), r.rows.end(), [&](const HistoryRow& x) {
            return day_index(start, x.date) >= 10;
          }));
      CHECK(1.0 - sold_out_days / open_days == Approx(at(m, Metric::in_stock_at_close)));
      CHECK(sold_out_days > 0);  // the case says something
      // The strict reader accepts the engine's file and gives back the same rows.
      const std::vector<HistoryRow> back = through_csv(r);
      REQUIRE(back.size() == r.rows.size());
      for (size_t j = 0; j < back.size(); ++j) CHECK(same(back[j], r.rows[j]));
    }
  }
}

TEST_CASE("history rows show the daily trace's observations of the traced store-item",
          "[history]") {
  const Scenario s = test::scenario_from(kOneDay);
  const std::vector<Policy> policies = test::policies_for(s);
  const DailyTrace trace = daily_trace(s, policies);
  REQUIRE(trace.traces.size() == 2);
  const Recorded r = record(s, policies, 1);  // the oracle policy
  std::map<int, const HistoryRow*> by_day;
  for (const HistoryRow& row : r.rows) {
    if (row.store == trace.store && row.item == trace.item) {
      by_day[day_index({2027, 3, 3}, row.date)] = &row;
    }
  }
  const std::vector<TraceDay>& days = trace.traces[1].days;
  REQUIRE(days.size() == 42);
  int compared = 0;
  for (size_t t = 0; t < days.size(); ++t) {
    const auto it = by_day.find(static_cast<int>(t));
    INFO("day " << t);
    CHECK((it != by_day.end()) == days[t].open);  // a row exactly on open days
    if (it == by_day.end()) continue;
    CHECK(it->second->delivered == days[t].delivered);
    CHECK(it->second->sold == days[t].sold);
    CHECK(it->second->leftover == days[t].leftover);
    CHECK(it->second->sold_out == (days[t].open && days[t].leftover == 0));
    // No true demand in the file, but the trace knows it: a sold-out day is censored.
    if (it->second->sold_out) CHECK(days[t].demand >= it->second->sold);
    ++compared;
  }
  CHECK(compared == 42 - 6 - 1);  // Sundays on days 4, 11, 18, 25, 32, 39 and day 20
}

TEST_CASE("history of an hourly scenario: sell-out times and sales by hour", "[history]") {
  // Evening markdown makes the days hourly; `watcher` observes intraday, `blind` does not,
  // and both histories carry the times: the store records them whatever the policy looks at.
  const Scenario s = test::scenario_from(R"(
format: 1
name: history-hourly
seed: 8
horizon: { days: 40, warmup_days: 7 }
replications: 2
calendar: { hours: { open: 7, close: 19 } }
stores: [ { id: s } ]
items:
  - { id: bun, price: 1, unit_cost: 0.3, demand: { base: 20, intraday: morning_peak } }
  - { id: pie, price: 4, unit_cost: 1.5, shelf_life_days: 2, demand: { base: 8 } }
policies:
  - { name: watcher, observe: intraday, forecast: { method: ses_weekday }, quantity: { rule: in_stock_target, level: 0.5 } }
  - { name: blind, forecast: { method: ses_weekday }, quantity: { rule: in_stock_target, level: 0.5 } }
)");
  const std::vector<Policy> policies = test::policies_for(s);
  RunOptions o;
  o.threads = 1;
  const RunResult run = run_policies(s, policies, o);
  for (int k = 0; k < 2; ++k) {
    INFO("policy " << k);
    const Recorded r = record(s, policies, k);
    CHECK(r.columns.has_sold_out_time);
    CHECK(r.columns.first_hour == 7);
    CHECK(r.columns.hours == 12);
    int timed = 0;
    double sold = 0;
    for (const HistoryRow& row : r.rows) {
      REQUIRE(row.hourly_sales.size() == 12);
      int total = 0, last_hour = -1;
      for (int h = 0; h < 12; ++h) {
        total += row.hourly_sales[static_cast<size_t>(h)];
        if (row.hourly_sales[static_cast<size_t>(h)] > 0) last_hour = h;
      }
      CHECK(total == row.sold);
      CHECK(row.sold_out_minute.has_value() == row.sold_out);
      if (row.sold_out_minute) {
        // Within opening hours, and in the hour of the last sale (or at opening when there
        // was nothing to sell): two engine outputs computed separately agree.
        CHECK(*row.sold_out_minute >= 7 * 60);
        CHECK(*row.sold_out_minute < 19 * 60);
        CHECK(*row.sold_out_minute / 60 - 7 == std::max(last_hour, 0));
        ++timed;
      }
      if (day_index(history_start_date(s), row.date) >= 7) sold += row.sold;
    }
    CHECK(timed > 5);
    CHECK(sold == at(run.values[static_cast<size_t>(k)][0], Metric::sold_units));
    CHECK(through_csv(r).size() == r.rows.size());
  }
}

TEST_CASE("the store records sell-out times without changing what a policy observes", "[history]") {
  // `watcher` observes intraday, `blind` does not: only watcher's Observation carries the
  // time, and it is the time the store records (StoreRun::sellout_hour) for both.
  const Scenario s = test::scenario_from(R"(
format: 1
name: history-view
seed: 5
horizon: { days: 30, warmup_days: 0 }
replications: 1
stores: [ { id: s } ]
items:
  - { id: bun, price: 1, unit_cost: 0.3, demand: { base: 20 } }
policies:
  - { name: watcher, observe: intraday, forecast: { method: oracle }, quantity: { rule: fixed, quantity: 19 } }
  - { name: blind, forecast: { method: oracle }, quantity: { rule: fixed, quantity: 19 } }
)");
  const std::vector<Policy> policies = test::policies_for(s);
  const DemandModel demand(s);
  const SimSetup setup{s, demand, policies, s.seed};
  StoreRun run(setup, 0, 0);
  REQUIRE(run.hourly());
  int sold_out = 0;
  for (int t = 0; t < 30; ++t) {
    run.run_days(t, t + 1);
    const Observation& w = run.observations(0)[0];
    const Observation& b = run.observations(1)[0];
    INFO("day " << t);
    CHECK(std::isnan(b.sellout_hour));  // the blind policy's view has no time
    CHECK(w.sold_out == b.sold_out);    // the same quantity and customers: the same day
    if (!w.sold_out) {
      CHECK(std::isnan(w.sellout_hour));
      CHECK(std::isnan(run.sellout_hour(0, 0)));
      continue;
    }
    ++sold_out;
    CHECK(w.sellout_hour == run.sellout_hour(0, 0));
    CHECK(run.sellout_hour(1, 0) == run.sellout_hour(0, 0));
  }
  // P(Poisson(20) >= 19) = 0.6186 (/usr/bin/python3: 1 - scipy.stats.poisson.cdf(18, 20)):
  // both branches occur.
  CHECK(sold_out > 5);
  CHECK(sold_out < 29);
}

TEST_CASE("history of a network-planned policy re-plans across stores as the run does",
          "[history]") {
  const Scenario s = test::scenario_from(R"(
format: 1
name: history-network
seed: 4
horizon: { days: 35, warmup_days: 7, start_weekday: thu }
replications: 2
stores: [ { id: a }, { id: b, size: 0.6 } ]
items:
  - { id: roll, price: 1.5, unit_cost: 0.4, demand: { base: 30 } }
  - { id: cake, price: 5, unit_cost: 2, shelf_life_days: 3, demand: { base: 6 } }
policies:
  - { name: net, forecast: { method: ses_weekday }, quantity: { rule: network_in_stock, target: 0.7 } }
)");
  const std::vector<Policy> policies = test::policies_for(s);
  RunOptions o;
  o.threads = 2;
  const RunResult run = run_policies(s, policies, o);
  const Recorded r = record(s, policies, 0, 1, 2);
  // Without start_date: the invented first date falls on the scenario's start weekday.
  const CivilDate start = history_start_date(s);
  CHECK(weekday_of_date(start) == 3);  // Thursday
  CHECK(r.rows.front().date == start);
  CHECK(r.rows.size() == 35u * 2 * 2);
  double sold = 0, delivered = 0;
  for (const HistoryRow& row : r.rows) {
    if (day_index(start, row.date) < 7) continue;
    sold += row.sold;
    delivered += row.delivered;
  }
  CHECK(sold == at(run.values[0][1], Metric::sold_units));
  CHECK(delivered == at(run.values[0][1], Metric::delivered_units));
  // A three-day item: the reader's stock rule (sold <= delivered + previous leftover) holds.
  CHECK(through_csv(r).size() == r.rows.size());
}

}  // namespace
}  // namespace larder
