// sweep.html and allocation-<policy>.html on hand-built rows: a parser check (Python's
// xml.etree and html.parser), self-containment, the frontier rows that sweep_frontiers marks
// labelled as such in the charts, and the numbers of the tables formatted as the terminal shows
// them.

#include "reports/sweep_report.hpp"

#include <catch2/catch.hpp>

#include "reports/allocation_report.hpp"
#include "reports/comparison.hpp"
#include "reports/markup_check.test.hpp"
#include "reports/number_format.hpp"
#include "reports/sample_run.test.hpp"
#include "reports/svg_chart.hpp"
#include "reports/xml_text.hpp"

namespace larder {
namespace {

/// The sample run with an in-stock share, its waste shares and profits shifted by `shift`.
RunResult shifted_run(double shift) {
  RunResult r = test::sample_run();
  r.metrics.push_back(Metric::in_stock_at_close);
  const std::vector<double> in_stock = {0.80, 0.86, 0.78};
  for (std::size_t p = 0; p < r.policies.size(); ++p) {
    for (std::size_t j = 0; j < r.values[p].size(); ++j) {
      MetricVector& v = r.values[p][j];
      at(v, Metric::in_stock_at_close) = in_stock[p] + shift + 0.01 * static_cast<double>(j);
      at(v, Metric::waste_share) += shift / 2;
      at(v, Metric::profit) -= 1000 * shift;
    }
  }
  return r;
}

std::size_t count(const std::string& text, const std::string& needle) {
  std::size_t n = 0;
  for (std::size_t at = text.find(needle); at != std::string::npos; at = text.find(needle, at + 1))
    ++n;
  return n;
}

TEST_CASE("sweep.html: a line per policy, frontier rows ringed, the rows table", "[html]") {
  const std::vector<Setting> settings = {{"policies.*.quantity.target", {"0.6", "0.8"}}};
  const std::vector<SweepPoint> points = {{{"0.6"}, shifted_run(0.0)}, {{"0.8"}, shifted_run(0.1)}};
  const FrontierMarks marks = sweep_frontiers(points);
  const std::string html = sweep_html(settings, points, marks);
  CHECK(test::markup_problems(html, "html", "html").empty());

  // Three charts, each with one line per policy through its two points, in the policy's own
  // colour (the first three of the palette) and named in the legend.
  CHECK(count(html, "<polyline ") == 9);
  for (std::size_t p = 0; p < 3; ++p) {
    INFO(p);
    CHECK(count(html, fmt::format(R"(fill="none" stroke="{}")", chart_palette()[p])) == 3);
    CHECK(count(html, ">" + xml_escape(points[0].result.policies[p]) + "</text>") == 3);
  }
  CHECK_THAT(html, Catch::Contains("aria-label=\"Profit against in stock at close\""));
  CHECK_THAT(html, Catch::Contains("In stock at close (% of open store-item-days)</text>"));
  // Frontier rows are ringed: one ring per mark in the in-stock and the profit charts.
  std::size_t rings = 0;
  std::size_t row = 0;
  std::size_t on_front = 0;
  for (const SweepPoint& pt : points) {
    const RunResult& r = pt.result;
    for (std::size_t p = 0; p < r.policies.size(); ++p, ++row) {
      rings += (marks.waste_in_stock[row] ? 1 : 0) + (marks.profit_waste[row] ? 1 : 0);
      on_front += marks.waste_in_stock[row] ? 1 : 0;
      // The table's numbers as the terminal prints them (1 decimal of %, profit in units).
      const int k = static_cast<int>(p);
      const std::string waste =
          format_number(100 * policy_estimate(r, k, Metric::waste_share).mean, 1);
      const std::string in_stock =
          format_number(100 * policy_estimate(r, k, Metric::in_stock_at_close).mean, 1);
      const std::string fill =
          format_number(100 * policy_estimate(r, k, Metric::fill_rate).mean, 1);
      const std::string profit = format_number(policy_estimate(r, k, Metric::profit).mean, 0);
      CHECK(html.find(fmt::format("<td>{}</td><td class=\"num\">{}</td><td class=\"num\">{}</td>"
                                  "<td class=\"num\">{}</td><td class=\"num\">{}</td>",
                                  xml_escape(r.policies[p]), waste, in_stock, fill, profit)) !=
            std::string::npos);
    }
  }
  CHECK(count(html, R"(fill="none" stroke="#222222" stroke-width="1.5")") == rings);
  CHECK(on_front > 0);
  CHECK(on_front < row);
  // Hand check of one cell: newsvendor at 0.6, waste shares 0.099 0.109 0.097 0.107 0.113 have
  // mean 0.105, so 10.5%.
  CHECK(html.find("<td>newsvendor</td><td class=\"num\">10.5</td>") != std::string::npos);
  CHECK_THAT(html,
             Catch::Contains("<th scope=\"col\" class=\"num\">Waste (% of units delivered)</th>"));
}

TEST_CASE("sweep.html for a grid of two settings: a line per policy and first value", "[html]") {
  const std::vector<Setting> settings = {{"items.*.price", {"1", "2"}},
                                         {"policies.*.quantity.target", {"0.6", "0.8"}}};
  const std::vector<SweepPoint> points = {{{"1", "0.6"}, shifted_run(0.0)},
                                          {{"1", "0.8"}, shifted_run(0.1)},
                                          {{"2", "0.6"}, shifted_run(0.05)},
                                          {{"2", "0.8"}, shifted_run(0.15)}};
  const std::string html = sweep_html(settings, points, sweep_frontiers(points));
  CHECK(test::markup_problems(html, "html", "html").empty());
  CHECK(count(html, "<polyline ") == 3 * 6);  // 3 charts x 3 policies x 2 prices
  CHECK(count(html, ">newsvendor, price=2</text>") == 3);
}

TEST_CASE("sweep.html for --vary: ranks, the best that changes, the tornado table", "[html]") {
  const std::vector<SweepPoint> points = {{{}, test::sample_run()}};
  const Estimate base{200, 10, 180, 220, 5};
  const std::vector<TornadoRow> rows = {
      {"price",
       "newsvendor",
       {"-10%", "+10%"},
       {{-50, 5, -60, -40, 5}, {450, 5, 440, 460, 5}},
       base,
       500},
      {"unit_cost", "cautious, v2", {"-20%"}, {{1250.4, 5, 1240.4, 1260.4, 5}}, base, 1050.4}};
  const auto rank_point = [](std::string input, std::string value, std::vector<double> means) {
    RankPoint p;
    p.input = std::move(input);
    p.value = std::move(value);
    p.means = std::move(means);
    return p;
  };
  const std::vector<std::string> policies = {"fixed_order", "newsvendor", "cautious, v2"};
  RankTable profit =
      rank_table("profit", +1, policies,
                 {rank_point("base", "", {10, 30, 20}), rank_point("price", "-10%", {10, 20, 30}),
                  rank_point("price", "+10%", {10, 40, 20})});
  profit.points[1].change_clear = true;
  const RankTable waste =
      rank_table("waste_units", -1, policies,
                 {rank_point("base", "", {10, 30, 20}), rank_point("price", "-10%", {11, 31, 21}),
                  rank_point("price", "+10%", {9, 29, 19})});
  const std::string html = sensitivity_html(points, rows, {profit, waste});
  CHECK(test::markup_problems(html, "html", "html").empty());
  CHECK(html.find("<th scope=\"row\">newsvendor</th><td>price</td>") != std::string::npos);
  CHECK(html.find("-10%: -50 \u00b1\u00a010; +10%: 450 \u00b1\u00a010") != std::string::npos);
  CHECK(html.find("<td class=\"num\">1,050</td></tr>") != std::string::npos);
  CHECK(html.find("price") < html.find("unit_cost"));
  // Ranks: at price -10% the best on profit changes from newsvendor to cautious, v2.
  CHECK_THAT(html,
             Catch::Contains("<th scope=\"row\">price</th><td>-10%</td><td class=\"num\">3</td>"
                             "<td class=\"num\">2</td><td class=\"num\">1</td><td>cautious, "
                             "v2</td><td class=\"worse\">yes</td>"));
  CHECK_THAT(html, Catch::Contains("On Profit (EUR), newsvendor is the best at the base, but not "
                                   "at: price -10%."));
  CHECK_THAT(html, Catch::Contains("On Waste (units), fixed_order is the best at the base and at "
                                   "every value tried."));
  CHECK_THAT(html, Catch::Contains("<td class=\"neutral\">no</td>"));
}

TEST_CASE("allocation html: the plan groups table and level bars", "[html]") {
  AllocationPage page;
  page.scenario = "two-shops";
  page.policy = "network";
  page.grouping = "abc";
  page.currency = "EUR";
  page.day = 14;
  page.seed = 7;
  page.groups = {{"A <fast>", 0.9, 12, 0.912, 23.46, 1.25, 1234.567},
                 {"C & slow", 0.55, 4, 0.5, 2.0, 0.75, 12.0}};
  page.network = {"network", 0.8, 16, 0.81, 18.1, 2.0, 1246.567};
  page.groups[0].critical_ratio = 0.74;
  page.groups[0].cv = 0.4;
  page.groups[0].point_cost_per_day = 1.861;
  page.note = "multiplier 3.2 per expected in-stock store-item-day";
  const std::string html = allocation_html(page);
  CHECK(test::markup_problems(html, "html", "html").empty());
  // The why columns (issue 24): critical ratio and demand cv after the store-items, the cost of
  // one more point of in-stock last; the network row shows no ratio or cv.
  CHECK(html.find("<th scope=\"row\">A &lt;fast&gt;</th><td class=\"num\">90</td><td "
                  "class=\"num\">12</td><td class=\"num\">0.74</td><td class=\"num\">0.40</td>"
                  "<td class=\"num\">91.2</td><td class=\"num\">23.5</td>"
                  "<td class=\"num\">1.2</td><td class=\"num\">1,234.57</td>"
                  "<td class=\"num\">1.86</td>") != std::string::npos);
  CHECK(html.find("<th scope=\"row\">network (target)</th><td class=\"num\">80</td><td "
                  "class=\"num\">16</td><td class=\"num\">-</td><td class=\"num\">-</td>") !=
        std::string::npos);
  CHECK(html.find("C &amp; slow") != std::string::npos);
  CHECK(html.find("55%") != std::string::npos);
}

}  // namespace
}  // namespace larder
