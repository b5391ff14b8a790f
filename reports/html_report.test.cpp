// report.html on the hand-built sample run: a parser check (Python's xml.etree and html.parser),
// self-containment, the numbers of summary.json and breakdown.csv in its tables, intervals and
// verdicts worked by hand from scipy, and each optional section present exactly when its data
// is.

#include "reports/html_report.hpp"

#include <catch2/catch.hpp>
#include <nlohmann/json.hpp>

#include "reports/breakdown_csv.hpp"
#include "reports/decision.hpp"
#include "reports/markup_check.test.hpp"
#include "reports/metric_label.hpp"
#include "reports/number_format.hpp"
#include "reports/sample_run.test.hpp"
#include "reports/summary_json.hpp"
#include "reports/terminal_table.hpp"
#include "reports/xml_text.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

// /usr/bin/python3, scipy 1.10.1: scipy.stats.t.ppf(0.975, 4), the 95% two-sided Student t
// quantile for 5 replications.
constexpr double kT975Dof4 = 2.7764451051977987;

/// The text of every <td> of the row headed `key` in the first table whose caption starts
/// with `caption`; empty when there is no such row.
std::vector<std::string> table_row(const std::string& html, const std::string& caption,
                                   const std::string& key) {
  const std::size_t table = html.find("<caption>" + caption);
  if (table == std::string::npos) return {};
  const std::size_t end = html.find("</table>", table);
  const std::size_t row = html.find("<th scope=\"row\">" + key + "</th>", table);
  if (row == std::string::npos || row > end) return {};
  const std::size_t row_end = html.find("</tr>", row);
  std::vector<std::string> cells;
  for (std::size_t at = html.find("<td", row); at < row_end; at = html.find("<td", at + 1)) {
    const std::size_t open = html.find('>', at) + 1;
    std::string cell = html.substr(open, html.find("</td>", open) - open);
    // Number cells keep a half-width with its sign (U+00A0 after the "\u00b1").
    for (std::size_t nb = cell.find("\u00b1\u00a0"); nb != std::string::npos;
         nb = cell.find("\u00b1\u00a0")) {
      cell.replace(nb, std::string("\u00b1\u00a0").size(), "\u00b1 ");
    }
    cells.push_back(cell);
  }
  return cells;
}

/// The sample run with in_stock_at_close (for the scatter) and a breakdown built by hand:
/// stores quay and mill, items roll and "pie & mash", attribute type = bread; policy 1 also
/// has a plan group "A". Value of metric m, policy p, key k, replication j:
/// base(m) x (1 + 0.1 p + 0.05 k) x (1 + 0.02 j^2).
RunResult sample_with_breakdown() {
  RunResult r = test::sample_run();
  r.metrics.push_back(Metric::in_stock_at_close);
  const double in_stock[3][5] = {{0.81, 0.83, 0.80, 0.82, 0.84},
                                 {0.70, 0.74, 0.69, 0.72, 0.75},
                                 {0.86, 0.85, 0.88, 0.84, 0.87}};
  for (size_t p = 0; p < 3; ++p) {
    for (size_t j = 0; j < 5; ++j) at(r.values[p][j], Metric::in_stock_at_close) = in_stock[p][j];
  }
  const std::vector<BreakdownKey> keys = {{"store", "quay"},
                                          {"store", "mill"},
                                          {"item", "roll"},
                                          {"item", "pie & mash"},
                                          {"type", "bread"}};
  for (size_t p = 0; p < 3; ++p) {
    PolicyBreakdown b;
    b.keys = keys;
    if (p == 1) {
      b.keys.push_back({"plan_group", "A"});
      b.first_group = keys.size();
    }
    for (size_t j = 0; j < 5; ++j) {
      std::vector<MetricVector> row;
      for (size_t k = 0; k < b.keys.size(); ++k) {
        MetricVector v = r.values[p][j];
        for (const Metric m : r.metrics) {
          at(v, m) = at(r.values[0][0], m) *
                     (1 + 0.1 * static_cast<double>(p) + 0.05 * static_cast<double>(k)) *
                     (1 + 0.02 * static_cast<double>(j * j));
        }
        row.push_back(v);
      }
      b.values.push_back(row);
      if (p == 1) {
        b.planned_level.push_back({std::vector<double>{0.7, 0.72, 0.71, 0.69, 0.73}[j]});
        b.planned_in_stock.push_back({0.7});
      }
    }
    r.breakdown.push_back(b);
  }
  return r;
}

DailyTrace sample_trace() {
  DailyTrace t;
  t.store = "quay";
  t.item = "roll";
  t.warmup_days = 1;
  // demand, delivered, sold, leftover, wasted, salvaged, donated, open
  t.traces = {{"fixed_order",
               {{10, 12, 10, 2, 2, 0, 0, true},
                {14, 12, 12, 0, 0, 0, 0, true},
                {6, 12, 6, 6, 5, 1, 0, true}}},
              {"newsvendor",
               {{10, 11, 10, 1, 0, 0, 0, true},  // one unit kept overnight
                {14, 11, 12, 0, 0, 0, 0, true},
                {6, 11, 6, 5, 5, 0, 0, true}}}};
  t.left_out = {"net"};
  return t;
}

ReportContext sample_context() {
  ReportContext c;
  c.scenario_lines = {"2 stores: quay, mill", "3 items (shelf life 1 day): roll, pie, bun"};
  c.cautions = report_cautions();
  c.trace = sample_trace();
  return c;
}

TEST_CASE("report.html is well-formed, nests as HTML and names no URL", "[html]") {
  const std::string html = html_report(sample_with_breakdown(), sample_context());
  const std::string problems = test::markup_problems(html, "html", "html");
  INFO(problems);
  CHECK(problems.empty());
  // The checker itself must catch what it is there for.
  std::string broken = html;
  broken.insert(broken.find("</main>"), "<div><p>unclosed</div>");
  CHECK_THAT(test::markup_problems(broken, "html", "html"), Catch::Contains("does not close"));
  std::string fetching = html;
  fetching.insert(fetching.find("</main>"), "<img src=\"//example.org/x.png\"/>");
  CHECK_THAT(test::markup_problems(fetching, "html", "html"), Catch::Contains("fetches"));
}

TEST_CASE("report.html is self-contained and printable", "[html]") {
  const std::string html = html_report(sample_with_breakdown(), sample_context());
  for (const char* forbidden : {"http://", "https://", "<script", "<link", "url(", "@import"}) {
    CHECK(html.find(forbidden) == std::string::npos);
  }
  CHECK(html.find("=\"//") == std::string::npos);
  CHECK_THAT(html, Catch::StartsWith("<!DOCTYPE html>"));
  CHECK_THAT(html, Catch::Contains("<style>") && Catch::Contains("@media print"));
  CHECK_THAT(html, Catch::Contains("<meta charset=\"utf-8\"/>"));
}

TEST_CASE("report.html shows summary.json's estimates, rounded as the terminal does", "[html]") {
  const RunResult r = sample_with_breakdown();
  const std::string html = html_report(r, sample_context());
  const nlohmann::json summary = nlohmann::json::parse(summary_json_text(r));
  for (const Metric m : table_metrics(r)) {
    const std::string name(metric_name(m));
    const std::string_view unit = metric_info(m).unit;
    int decimals = 0;
    for (const auto& p : summary["policies"]) {
      const auto& e = p["metrics"][name];
      const double half = (e["ci_high"].get<double>() - e["ci_low"].get<double>()) / 2;
      decimals = std::max(decimals, estimate_decimals(half, unit));
    }
    const std::vector<std::string> row =
        table_row(html, "The key metrics", xml_escape(metric_label(m, "EUR")));
    REQUIRE(row.size() == r.policies.size());  // one cell per policy; the unit is in the label
    for (size_t p = 0; p < r.policies.size(); ++p) {
      const auto& e = summary["policies"][p]["metrics"][name];
      const double half = (e["ci_high"].get<double>() - e["ci_low"].get<double>()) / 2;
      CHECK(row[p] == format_estimate(e["mean"].get<double>(), half, unit, decimals));
    }
  }
  // By hand from the scipy intervals of the sample (see terminal_table.test.cpp).
  CHECK(table_row(html, "The key metrics", "Waste (% of units delivered)") ==
        std::vector<std::string>{"12.3 ± 0.8", "10.5 ± 0.8", "12.4 ± 0.7"});
  CHECK(table_row(html, "The key metrics", "Profit (EUR)") ==
        std::vector<std::string>{"2,570 ± 111", "2,718 ± 122", "2,566 ± 113"});
}

TEST_CASE("report.html shows summary.json's paired differences and verdicts", "[html]") {
  const RunResult r = sample_with_breakdown();
  const std::string html = html_report(r, sample_context());
  const nlohmann::json summary = nlohmann::json::parse(summary_json_text(r));
  REQUIRE(summary["differences"].size() == 2);
  for (const auto& d : summary["differences"]) {
    const std::string caption =
        xml_escape(d["policy"].get<std::string>()) + ": difference vs fixed_order";
    for (const Metric m : table_metrics(r)) {
      const std::string name(metric_name(m));
      const auto& e = d["metrics"][name];
      const std::vector<std::string> row =
          table_row(html, caption, xml_escape(metric_label(m, "EUR", true)));
      REQUIRE(row.size() == 3);  // difference, interval, verdict
      // The same verdict, naming the metric in words instead of its field name.
      const std::string json_verdict = e["verdict"].get<std::string>();
      const std::size_t named = json_verdict.find(name);
      INFO(json_verdict << " | " << row[2]);
      if (named == std::string::npos) {
        CHECK(row[2] == json_verdict);
      } else {
        CHECK(row[2].substr(0, named) == json_verdict.substr(0, named));
        CHECK_THAT(row[2], Catch::EndsWith(json_verdict.substr(named + name.size())));
      }
    }
  }
  // By hand from scipy's paired interval (see terminal_table.test.cpp).
  CHECK(table_row(html, "newsvendor: difference vs fixed_order", "Waste (units)") ==
        std::vector<std::string>{"-19.8", "-22.2 to -17.4", "better: lower waste (significant)"});
  CHECK_THAT(html, Catch::Contains("<td class=\"better\">better: lower waste (significant)"));
  CHECK_THAT(html, Catch::Contains("<td class=\"worse\">worse: lower fill rate (significant)"));
  // Three policies: the page points to the table of every pair; with two it would not.
  CHECK_THAT(html, Catch::Contains("pairs.csv beside this page compares every pair"));
  RunResult two = r;
  two.policies.resize(2);
  two.values.resize(2);
  CHECK_THAT(html_report(two, sample_context()), !Catch::Contains("pairs.csv"));
}

TEST_CASE("report.html breakdown tables hold breakdown.csv's numbers", "[html]") {
  const RunResult r = sample_with_breakdown();
  const std::string html = html_report(r, sample_context());
  const auto csv = test::parse_csv(breakdown_csv(r));
  REQUIRE(csv.size() > 1);
  // Rows per (dimension, key, metric): the policies' "mean ± t x stderr", rounded alike.
  std::map<std::tuple<std::string, std::string, std::string>,
           std::vector<std::pair<double, double>>>
      rows;
  for (std::size_t i = 1; i < csv.size(); ++i) {
    const auto& c = csv[i];  // policy,dimension,key,metric,mean,stderr
    if (c[1] == "plan_group") continue;
    rows[{c[1], c[2], c[3]}].push_back(
        {test::parse_double(c[4]), kT975Dof4 * test::parse_double(c[5])});
  }
  int checked = 0;
  for (const auto& [where, per_policy] : rows) {
    const auto& [dimension, key, metric] = where;
    if (metric != "waste_units" && metric != "waste_share" && metric != "fill_rate" &&
        metric != "profit" && metric != "in_stock_at_close") {
      CHECK(html.find("<caption>" + xml_escape(metric_label(metric, "EUR")) + " by ") ==
            std::string::npos);
      continue;
    }
    const std::string_view unit = metric == "waste_units" ? "units"
                                  : metric == "profit"    ? "money"
                                                          : "share";
    REQUIRE(per_policy.size() == 3);
    int decimals = 0;
    for (const auto& [mean, half] : per_policy) {
      decimals = std::max(decimals, estimate_decimals(half, unit));
    }
    std::vector<std::string> expected;
    for (const auto& [mean, half] : per_policy) {
      expected.push_back(format_estimate(mean, half, unit, decimals));
    }
    INFO(metric << " by " << dimension << " = " << key);
    CHECK(table_row(html, xml_escape(metric_label(metric, "EUR")) + " by " + dimension,
                    xml_escape(key)) == expected);
    ++checked;
  }
  CHECK(checked == 5 * 5);  // 5 keys x the 5 metrics the report breaks down
  // The store dimension is short, so its block starts open.
  CHECK_THAT(html, Catch::Contains("<details open=\"open\"><summary>By store (2 values)"));
  CHECK_THAT(html, Catch::Contains("<summary>By item attribute &quot;type&quot; (1 value)"));
}

TEST_CASE("report.html compares planned and achieved levels of plan groups", "[html]") {
  const RunResult r = sample_with_breakdown();
  const std::string html = html_report(r, sample_context());
  // Planned levels 0.70, 0.72, 0.71, 0.69, 0.73: mean 0.71, sample sd sqrt(0.001 / 4) =
  // 0.0158, half-width 2.7764 x 0.0158 / sqrt(5) = 0.0196 (scipy: 0.019632431614775625).
  const std::vector<std::string> row = table_row(html, "newsvendor: plan groups", "A");
  REQUIRE(row.size() == 3);
  CHECK(row[0] == "71.0 ± 2.0");
  CHECK(row[1] == "70.0 ± 0.0");  // expected in stock: 0.7 in every replication
  CHECK_THAT(html, Catch::Contains("id=\"plan-groups\""));
}

TEST_CASE("report.html has charts for the key metrics and the scatter", "[html]") {
  const RunResult r = sample_with_breakdown();
  const std::string html = html_report(r, sample_context());
  for (const char* title : {"Waste (% of units delivered) by policy",
                            "In stock at close (% of open store-item-days) by policy",
                            "Fill rate (% of demand served by the item) by policy",
                            "Profit (EUR) by policy", "Waste against in stock at close"}) {
    CHECK_THAT(html, Catch::Contains(std::string("aria-label=\"") + title + "\""));
  }
  // Bar labels: the baseline is named as such; value texts are the table's.
  CHECK_THAT(html, Catch::Contains(">fixed_order (baseline)</text>"));
  CHECK_THAT(html, Catch::Contains(">12.3 ± 0.8</text>"));
  // No kilograms without weights.
  CHECK(html.find("id=\"environment\"") == std::string::npos);
}

TEST_CASE("report.html: environment, substitution and trace sections when there is data",
          "[html]") {
  RunResult r = sample_with_breakdown();
  const std::string plain = html_report(r, {});
  CHECK(plain.find("id=\"substitution\"") == std::string::npos);
  CHECK(plain.find("id=\"daily\"") == std::string::npos);
  CHECK(plain.find("href=\"#daily\"") == std::string::npos);  // no link to a missing section

  r.metrics.push_back(Metric::waste_kg);
  r.metrics.push_back(Metric::co2e_kg);
  for (auto& per_rep : r.values) {
    for (auto& v : per_rep) {
      at(v, Metric::waste_kg) = 0.5 * at(v, Metric::waste_units);
      at(v, Metric::co2e_kg) = 1.25 * at(v, Metric::waste_units);
    }
  }
  r.substitution_pairs = {{"roll", "bun"}};
  r.substituted.assign(3, std::vector<std::vector<double>>(5, std::vector<double>{4.0}));
  const std::string html = html_report(r, sample_context());
  CHECK(test::markup_problems(html, "html", "html").empty());
  CHECK_THAT(html, Catch::Contains("<h2>Waste in kilograms and CO2e</h2>"));
  CHECK_THAT(html, Catch::Contains("aria-label=\"Waste (kg CO2e) by policy\""));
  // waste_kg of the baseline: half of waste_units, 126.8 ± 11.1 -> 63.4 ± 5.5 (by hand).
  CHECK_THAT(html, Catch::Contains(">63.4 ± 5.5</text>"));
  CHECK(table_row(html, "Units sold to customers who found", "roll") ==
        std::vector<std::string>{"bun", "4.0 ± 0.0", "4.0 ± 0.0", "4.0 ± 0.0"});
  // The trace: totals by hand from sample_trace, and the left-out policy named.
  // fixed_order: demand 10 + 14 + 6, delivered 3 x 12, sold 10 + 12 + 6, out 2 + 0 + (5 + 1).
  CHECK_THAT(html, Catch::Contains("Totals over days 0 to 2: demand (customers) 30; delivered "
                                   "36; sold 28; wasted/salvaged/donated 8. Every unit left at "
                                   "close leaves the shelf that evening, so one line shows both."));
  // newsvendor keeps a unit overnight on day 0, so its chart draws both lines.
  CHECK_THAT(html, Catch::Contains("Totals over days 0 to 2: demand (customers) 30; delivered "
                                   "33; sold 28; wasted/salvaged/donated 5.<"));
  CHECK_THAT(html, Catch::Contains(">left at close = wasted/salvaged/donated</text>") &&
                       Catch::Contains(">left at close</text>"));
  CHECK_THAT(html, Catch::Contains("aria-label=\"newsvendor: roll at quay, days 0 to 2\""));
  CHECK_THAT(html, Catch::Contains(">scored from day 1</text>"));
  CHECK_THAT(html, Catch::Contains("Not shown: net."));
  CHECK_THAT(html, Catch::Contains("href=\"#daily\""));
}

TEST_CASE("report.html opens with the decision summary", "[html]") {
  RunResult r = sample_with_breakdown();
  r.metrics.push_back(Metric::waste_kg);
  r.metrics.push_back(Metric::co2e_kg);
  for (auto& per_rep : r.values) {
    for (auto& v : per_rep) {
      at(v, Metric::waste_kg) = 0.5 * at(v, Metric::waste_units);
      at(v, Metric::co2e_kg) = 1.25 * at(v, Metric::waste_units);
    }
  }
  const std::string html = html_report(r, sample_context());
  CHECK(test::markup_problems(html, "html", "html").empty());
  // First on the page, before the cautions, and first in the contents.
  const std::size_t decision = html.find("<section id=\"decision\">");
  REQUIRE(decision != std::string::npos);
  CHECK(decision < html.find("id=\"cautions\""));
  CHECK(decision < html.find("<section id=\"simulated\">"));
  CHECK(html.find("href=\"#decision\"") < html.find("href=\"#simulated\""));
  // 91 days, 14 of warm-up: 77 scored days, scaled by 365 / 77.
  CHECK_THAT(html, Catch::Contains("the sums over the 77 scored days"));
  // One sentence per policy, as the pure function builds it.
  for (const DecisionRow& row : decision_rows(r)) {
    CHECK_THAT(html, Catch::Contains("<li>" + xml_escape(decision_sentence(row, "EUR")) + "</li>"));
  }
  // The table: tonnes a year. newsvendor's waste_units difference is -19.8 (-22.2 to -17.4),
  // so waste_kg's is half of that, in tonnes a year x 365 / 77 / 1000: -0.0469 (-0.0526 to
  // -0.0412) (by hand).
  const std::vector<std::string> row =
      table_row(html, "Change per year against fixed_order", "newsvendor");
  REQUIRE(row.size() == 4);  // waste, CO2e, customers lost, profit
  CHECK_THAT(row[0], Catch::StartsWith("-0.047"));
  CHECK_THAT(html, Catch::Contains("<th scope=\"col\" class=\"num\">Waste (t CO2e a year)</th>"));
  CHECK_THAT(html, Catch::Contains("<td class=\"num better\">-0.047"));
  // The chart: CO2e per year against fill rate, the baseline ringed and named.
  CHECK_THAT(html, Catch::Contains("aria-label=\"Waste (t CO2e a year) against fill rate\""));
  CHECK_THAT(html, Catch::Contains(">fixed_order (baseline)</text>"));
  CHECK_THAT(html, Catch::Contains(R"(fill="none" stroke="#222222" stroke-width="1.5")"));
  // One policy: no comparison, no decision section.
  RunResult one = r;
  one.policies.resize(1);
  one.values.resize(1);
  one.breakdown.resize(1);
  CHECK(html_report(one, sample_context()).find("id=\"decision\"") == std::string::npos);
}

TEST_CASE("report_context describes the scenario in lines worked by hand", "[html]") {
  const Scenario s = test::scenario_from(R"(
format: 1
name: two-shops
seed: 1
horizon: { days: 91, warmup_days: 14, start_weekday: wed }
calendar: { open_weekdays: [mon, tue, wed, thu, fri, sat] }
logistics: { lead_time_days: 2, delivery_weekdays: [mon, wed, fri] }
stores: [ { id: quay, size: 0.8 }, { id: mill, size: 1.2 } ]
items:
  - { id: roll, price: 1.5, unit_cost: 0.4, demand: { base: 30 } }
  - { id: pie, price: 4, unit_cost: 1.5, shelf_life_days: 2, demand: { base: 8 } }
policies:
  - { name: fixed, forecast: { method: oracle }, quantity: { rule: fixed, quantity: 30 } }
)");
  CHECK(scenario_lines(s) ==
        std::vector<std::string>{
            "2 stores (sizes 0.80 to 1.20): quay, mill",
            "2 items (shelf lives 1 to 2 days): roll, pie",
            "91 days starting on a Wednesday; the first 14 are a warm-up that is simulated but "
            "not scored, so 77 days are scored; stores open Mon, Tue, Wed, Thu, Fri, Sat",
            "orders arrive 2 days after they are placed; deliveries Mon, Wed, Fri"});
  const ReportContext c = report_context(s, std::nullopt);
  CHECK(c.cautions == report_cautions());
  CHECK_FALSE(c.trace.has_value());
}

TEST_CASE("report.html states the cautions and how to rerun", "[html]") {
  const RunResult r = sample_with_breakdown();
  ReportContext context;
  context.cautions = report_cautions();
  const std::string html = html_report(r, context);
  CHECK_THAT(html, Catch::Contains("Shelf lives, next-day sale and donation must follow local "
                                   "food-safety law and the producer&#39;s use-by dates."));
  CHECK_THAT(html, Catch::Contains("Results are model estimates under the scenario&#39;s "
                                   "assumptions, not guarantees."));
  CHECK_THAT(html, Catch::Contains("<pre><code>larder run scenarios/two-shops.yaml "
                                   "--replications 5 --seed 20270104</code></pre>"));
  CHECK_THAT(html, Catch::Contains("<dd>20270104</dd>"));
  // Without scenario lines, the network is described from the run's own facts.
  CHECK_THAT(html, Catch::Contains("2 stores, 3 items, 91 days of which 14 are a warm-up"));
}

TEST_CASE("report.html escapes names from the scenario", "[html]") {
  RunResult r = sample_with_breakdown();
  r.policies[2] = "<b>cautious</b> & \"co\"";
  r.info.scenario_name = "shops <&>";
  const std::string html = html_report(r, sample_context());
  CHECK(test::markup_problems(html, "html", "html").empty());
  CHECK(html.find("<b>cautious") == std::string::npos);
  CHECK_THAT(html, Catch::Contains("&lt;b&gt;cautious&lt;/b&gt; &amp; &quot;co&quot;"));
  CHECK_THAT(html, Catch::Contains("<title>larder report: shops &lt;&amp;&gt;</title>"));
}

}  // namespace
}  // namespace larder
