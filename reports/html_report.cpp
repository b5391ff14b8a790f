#include "reports/html_report.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <utility>

#include "reports/comparison.hpp"
#include "reports/html_breakdown.hpp"
#include "reports/html_decision.hpp"
#include "reports/html_page.hpp"
#include "reports/html_trace.hpp"
#include "reports/metric_label.hpp"
#include "reports/number_format.hpp"
#include "reports/svg_chart.hpp"
#include "reports/terminal_table.hpp"
#include "reports/xml_text.hpp"

namespace larder {

namespace {

constexpr std::array kChartMetrics = {Metric::waste_share, Metric::in_stock_at_close,
                                      Metric::fill_rate, Metric::profit};
constexpr std::array kEnvironmentMetrics = {Metric::waste_kg, Metric::co2e_kg};

bool reports(const RunResult& r, Metric m) {
  return std::find(r.metrics.begin(), r.metrics.end(), m) != r.metrics.end();
}

std::string policy_label(const RunResult& r, std::size_t p) {
  return static_cast<int>(p) == r.baseline ? r.policies[p] + " (baseline)" : r.policies[p];
}

std::vector<Estimate> estimates(const RunResult& r, Metric m) {
  std::vector<Estimate> out;
  for (std::size_t p = 0; p < r.policies.size(); ++p) {
    out.push_back(policy_estimate(r, static_cast<int>(p), m));
  }
  return out;
}

/// Decimals of a row of estimates: the finest any of them needs (as the terminal table).
int row_decimals(const std::vector<Estimate>& est, std::string_view unit) {
  int decimals = 0;
  for (const Estimate& e : est)
    decimals = std::max(decimals, estimate_decimals(half_width(e), unit));
  return decimals;
}

// --- the page's parts -------------------------------------------------------------------

std::string page_header(const RunResult& r) {
  const RunInfo& i = r.info;
  std::string out =
      fmt::format("<header>\n<h1>Policy comparison: {}</h1>\n", xml_escape(i.scenario_name));
  out += html_paragraph(
      fmt::format("{} ordering policies simulated on the same customers over {} replications "
                  "of {} days; each compared with the baseline, {}.",
                  r.policies.size(), i.replications, i.horizon_days,
                  r.policies.empty() ? "" : r.policies[static_cast<std::size_t>(r.baseline)]),
      "lead");
  return out;
}

/// Links to the sections that `body` holds, then the cautions.
std::string contents(std::string_view body) {
  constexpr std::array<std::pair<std::string_view, std::string_view>, 9> kSections = {{
      {"decision", "Decision summary"},
      {"simulated", "What was simulated"},
      {"comparison", "Policies compared"},
      {"charts", "Charts"},
      {"environment", "Waste in kg"},
      {"breakdown", "Breakdowns"},
      {"plan-groups", "Network plans"},
      {"substitution", "Substitution"},
      {"daily", "Day by day"},
  }};
  std::string out = "<nav aria-label=\"Contents\"><ul>";
  for (const auto& [id, label] : kSections) {
    if (body.find(fmt::format("<section id=\"{}\">", id)) == std::string_view::npos) continue;
    out += fmt::format("<li><a href=\"#{}\">{}</a></li>", id, label);
  }
  return out + "<li><a href=\"#cautions\">Cautions</a></li></ul></nav>\n";
}

std::string fact(std::string_view term, std::string_view markup) {
  return fmt::format("<dt>{}</dt><dd>{}</dd>\n", xml_escape(term), markup);
}

std::string simulated_section(const RunResult& r, const ReportContext& context) {
  const RunInfo& i = r.info;
  std::string network;
  if (context.scenario_lines.empty()) {
    network = xml_escape(fmt::format("{} stores, {} items, {} days of which {} are a warm-up",
                                     i.stores, i.items, i.horizon_days, i.warmup_days));
  } else {
    network = "<ul>";
    for (const std::string& line : context.scenario_lines) {
      network += "<li>" + xml_escape(line) + "</li>";
    }
    network += "</ul>";
  }
  std::string policies;
  for (std::size_t p = 0; p < r.policies.size(); ++p) {
    policies += (p > 0 ? ", " : "") + policy_label(r, p);
  }
  std::string facts = "<dl class=\"facts\">\n";
  facts +=
      fact("Scenario", xml_escape(i.scenario_file.empty()
                                      ? i.scenario_name
                                      : fmt::format("{} ({})", i.scenario_name, i.scenario_file)));
  facts += fact("Network and horizon", network);
  facts += fact("Replications",
                xml_escape(fmt::format("{}: independent realisations of the whole horizon, every "
                                       "policy meeting the same customers in each",
                                       i.replications)));
  facts += fact("Seed", xml_escape(fmt::format("{}", i.seed)));
  facts += fact("Policies", xml_escape(policies));
  facts += fact("Run",
                xml_escape(fmt::format("larder {}, {} thread{}, {:.1f} s of simulation", i.version,
                                       i.threads, i.threads == 1 ? "" : "s", i.seconds)));
  facts += "</dl>\n";
  const std::string rerun =
      html_paragraph("To repeat this run exactly (the same numbers on any number of threads):") +
      fmt::format("<pre><code>{}</code></pre>\n", xml_escape(i.command));
  return html_section("simulated", "What was simulated", facts + rerun);
}

std::string estimates_table(const RunResult& r, const std::vector<Metric>& metrics,
                            std::string_view caption) {
  HtmlTable table(caption);
  std::vector<std::string> header = {"metric"};
  for (std::size_t p = 0; p < r.policies.size(); ++p) header.push_back(policy_label(r, p));
  table.header(header);
  for (const Metric m : metrics) {
    const std::string_view unit = metric_info(m).unit;
    const std::vector<Estimate> est = estimates(r, m);
    const int decimals = row_decimals(est, unit);
    std::vector<HtmlCell> row = {{metric_label(m, r.info.currency), {}, true}};
    for (const Estimate& e : est) {
      row.push_back({format_estimate(e.mean, half_width(e), unit, decimals), "num"});
    }
    table.row(row);
  }
  return table.str();
}

/// A metric as a verdict names it: its words in lower case, the unit's kind when two metrics
/// share the words ("lower waste in kg CO2e").
std::string verdict_name(Metric m) {
  std::string words = metric_words(m);
  if (!words.empty() && words[0] >= 'A' && words[0] <= 'Z' &&
      (words.size() < 2 || words[1] < 'A' || words[1] > 'Z')) {
    words[0] = static_cast<char>(words[0] - 'A' + 'a');
  }
  switch (m) {
    case Metric::waste_share:
      return words + " share";
    case Metric::waste_kg:
      return words + " in kg";
    case Metric::co2e_kg:
      return words + " in kg CO2e";
    default:
      return words;
  }
}

std::string_view tone_class(VerdictTone t) {
  switch (t) {
    case VerdictTone::better:
      return "better";
    case VerdictTone::worse:
      return "worse";
    case VerdictTone::neutral:
      return "neutral";
    default:
      return "none";
  }
}

std::string difference_table(const RunResult& r, int policy, const std::vector<Metric>& metrics) {
  HtmlTable table(difference_title(r, policy));
  table.header({"metric", "difference", "95% CI", "verdict"});
  for (const Metric m : metrics) {
    const std::string_view unit = metric_info(m).unit;
    const Estimate d = baseline_difference(r, policy, m);
    const int decimals = estimate_decimals(half_width(d), unit);
    table.row({{metric_label(m, r.info.currency, true), {}, true},
               {format_number(display_value(d.mean, unit), decimals), "num"},
               {format_interval(d.ci_low, d.ci_high, unit, decimals), "num"},
               {verdict(m, d, verdict_name(m)), tone_class(verdict_tone(m, d))}});
  }
  return table.str();
}

std::string comparison_section(const RunResult& r) {
  const std::vector<Metric> metrics = table_metrics(r);
  std::string content = html_paragraph(
      "Each cell is the mean over replications with the half-width of its 95% confidence "
      "interval. Shares are in percent. Differences are paired: the same replication of two "
      "policies meets the same customers, so the interval reflects the policies, not the luck "
      "of the draw.");
  content += estimates_table(r, metrics, fmt::format("The key metrics ({})", kEstimateCaption));
  for (int p = 0; p < static_cast<int>(r.policies.size()); ++p) {
    if (p != r.baseline) content += difference_table(r, p, metrics);
  }
  if (r.policies.size() > 2) {
    content += html_paragraph(
        "These differences are against the baseline. pairs.csv beside this page compares every "
        "pair of policies the same way.");
  }
  content += html_details(
      "Every metric of the run",
      estimates_table(r, r.metrics, fmt::format("All metrics ({})", kEstimateCaption)), false);
  return html_section("comparison", "Policies compared", content);
}

std::string bar_chart(const RunResult& r, Metric m) {
  const MetricInfo& info = metric_info(m);
  const std::vector<Estimate> est = estimates(r, m);
  const int decimals = row_decimals(est, info.unit);
  BarChart chart;
  chart.title = fmt::format("{} by policy", metric_label(m, r.info.currency));
  chart.axis_label = metric_label(m, r.info.currency);
  for (std::size_t p = 0; p < est.size(); ++p) {
    const Estimate& e = est[p];
    chart.bars.push_back({policy_label(r, p), display_value(e.mean, info.unit),
                          display_value(half_width(e), info.unit),
                          format_estimate(e.mean, half_width(e), info.unit, decimals)});
  }
  const bool dots = zero_hides_differences(chart.bars);
  return html_figure(
      svg_bar_chart(chart),
      fmt::format("{}: {}. {} mean over replications; whiskers and numbers: the 95% confidence "
                  "interval.{}",
                  metric_words(m), info.description, dots ? "Dots:" : "Bars:",
                  dots ? " The axis spans the values, not 0, so that differences show." : ""));
}

std::string scatter(const RunResult& r) {
  ScatterChart chart;
  chart.title = "Waste against in stock at close";
  chart.x_label = metric_label(Metric::in_stock_at_close, r.info.currency);
  chart.y_label = metric_label(Metric::waste_share, r.info.currency);
  const std::vector<Estimate> x = estimates(r, Metric::in_stock_at_close);
  const std::vector<Estimate> y = estimates(r, Metric::waste_share);
  for (std::size_t p = 0; p < r.policies.size(); ++p) {
    chart.points.push_back({r.policies[p], 100.0 * x[p].mean, 100.0 * half_width(x[p]),
                            100.0 * y[p].mean, 100.0 * half_width(y[p])});
  }
  return html_figure(svg_scatter(chart),
                     "Each policy's waste share against its in-stock share at close, with 95% "
                     "confidence intervals both ways. Down and to the right is better: less "
                     "waste, more often a unit left for the last customer.");
}

std::string charts_section(const RunResult& r) {
  std::string charts;
  for (const Metric m : kChartMetrics) {
    if (reports(r, m)) charts += bar_chart(r, m);
  }
  if (reports(r, Metric::waste_share) && reports(r, Metric::in_stock_at_close)) {
    charts += scatter(r);
  }
  if (charts.empty()) return {};
  return html_section("charts", "Charts", "<div class=\"charts\">\n" + charts + "</div>\n");
}

std::string environment_section(const RunResult& r) {
  std::string charts;
  for (const Metric m : kEnvironmentMetrics) {
    if (reports(r, m)) charts += bar_chart(r, m);
  }
  if (charts.empty()) return {};
  const bool co2e = reports(r, Metric::co2e_kg);
  return html_section(
      "environment", co2e ? "Waste in kilograms and CO2e" : "Waste in kilograms",
      html_paragraph(fmt::format("Wasted units times each item's {} per unit, summed over the "
                                 "scored days of the whole network.",
                                 co2e ? "weight_kg and co2e_kg" : "weight_kg")) +
          "<div class=\"charts\">\n" + charts + "</div>\n");
}

std::string substitution_section(const RunResult& r) {
  if (r.substitution_pairs.empty() || r.substituted.size() != r.policies.size()) return {};
  HtmlTable table(
      fmt::format("Units sold to customers who found their first choice out, "
                  "over the scored days ({})",
                  kEstimateCaption));
  std::vector<std::string> header = {"first choice", "bought instead"};
  header.insert(header.end(), r.policies.begin(), r.policies.end());
  table.header(header);
  for (std::size_t k = 0; k < r.substitution_pairs.size(); ++k) {
    std::vector<Estimate> est;
    for (const auto& per_rep : r.substituted) {
      std::vector<double> v;
      for (const auto& row : per_rep) v.push_back(row[k]);
      est.push_back(report_estimate(v));
    }
    const int decimals = row_decimals(est, "units");
    std::vector<HtmlCell> row = {{r.substitution_pairs[k].from, {}, true},
                                 {r.substitution_pairs[k].to}};
    for (const Estimate& e : est) {
      row.push_back({format_estimate(e.mean, half_width(e), "units", decimals), "num"});
    }
    table.row(row);
  }
  return html_section(
      "substitution", "Substitution flows",
      html_paragraph("The same numbers as substitution.csv.") +
          html_details(fmt::format("{} substitution pair{}", r.substitution_pairs.size(),
                                   r.substitution_pairs.size() == 1 ? "" : "s"),
                       table.str(), r.substitution_pairs.size() <= 12));
}

std::string page_footer(const RunResult& r) {
  return fmt::format(
      "<footer><p>Written by larder {}. Every number comes from the replications of this run; "
      "summary.json, metrics.csv and breakdown.csv beside this page hold them with every "
      "digit.</p></footer>\n",
      xml_escape(r.info.version));
}

}  // namespace

std::string html_report(const RunResult& result, const ReportContext& context) {
  std::string body = html_decision_section(result);
  body += html_cautions(context.cautions);
  body += simulated_section(result, context);
  body += comparison_section(result);
  body += charts_section(result);
  body += environment_section(result);
  body += html_breakdown_section(result);
  body += html_plan_group_section(result);
  body += substitution_section(result);
  if (context.trace) body += html_trace_section(*context.trace);
  body += page_footer(result);
  body = page_header(result) + contents(body) + "</header>\n" + body;
  return html_document(fmt::format("larder report: {}", result.info.scenario_name), body);
}

}  // namespace larder
