// Property tests (issue 10) over random valid scenarios drawn from a fixed seed: whatever the
// features (several stores, shelf lives 1-5, leftovers dispositions, next-day discount,
// markdown, substitutes, intraday profiles, closed days, lead times, policies of several
// kinds), every run
//   - conserves customers: first-choice customers = own sales + substitute purchases +
//     walk-aways (checks.md, section 4, the first invariant);
//   - conserves units: delivered = sold + wasted + salvaged + donated + stock change, day by day
//     on the traced store-item (stock change = the change of the stock left at close) and as a
//     non-negative remainder over a run without warm-up (the stock left at the end);
//   - keeps every share in [0, 1] and every number finite;
//   - gives bit-identical results at 1 and 2 threads;
//   - writes output files (summary.json, CSVs, report.html) without NaN or infinity.

#include <cmath>
#include <cstring>
#include <pcg_random.hpp>
#include <regex>

#include "reports/html_report.hpp"
#include "reports/output_folder.hpp"
#include "reports/report_context.hpp"
#include "sim/runner/daily_trace.hpp"
#include "tests/cli_runner.test.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

/// Draws one small valid scenario. Every choice comes from `rng`, so the same seed gives the
/// same scenarios on every machine (pcg32 and integer arithmetic only).
class ScenarioDraw {
 public:
  explicit ScenarioDraw(std::uint64_t seed) : rng_(seed) {}

  std::string text(int index) {
    std::string y = fmt::format("format: 1\nname: prop-{}\nseed: {}\n", index, below(1000000));
    const int days = 21 + below(30);
    y += fmt::format("horizon: {{ days: {}, warmup_days: {} }}\nreplications: {}\n", days,
                     coin() ? 0 : below(8), 2 + below(2));
    y += fmt::format(
        "calendar: {{ events: [ {{ day: {}, closed: true }}, {{ day: {}, demand: "
        "{} }} ] }}\n",
        below(days), below(days), 0.5 + below(3) * 0.5);
    y += fmt::format("customers: {{ fifo_share: {}, discount_take_rate: {} }}\n", below(11) / 10.0,
                     below(11) / 10.0);
    y += fmt::format("logistics: {{ lead_time_days: {} }}\n", 1 + below(2));
    const int stores = 1 + below(3);
    y += "stores:\n";
    for (int s = 0; s < stores; ++s) {
      y += fmt::format("  - {{ id: s{}, size: {}{} }}\n", s, 0.5 + below(4) * 0.5,
                       coin() ? ", open_weekdays: [mon, tue, wed, thu, fri, sat]" : "");
    }
    const int items = 1 + below(4);
    y += "items:\n";
    for (int i = 0; i < items; ++i) y += item(i, items);
    y += "policies:\n";
    const int policies = 2 + below(2);
    for (int p = 0; p < policies; ++p) y += policy(p);
    return y;
  }

 private:
  int below(int n) { return static_cast<int>(rng_(static_cast<std::uint32_t>(n))); }
  bool coin() { return below(2) == 1; }

  std::string item(int i, int items) {
    const double cost = 1.0 + below(4) * 0.5;
    std::string y = fmt::format("  - {{ id: i{}, price: {}, unit_cost: {}, shelf_life_days: {}", i,
                                cost * (1.5 + below(4) * 0.5), cost, 1 + below(5));
    const char* families[] = {"poisson", "negative_binomial", "normal"};
    const int family = below(3);
    y += fmt::format(", demand: {{ base: {}, distribution: {}", 2 + below(40), families[family]);
    if (family > 0) y += fmt::format(", cv: {}", 0.2 + below(5) * 0.2);
    const char* profiles[] = {"flat", "morning_peak", "midday_peak", "evening_peak"};
    y += fmt::format(", intraday: {} }}", profiles[below(4)]);
    switch (below(4)) {
      case 0:
        break;
      case 1:
        y += fmt::format(", leftovers: salvage, salvage_value: {}", cost * 0.25);
        break;
      case 2:
        y += ", leftovers: donate";
        break;
      default:
        y += fmt::format(
            ", leftovers: discount_next_day, next_day: {{ price: {}, fallback: {}, "
            "bargain_demand: {} }}",
            cost * 0.5, coin() ? "donate" : "discard", below(4));
    }
    if (below(3) == 0)
      y += fmt::format(", markdown: {{ from_hour: {}, uplift: 0.2 }}", 15 + below(4));
    if (items > 1 && coin()) {
      const int to = (i + 1 + below(items - 1)) % items;  // never the item itself
      y += fmt::format(", substitutes: {{ i{}: {} }}", to, 0.1 + below(8) * 0.1);
    }
    return y + " }\n";
  }

  std::string policy(int p) {
    switch (below(6)) {
      case 0:
        return fmt::format(
            "  - {{ name: p{}, forecast: {{ method: oracle }}, quantity: {{ rule: "
            "in_stock_target, level: 0.{} }} }}\n",
            p, 5 + below(5));
      case 1:
        return fmt::format(
            "  - {{ name: p{}, forecast: {{ method: ses_weekday }}, censoring: "
            "normal_tail, quantity: {{ rule: critical_fractile }} }}\n",
            p);
      case 2:
        return fmt::format(
            "  - {{ name: p{}, forecast: {{ method: moving_average }}, quantity: {{ "
            "rule: fill_rate_target, level: 0.9 }}, adjustments: [ {{ method: "
            "waste_feedback, share: 0.5 }} ] }}\n",
            p);
      case 3:
        return fmt::format(
            "  - {{ name: p{}, forecast: {{ method: oracle }}, quantity: {{ rule: "
            "fixed, quantity: {} }} }}\n",
            p, below(30));
      case 4:
        return fmt::format(
            "  - {{ name: p{}, forecast: {{ method: same_day_last_week }}, "
            "censoring: drop, quantity: {{ rule: base_stock, level: {} }} }}\n",
            p, 5 + below(40));
      default:
        return fmt::format(
            "  - {{ name: p{}, forecast: {{ method: holt_winters }}, quantity: {{ "
            "rule: order_up_to, level: 0.8 }} }}\n",
            p);
    }
  }

  pcg32 rng_;
};

bool same_bits(double a, double b) {
  return std::memcmp(&a, &b, sizeof a) == 0;
}

TEST_CASE("random valid scenarios keep every invariant", "[property]") {
  ScenarioDraw draw(20261202);
  const int kScenarios = 12;
  for (int n = 0; n < kScenarios; ++n) {
    const std::string yaml = draw.text(n);
    INFO(yaml);
    const Scenario s = test::scenario_from(yaml);
    const std::vector<Policy> policies = test::policies_for(s);
    RunOptions one;
    one.threads = 1;
    RunOptions two;
    two.threads = 2;
    const RunResult r = run_policies(s, policies, one);
    const RunResult r2 = run_policies(s, policies, two);

    REQUIRE(r.values.size() == r2.values.size());
    for (size_t p = 0; p < r.values.size(); ++p) {
      INFO("policy " << r.policies[p]);
      REQUIRE(r.values[p].size() == r2.values[p].size());
      for (size_t rep = 0; rep < r.values[p].size(); ++rep) {
        const MetricVector& v = r.values[p][rep];
        for (size_t k = 0; k < kMetricCount; ++k) {
          const auto m = static_cast<Metric>(k);
          INFO(metric_name(m));
          REQUIRE(std::isfinite(at(v, m)));
          CHECK(same_bits(at(v, m), at(r2.values[p][rep], m)));  // 1 vs 2 threads
          if (metric_info(m).unit == std::string_view("share")) {
            CHECK(at(v, m) >= 0.0);
            CHECK(at(v, m) <= 1.0);
          }
        }
        // Customers: served by the item (fill rate x demand) + substitutes bought + lost.
        const double demand = at(v, Metric::demand_units);
        const double served = std::round(at(v, Metric::fill_rate) * demand);
        CHECK(demand == served + at(v, Metric::substitute_units) + at(v, Metric::lost_units));
        // Units: what was delivered left by one of four ways or is still on a shelf.
        const double out = at(v, Metric::sold_units) + at(v, Metric::waste_units) +
                           at(v, Metric::salvaged_units) + at(v, Metric::donated_units);
        if (s.horizon.warmup_days == 0) CHECK(at(v, Metric::delivered_units) >= out);
        CHECK(at(v, Metric::sold_units) >= served + at(v, Metric::substitute_units));
      }
    }

    // Day by day on the traced store-item: the stock left at close moves by exactly the
    // deliveries minus the units that left.
    const DailyTrace trace = daily_trace(s, policies);
    // `leftover` counts the units about to leave at close (README, History format); with a
    // next-day discount they stay a day longer, in the discounted tier, and leave the next
    // evening, so they are still in stock the next morning.
    const bool next_day =
        s.items[static_cast<size_t>(traced_item(s))].leftovers == Leftovers::discount_next_day;
    for (const PolicyTrace& pt : trace.traces) {
      int carried = 0;  // units on the shelf the next morning, before the delivery
      for (size_t t = 0; t < pt.days.size(); ++t) {
        const TraceDay& d = pt.days[t];
        INFO(pt.policy << " day " << t);
        if (next_day) {
          CHECK(d.leftover + d.unsold_out() == carried + d.delivered - d.sold);
          carried = d.leftover;
        } else {
          CHECK(d.leftover == carried + d.delivered - d.sold);
          carried = d.leftover - d.unsold_out();
        }
        CHECK(carried >= 0);
      }
    }

    // Every file written: no NaN or infinity, in any spelling.
    const auto dir = test::scratch_path("property", fmt::format("out-{}", n));
    write_run_outputs(r, dir);
    test::write_text(dir / "report.html", html_report(r, report_context(s, trace)));
    const std::regex not_finite(R"(\b(nan|inf|infinity)\b)", std::regex::icase);
    for (const auto& entry : std::filesystem::directory_iterator(dir)) {
      const std::string text = test::slurp(entry.path());
      INFO(entry.path().string());
      CHECK(!std::regex_search(text, not_finite));
    }
  }
}

}  // namespace
}  // namespace larder
