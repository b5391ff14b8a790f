#include "reports/sweep_report.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cctype>

#include "reports/comparison.hpp"
#include "reports/html_page.hpp"
#include "reports/metric_label.hpp"
#include "reports/number_format.hpp"
#include "reports/report_context.hpp"
#include "reports/svg_chart.hpp"
#include "reports/xml_text.hpp"

namespace larder {

namespace {

std::string page_header(std::string_view heading, std::string_view lead) {
  return fmt::format("<header>\n<h1>{}</h1>\n{}</header>\n", xml_escape(heading),
                     html_paragraph(lead, "lead"));
}

std::string frontier_text(bool waste_in_stock, bool profit_waste) {
  std::string out;
  if (waste_in_stock) out = "\u2605 waste/in stock";
  if (profit_waste) {
    out += out.empty() ? "\u2605 waste/profit" : "; \u2605 waste/profit";
  }
  return out;
}

/// The name of a series: the policy, then the values of every setting but the last.
std::string series_name(const std::vector<Setting>& settings, const SweepPoint& pt,
                        const std::string& policy) {
  std::string name = policy;
  for (std::size_t k = 0; k + 1 < settings.size() && k < pt.values.size(); ++k) {
    const std::string& path = settings[k].path;
    name += fmt::format(", {}={}", path.substr(path.rfind('.') + 1), pt.values[k]);
  }
  return name;
}

/// A chart's points: one series per policy (and values of the settings but the last), its
/// points in the order of the last setting's values, each labelled with that value; the rows
/// marked in `marks` (if any) ringed.
std::vector<PointSeries> sweep_series(const std::vector<Setting>& settings,
                                      const std::vector<SweepPoint>& points, Metric x, Metric y,
                                      const std::vector<bool>* marks) {
  std::vector<PointSeries> out;
  std::size_t row = 0;
  const auto scale = [](Metric m) { return metric_info(m).unit == "share" ? 100.0 : 1.0; };
  for (const SweepPoint& pt : points) {
    const RunResult& r = pt.result;
    for (std::size_t p = 0; p < r.policies.size(); ++p, ++row) {
      const std::string name = series_name(settings, pt, r.policies[p]);
      auto it = std::find_if(out.begin(), out.end(),
                             [&](const PointSeries& s) { return s.name == name; });
      if (it == out.end()) it = out.insert(out.end(), PointSeries{name, {}});
      const int k = static_cast<int>(p);
      const Estimate ex = policy_estimate(r, k, x);
      const Estimate ey = policy_estimate(r, k, y);
      it->points.push_back({scale(x) * ex.mean, scale(x) * half_width(ex), scale(y) * ey.mean,
                            scale(y) * half_width(ey), pt.values.empty() ? "" : pt.values.back(),
                            marks != nullptr && row < marks->size() && (*marks)[row]});
    }
  }
  return out;
}

std::string sweep_chart(const std::vector<Setting>& settings, const std::vector<SweepPoint>& points,
                        Metric x, Metric y, const std::vector<bool>* marks,
                        std::string_view currency, std::string_view caption) {
  SeriesChart chart;
  chart.title = fmt::format("{} against {}", metric_words(y), [&] {
    std::string w = metric_words(x);
    if (!w.empty()) w[0] = static_cast<char>(std::tolower(w[0]));
    return w;
  }());
  chart.x_label = metric_label(x, currency);
  chart.y_label = metric_label(y, currency);
  chart.series = sweep_series(settings, points, x, y, marks);
  return html_figure(svg_series_chart(chart), caption);
}

std::string rows_table(const std::vector<Setting>& settings, const std::vector<SweepPoint>& points,
                       const FrontierMarks& marks, std::string_view currency) {
  HtmlTable table(
      "Every point and policy: means over replications (shares in percent); sweep.csv holds "
      "every metric with its standard error");
  std::vector<std::string> header = {"point"};
  for (const Setting& s : settings) header.push_back(s.path);
  header.push_back("policy");
  for (const Metric m :
       {Metric::waste_share, Metric::in_stock_at_close, Metric::fill_rate, Metric::profit}) {
    header.push_back(metric_label(m, currency));
  }
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
  const std::string last = settings.empty() ? std::string() : settings.back().path;
  std::string body = html_cautions(report_cautions());
  body += html_section(
      "frontiers", "Trade-offs across the sweep",
      html_paragraph(fmt::format(
          "Every policy at every point of the grid ran on the same seed, so the points differ "
          "by their settings, not by the draws. Each policy is one line in its own colour, dash "
          "and marker, through its points in the order of {} (each point labelled with that "
          "value where there is room); crosshairs are 95% confidence intervals.",
          last)) +
          sweep_chart(settings, points, Metric::in_stock_at_close, Metric::profit, nullptr,
                      info.currency,
                      "Profit against the in-stock share achieved at close: what each point of "
                      "service costs or earns.") +
          sweep_chart(settings, points, Metric::in_stock_at_close, marks.waste,
                      &marks.waste_in_stock, info.currency,
                      fmt::format("{} against the in-stock share achieved at close. Ringed: no "
                                  "other row has both less of it and more in stock (down and to "
                                  "the right is better).",
                                  metric_words(metric_name(marks.waste)))) +
          sweep_chart(settings, points, marks.waste, Metric::profit, &marks.profit_waste,
                      info.currency,
                      fmt::format("Profit against {}. Ringed: no other row has both less of it "
                                  "and more profit (up and to the left is better).",
                                  metric_words(metric_name(marks.waste)))));
  body += html_section("points", "Points and policies",
                       rows_table(settings, points, marks, info.currency));
  body += footer(info.version, "sweep.csv");
  const std::string lead =
      fmt::format("{} points of {} ({}), {} replications each, seed {}.", points.size(),
                  info.scenario_name, paths, info.replications, info.seed);
  return html_document(fmt::format("larder sweep: {}", info.scenario_name),
                       page_header(fmt::format("Sweep: {}", info.scenario_name), lead) + body);
}

namespace {

/// The ranks of one metric: a row per run, a column per policy, the best and whether it
/// changed from the base.
std::string rank_section_table(const RankTable& t, std::string_view currency) {
  HtmlTable table(fmt::format("Ranks on {} (1 = best, {} is better)",
                              metric_label(t.metric, currency), t.better > 0 ? "higher" : "lower"));
  std::vector<std::string> header = {"input", "value"};
  header.insert(header.end(), t.policies.begin(), t.policies.end());
  header.push_back("best");
  header.push_back("best changes");
  table.header(header);
  for (const RankPoint& p : t.points) {
    std::vector<HtmlCell> cells = {{p.input, {}, true}, {p.value}};
    for (const int rank : p.ranks) cells.push_back({fmt::format("{}", rank), "num"});
    std::string best;
    for (const int b : p.best) {
      best += (best.empty() ? "" : " = ") + t.policies[static_cast<std::size_t>(b)];
    }
    cells.push_back({best.empty() ? "n/a" : best});
    if (!p.best_changes) {
      cells.push_back({"no", "neutral"});
    } else if (p.change_clear.value_or(true)) {
      cells.push_back({"yes", "worse"});
    } else {
      cells.push_back({"yes, within noise", "none"});
    }
    table.row(cells);
  }
  return table.str();
}

std::string rank_summary(const RankTable& t, std::string_view currency) {
  const std::string words = metric_label(t.metric, currency);
  if (t.points.empty()) return {};
  std::string base_best;
  for (const int b : t.points.front().best) {
    base_best += (base_best.empty() ? "" : " and ") + t.policies[static_cast<std::size_t>(b)];
  }
  if (!t.best_changes()) {
    return fmt::format("On {}, {} is the best at the base and at every value tried.", words,
                       base_best.empty() ? "no policy" : base_best);
  }
  std::string where;
  for (const RankPoint& p : t.points) {
    if (!p.best_changes) continue;
    where += fmt::format("{}{} {}{}", where.empty() ? "" : "; ", p.input, p.value,
                         p.change_clear.value_or(true) ? "" : " (within noise)");
  }
  return fmt::format("On {}, {} is the best at the base, but not at: {}.", words,
                     base_best.empty() ? "no policy" : base_best, where);
}

}  // namespace

std::string sensitivity_html(const std::vector<SweepPoint>& points,
                             const std::vector<TornadoRow>& rows,
                             const std::vector<RankTable>& ranks) {
  const RunResult base = points.empty() ? RunResult{} : points.front().result;
  const std::string baseline = base.policies.empty()
                                   ? std::string()
                                   : base.policies[static_cast<std::size_t>(base.baseline)];
  const std::string money = metric_unit(Metric::profit, base.info.currency);
  const auto estimate = [](const Estimate& e) {
    return format_estimate(e.mean, half_width(e), "money", 0);
  };
  std::string rank_content = html_paragraph(
      "One input changed at a time, every run on the same seed. At each value every policy is "
      "ranked by its mean; the best changes when another policy ranks first than at the base "
      "(\"within noise\" when the new best's paired 95% interval against the base's best "
      "includes 0).");
  for (const RankTable& t : ranks) {
    rank_content += html_paragraph(rank_summary(t, base.info.currency));
    rank_content += rank_section_table(t, base.info.currency);
  }
  HtmlTable table(
      fmt::format("Profit difference against {}, {} (paired, mean \u00b1 95% "
                  "half-width), widest swing first",
                  baseline, money));
  table.header({"policy", "input", "at base", "at each value", "swing"});
  BarChart chart;
  chart.width = 760;
  chart.axis = BarAxis::from_zero;  // swings are lengths
  chart.title = fmt::format("Swing of the profit difference against {}", baseline);
  chart.axis_label = fmt::format("swing ({})", money);
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
               {swing, "num"}});
    chart.bars.push_back({fmt::format("{}: {}", r.policy, r.path), r.swing, 0.0, swing});
  }
  std::string body = html_cautions(report_cautions());
  body += html_section("ranks", "Does the best policy stay the best?", rank_content);
  body += html_section(
      "tornado", "Sensitivity of the profit differences",
      html_paragraph("The swing is the largest minus the smallest mean difference against the "
                     "baseline, the base included.") +
          table.str() +
          html_figure(svg_bar_chart(chart),
                      "The swing of each policy's paired profit difference against the baseline "
                      "per varied input, widest first."));
  body += footer(base.info.version, "sensitivity.csv, ranks.csv");
  const std::string lead = fmt::format(
      "{} runs of {}: the base, then one input changed at a time; {} replications "
      "per run, seed {}.",
      points.size(), base.info.scenario_name, base.info.replications, base.info.seed);
  return html_document(
      fmt::format("larder sensitivity: {}", base.info.scenario_name),
      page_header(fmt::format("Sensitivity: {}", base.info.scenario_name), lead) + body);
}

}  // namespace larder
