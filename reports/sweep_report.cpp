#include "reports/sweep_report.hpp"

#include <fmt/format.h>

#include "reports/comparison.hpp"
#include "reports/html_page.hpp"
#include "reports/number_format.hpp"
#include "reports/report_context.hpp"
#include "reports/svg_chart.hpp"
#include "reports/xml_text.hpp"

namespace larder {

namespace {

std::string joined(const std::vector<std::string>& values) {
  std::string out;
  for (const std::string& v : values) out += (out.empty() ? "" : ", ") + v;
  return out;
}

std::string page_header(std::string_view heading, std::string_view lead) {
  return fmt::format("<header>\n<h1>{}</h1>\n{}</header>\n", xml_escape(heading),
                     html_paragraph(lead, "lead"));
}

/// One (point, policy) row of a grid sweep, point-major as sweep_frontiers counts them.
struct Row {
  std::string point;  ///< the point's values
  std::string policy;
  Estimate waste, in_stock, fill, profit;
};

std::vector<Row> rows_of(const std::vector<SweepPoint>& points) {
  std::vector<Row> out;
  for (const SweepPoint& pt : points) {
    const RunResult& r = pt.result;
    for (std::size_t p = 0; p < r.policies.size(); ++p) {
      const int k = static_cast<int>(p);
      out.push_back({joined(pt.values), r.policies[p], policy_estimate(r, k, Metric::waste_share),
                     policy_estimate(r, k, Metric::in_stock_at_close),
                     policy_estimate(r, k, Metric::fill_rate),
                     policy_estimate(r, k, Metric::profit)});
    }
  }
  return out;
}

std::string point_label(const Row& row, bool frontier) {
  return fmt::format("{} @ {}{}", row.policy, row.point,
                     frontier ? fmt::format(" {}", kFrontierMark) : "");
}

std::string frontier_scatter(const std::vector<Row>& rows, const std::vector<bool>& marks,
                             bool profit, std::string_view currency) {
  ScatterChart chart;
  chart.width = 760;
  chart.title = profit ? "waste_share against profit" : "waste_share against in_stock_at_close";
  chart.x_label = "waste_share, %";
  chart.y_label =
      profit ? fmt::format("profit, {}", unit_label("money", currency)) : "in_stock_at_close, %";
  for (std::size_t i = 0; i < rows.size(); ++i) {
    const Row& r = rows[i];
    const Estimate& y = profit ? r.profit : r.in_stock;
    const double scale = profit ? 1.0 : 100.0;
    chart.points.push_back({point_label(r, i < marks.size() && marks[i]), 100.0 * r.waste.mean,
                            100.0 * half_width(r.waste), scale * y.mean, scale * half_width(y)});
  }
  return html_figure(
      svg_scatter(chart),
      profit ? fmt::format("Each point and policy: waste share against profit, with 95% "
                           "confidence intervals both ways. Rows marked {} have no other row "
                           "with both less waste and more profit (up and to the left is better).",
                           kFrontierMark)
             : fmt::format("Each point and policy: waste share against the in-stock share at "
                           "close, with 95% confidence intervals both ways. Rows marked {} have "
                           "no other row with both less waste and more in stock (up and to the "
                           "left is better).",
                           kFrontierMark));
}

std::string frontier_text(bool waste_in_stock, bool profit_waste) {
  std::string out;
  if (waste_in_stock) out = "\u2605 waste/in stock";
  if (profit_waste) {
    out += out.empty() ? "\u2605 waste/profit" : "; \u2605 waste/profit";
  }
  return out;
}

std::string rows_table(const std::vector<Setting>& settings, const std::vector<SweepPoint>& points,
                       const FrontierMarks& marks, std::string_view currency) {
  HtmlTable table(
      "Every point and policy: means over replications (shares in percent); sweep.csv holds "
      "every metric with its standard error");
  std::vector<std::string> header = {"point"};
  for (const Setting& s : settings) header.push_back(s.path);
  for (const std::string h : {"policy", "waste share, %", "in stock at close, %", "fill rate, %"})
    header.push_back(h);
  header.push_back(fmt::format("profit, {}", unit_label("money", currency)));
  header.push_back("frontier");
  table.header(header);
  std::size_t row = 0;
  for (std::size_t i = 0; i < points.size(); ++i) {
    const RunResult& r = points[i].result;
    for (std::size_t p = 0; p < r.policies.size(); ++p, ++row) {
      const int k = static_cast<int>(p);
      std::vector<HtmlCell> cells = {{fmt::format("{}", i + 1), "num", true}};
      for (const std::string& v : points[i].values) cells.push_back({v});
      cells.push_back({r.policies[p]});
      for (const Metric m : {Metric::waste_share, Metric::in_stock_at_close, Metric::fill_rate}) {
        cells.push_back({format_number(100.0 * policy_estimate(r, k, m).mean, 1), "num"});
      }
      cells.push_back({format_number(policy_estimate(r, k, Metric::profit).mean, 0), "num"});
      cells.push_back({frontier_text(row < marks.waste_in_stock.size() && marks.waste_in_stock[row],
                                     row < marks.profit_waste.size() && marks.profit_waste[row])});
      table.row(cells);
    }
  }
  return table.str();
}

std::string footer(std::string_view version, std::string_view files) {
  return fmt::format(
      "<footer><p>Written by larder {}. {} beside this page hold{} every number with every "
      "digit.</p></footer>\n",
      xml_escape(version), xml_escape(files), files.find(',') == std::string_view::npos ? "s" : "");
}

}  // namespace

std::string sweep_html(const std::vector<Setting>& settings, const std::vector<SweepPoint>& points,
                       const FrontierMarks& marks) {
  const RunInfo info = points.empty() ? RunInfo{} : points.front().result.info;
  std::string paths;
  for (const Setting& s : settings) paths += (paths.empty() ? "" : ", ") + s.path;
  const std::vector<Row> rows = rows_of(points);
  std::string body = html_cautions(report_cautions());
  body += html_section(
      "frontiers", "Trade-off frontiers",
      html_paragraph("Every policy at every point of the grid ran on the same seed, so the "
                     "points differ by their settings, not by the draws. Labels read "
                     "\"policy @ values\", the values in the order of the settings (" +
                     paths + ").") +
          "<div class=\"charts\">\n" +
          frontier_scatter(rows, marks.waste_in_stock, false, info.currency) +
          frontier_scatter(rows, marks.profit_waste, true, info.currency) + "</div>\n");
  body += html_section("points", "Points and policies",
                       rows_table(settings, points, marks, info.currency));
  body += footer(info.version, "sweep.csv");
  const std::string lead =
      fmt::format("{} points of {} ({}), {} replications each, seed {}.", points.size(),
                  info.scenario_name, paths, info.replications, info.seed);
  return html_document(fmt::format("larder sweep: {}", info.scenario_name),
                       page_header(fmt::format("Sweep: {}", info.scenario_name), lead) + body);
}

std::string sensitivity_html(const std::vector<SweepPoint>& points,
                             const std::vector<TornadoRow>& rows) {
  const RunResult base = points.empty() ? RunResult{} : points.front().result;
  const std::string baseline = base.policies.empty()
                                   ? std::string()
                                   : base.policies[static_cast<std::size_t>(base.baseline)];
  const std::string money = unit_label("money", base.info.currency);
  const auto estimate = [](const Estimate& e) {
    return format_estimate(e.mean, half_width(e), "money", 0);
  };
  HtmlTable table(
      fmt::format("Profit difference against {}, {} (paired, mean \u00b1 95% "
                  "half-width), widest swing first",
                  baseline, money));
  table.header({"policy", "input", "at base", "at each value", "swing", "ranking"});
  BarChart chart;
  chart.width = 760;
  chart.title = fmt::format("swing of the profit difference against {}", baseline);
  chart.axis_label = fmt::format("swing, {}", money);
  for (const TornadoRow& r : rows) {
    std::string at_values;
    for (std::size_t v = 0; v < r.values.size() && v < r.difference.size(); ++v) {
      at_values += fmt::format("{}{}: {}", at_values.empty() ? "" : "; ", r.values[v],
                               estimate(r.difference[v]));
    }
    const std::string swing = format_number(r.swing, 0);
    table.row({{r.policy, {}, true},
               {r.path},
               {estimate(r.base), "num"},
               {at_values, "num"},
               {swing, "num"},
               {r.flips ? "flips" : "holds", r.flips ? "worse" : "neutral"}});
    chart.bars.push_back({fmt::format("{}: {}", r.policy, r.path), r.swing, 0.0,
                          r.flips ? swing + " (ranking flips)" : swing});
  }
  std::string body = html_cautions(report_cautions());
  body += html_section(
      "tornado", "Sensitivity of the comparison",
      html_paragraph("One input changed at a time, every run on the same seed. The swing is the "
                     "largest minus the smallest mean difference, the base included; the ranking "
                     "flips when some difference has the other sign than at the base.") +
          table.str() +
          html_figure(svg_bar_chart(chart),
                      "The swing of each policy's paired profit difference against the baseline "
                      "per varied input, widest first."));
  body += footer(base.info.version, "sensitivity.csv");
  const std::string lead = fmt::format(
      "{} runs of {}: the base, then one input changed at a time; {} replications "
      "per run, seed {}.",
      points.size(), base.info.scenario_name, base.info.replications, base.info.seed);
  return html_document(
      fmt::format("larder sensitivity: {}", base.info.scenario_name),
      page_header(fmt::format("Sensitivity: {}", base.info.scenario_name), lead) + body);
}

}  // namespace larder
