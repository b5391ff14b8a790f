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

TEST_CASE("sweep.html: frontier labels, the rows table and well-formed markup", "[html]") {
  const std::vector<Setting> settings = {{"policies.*.quantity.target", {"0.6", "0.8"}}};
  const std::vector<SweepPoint> points = {{{"0.6"}, shifted_run(0.0)}, {{"0.8"}, shifted_run(0.1)}};
  const FrontierMarks marks = sweep_frontiers(points);
  const std::string html = sweep_html(settings, points, marks);
  CHECK(test::markup_problems(html, "html", "html").empty());

  std::size_t row = 0;
  std::size_t on_front = 0;
  for (const SweepPoint& pt : points) {
    const RunResult& r = pt.result;
    for (std::size_t p = 0; p < r.policies.size(); ++p, ++row) {
      const std::string label = xml_escape(r.policies[p] + " @ " + pt.values[0]);
      const std::string marked = label + " " + std::string(kFrontierMark);
      // Each row appears once per chart; marked in a chart exactly when sweep_frontiers says.
      const int in_stock_marked = marks.waste_in_stock[row] ? 1 : 0;
      const int profit_marked = marks.profit_waste[row] ? 1 : 0;
      CHECK(count(html, marked + "<") == static_cast<std::size_t>(in_stock_marked + profit_marked));
      CHECK(count(html, label + "<") ==
            static_cast<std::size_t>(2 - in_stock_marked - profit_marked));
      on_front += static_cast<std::size_t>(in_stock_marked);
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
  CHECK(on_front > 0);
  CHECK(on_front < row);
  // Hand check of one cell: newsvendor at 0.6, waste shares 0.099 0.109 0.097 0.107 0.113 have
  // mean 0.105, so 10.5%.
  CHECK(html.find("<td>newsvendor</td><td class=\"num\">10.5</td>") != std::string::npos);
}

TEST_CASE("sweep.html for --vary: the tornado table and swing bars", "[html]") {
  const std::vector<SweepPoint> points = {{{}, test::sample_run()}};
  const Estimate base{200, 10, 180, 220, 5};
  const std::vector<TornadoRow> rows = {{"price",
                                         "newsvendor",
                                         {"-10%", "+10%"},
                                         {{-50, 5, -60, -40, 5}, {450, 5, 440, 460, 5}},
                                         base,
                                         500,
                                         true},
                                        {"unit_cost",
                                         "cautious, v2",
                                         {"-20%"},
                                         {{1250.4, 5, 1240.4, 1260.4, 5}},
                                         base,
                                         1050.4,
                                         false}};
  const std::string html = sensitivity_html(points, rows);
  CHECK(test::markup_problems(html, "html", "html").empty());
  CHECK(html.find("<th scope=\"row\">newsvendor</th><td>price</td>") != std::string::npos);
  CHECK(html.find("-10%: -50 ± 10; +10%: 450 ± 10") != std::string::npos);
  CHECK(html.find("<td class=\"num\">1,050</td><td class=\"neutral\">holds</td>") !=
        std::string::npos);
  CHECK(html.find("500 (ranking flips)") != std::string::npos);
  CHECK(html.find("price") < html.find("unit_cost"));
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
