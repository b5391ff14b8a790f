// `larder history` then `larder fit`, in process: a known scenario is recorded under an
// ordering policy that sells out often, written as CSV, read back by the strict reader, and
// fitted. The censored-likelihood estimates must come back within 4 of their standard errors
// (observed information), the intraday profile within 4 multinomial standard errors of the
// scenario's (days that did not sell out keep all their customers, and the engine splits a
// day's customers over the hours multinomially), the exposure MLE of checks.md 3(c) within 4
// Poisson standard errors for the Poisson item, and the written scenario must load.

#include <catch2/catch.hpp>
#include <cmath>
#include <sstream>

#include "reports/history_csv.hpp"
#include "sim/fit/scenario_writer.hpp"
#include "sim/history/history_reader.hpp"
#include "sim/runner/record_history.hpp"
#include "sim/scenario/intraday_profile.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

const char* kKnown = R"(
format: 1
name: fit-round-trip
seed: 77
horizon: { days: 364, warmup_days: 0, start_date: 2027-01-04 }
replications: 1
calendar: { hours: { open: 8, close: 20 } }
stores:
  - { id: north, size: 0.7 }
  - { id: south, size: 1.3 }
  - { id: east, size: 1.0 }
items:
  - id: loaf
    price: 3
    unit_cost: 1
    demand:
      base: 30
      weekday: { mon: 0.8, tue: 0.9, wed: 0.9, thu: 1.0, fri: 1.1, sat: 1.3, sun: 1.0 }
      distribution: normal
      cv: 0.3
      intraday: morning_peak
  - id: bun
    price: 1
    unit_cost: 0.3
    demand:
      base: 12
      weekday: { mon: 1.2, tue: 1.0, wed: 0.9, thu: 0.9, fri: 1.0, sat: 1.0, sun: 1.0 }
      intraday: evening_peak
policies:
  - name: habit
    forecast: { method: ses_weekday, alpha: 0.2 }
    quantity: { rule: in_stock_target, level: 0.6, assume: normal }
    observe: intraday
)";

/// The history of `s` under its first policy, through the CSV writer and the strict reader.
FitData recorded_history(const Scenario& s) {
  const std::vector<Policy> policies = test::policies_for(s);
  tbb::task_arena arena(1);
  HistoryRecorder recorder(s, policies, 0, 0, arena);
  std::string text = history_csv_header(recorder.columns());
  recorder.run(
      [&](const HistoryRow& row) { append_history_csv_row(text, row, recorder.columns()); });
  std::istringstream in(text);
  SeriesBuilder b("recorded.csv");
  const HistoryColumns columns =
      read_history(in, "recorded.csv", [&](const HistoryRow& r) { b.add(r); });
  return b.finish(columns);
}

TEST_CASE("history then fit: the scenario's demand comes back", "[fit]") {
  const Scenario truth = test::scenario_from(kKnown);
  FitData data = recorded_history(truth);
  REQUIRE(data.columns.hours == 12);
  REQUIRE(data.columns.has_sold_out_time);
  const FitResult r = fit_history(std::move(data), FitOptions{});
  const std::vector<std::string> store_ids = {"north", "south", "east"};
  for (size_t k = 0; k < r.fit.stores.size(); ++k) {
    const StoreEstimate& s = r.fit.stores[k];
    const double size =
        truth
            .stores[static_cast<size_t>(std::find(store_ids.begin(), store_ids.end(), s.id) -
                                        store_ids.begin())]
            .size;
    INFO(s.id);
    CHECK(std::abs(s.size - size) < 4 * s.size_se);
  }
  for (size_t i = 0; i < r.fit.items.size(); ++i) {
    const ItemEstimate& e = r.fit.items[i];
    const Item& t = truth.items[e.id == "loaf" ? 0 : 1];
    INFO(e.id);
    REQUIRE(e.fitted);
    CHECK(e.censored_days > e.days / 5);  // the policy sells out often: censoring matters
    CHECK(e.family == t.demand.family);
    CHECK(std::abs(e.base - t.demand.base) < 4 * e.base_se);
    CHECK(t.demand.base - e.naive_base > 4 * e.base_se);
    for (int w = 0; w < 7; ++w)
      CHECK(std::abs(e.weekday[w] - t.demand.weekday[w]) < 4 * e.weekday_se[w]);
    if (t.demand.cv) CHECK(std::abs(e.cv - *t.demand.cv) < 4 * e.cv_se);
    // The profile, from days that did not sell out.
    const IntradayFit& in = r.intraday[i];
    const std::vector<double> shares = intraday_shares(t, truth.calendar);
    REQUIRE(in.shares.size() == shares.size());
    double units = 0;
    for (size_t row = 0; row < r.data.rows.size(); ++row) {
      const FitDay& d = r.data.rows[row];
      if (r.data.items[d.item] == e.id && !d.sold_out) units += d.sold;
    }
    for (size_t h = 0; h < shares.size(); ++h) {
      const double se = std::sqrt(shares[h] * (1 - shares[h]) / units);
      CHECK(std::abs(in.shares[h] - shares[h]) < 4 * se);
    }
    // No demand shocks: the lag-7 residual correlation is zero up to its standard error.
    CHECK(std::abs(r.persistence[i].correlation) < 4 * r.persistence[i].se);
    if (e.id == "bun") {
      // Poisson arrivals: sum x / sum exposure, standard error about estimate / sqrt(sum x).
      REQUIRE(in.exposure_base);
      double sold = 0;
      for (const FitDay& d : r.data.rows)
        if (r.data.items[d.item] == "bun") sold += d.sold;
      CHECK(in.timed_sellouts > 100);
      CHECK(std::abs(*in.exposure_base - 12.0) < 4 * *in.exposure_base / std::sqrt(sold));
    }
  }
  // The written scenario is valid input, with placeholders marked when prices are unknown.
  WriteOptions w;
  w.name = "fitted";
  w.history_file = "recorded.csv";
  const std::string yaml = fitted_scenario_yaml(r, w);
  CHECK_THAT(yaml, Catch::Contains("PLACEHOLDER"));
  Diagnostics diag;
  const auto back = parse_scenario(yaml, "fitted.yaml", diag);
  INFO(diag.format() << "\n" << yaml);
  REQUIRE(back);
  CHECK(back->items.size() == 2);
  CHECK(back->stores.size() == 3);
  CHECK(back->calendar.open_hour == 8);
  CHECK(back->items[0].demand.intraday_weights.size() == 12);
}

// Rye sells out most afternoons (21 baked for a Poisson mean of 25); spelt and wheat never do.
// Customers who find rye out take spelt with probability 0.4 and wheat with 0.2.
const char* kSubstitution = R"(
format: 1
name: fit-substitution
seed: 91
horizon: { days: 364, warmup_days: 0, start_date: 2027-01-04 }
replications: 1
stores: [ { id: north }, { id: south }, { id: east } ]
items:
  - { id: rye, price: 3, unit_cost: 1, demand: { base: 25 }, substitutes: { spelt: 0.4, wheat: 0.2 } }
  - { id: spelt, price: 3, unit_cost: 1, demand: { base: 30 } }
  - { id: wheat, price: 2, unit_cost: 0.5, demand: { base: 12 } }
policies:
  - name: fixed
    forecast: { method: ses_weekday }
    quantity: { rule: fixed, quantity: { rye: 21, spelt: 200, wheat: 200 } }
)";

TEST_CASE("substitute shares come back by the joint censored likelihood", "[fit]") {
  const Scenario truth = test::scenario_from(kSubstitution);
  FitData data = recorded_history(truth);
  REQUIRE(data.columns.hours > 0);
  FitOptions options;
  options.substitution = true;
  const FitResult r = fit_history(std::move(data), options);
  // Only rye is ever out, so only the pairs (rye, spelt) and (rye, wheat) have store-days.
  REQUIRE(r.substitution.size() == 2);
  for (const SubstituteShare& x : r.substitution) {
    const std::string& sub = r.data.items[x.substitute];
    INFO(sub << " " << x.share << " se " << x.se);
    CHECK(r.data.items[x.out_item] == "rye");
    const double truth_share = sub == "spelt" ? 0.4 : 0.2;
    CHECK(std::abs(x.share - truth_share) < 4 * x.se);
    CHECK(x.se < 0.05);  // precise enough to tell the two shares apart
  }
  // The substitutes' bases are their own demand (30 and 12), not what they sold.
  for (const ItemEstimate& e : r.fit.items) {
    INFO(e.id << " base " << e.base << " se " << e.base_se);
    const double base = e.id == "rye" ? 25 : e.id == "spelt" ? 30 : 12;
    CHECK(std::abs(e.base - base) < 4 * e.base_se);
  }
  WriteOptions w;
  w.name = "fitted";
  w.history_file = "recorded.csv";
  const std::string yaml = fitted_scenario_yaml(r, w);
  Diagnostics diag;
  const auto back = parse_scenario(yaml, "fitted.yaml", diag);
  INFO(diag.format() << "\n" << yaml);
  REQUIRE(back);
  CHECK(back->items[0].substitutes.size() == 2);
}

}  // namespace
}  // namespace larder
