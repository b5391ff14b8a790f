#include "reports/scorecard_html.hpp"

#include <fmt/format.h>

#include <cmath>

#include "reports/html_page.hpp"
#include "reports/metric_label.hpp"
#include "reports/number_format.hpp"
#include "reports/scorecard_text.hpp"
#include "reports/svg_chart.hpp"

namespace larder {

namespace {

std::string value_text(double v, Metric m, bool difference = false) {
  const MetricInfo& info = metric_info(m);
  if (info.unit == "share") {
    return format_number(display_value(v, info.unit), 1) + (difference ? " pts" : "%");
  }
  return format_number(v, info.unit == "money" ? 2 : 0);
}

std::string fit_text(const SlopeFit& f) {
  if (!std::isfinite(f.value)) return "n/a";
  return fmt::format("{:.2f} ± {:.2f}", f.value, f.std_error);
}

std::string percent(double v) {
  return std::isfinite(v) ? fmt::format("{:.0f}%", 100.0 * v) : std::string("n/a");
}

}  // namespace

std::string scorecard_html(const Scorecard& c) {
  std::string body;
  std::string items;
  for (const auto& i : c.items) {
    if (!items.empty()) items += ", ";
    items += i;
  }
  body += fmt::format("<h1>{}</h1>\n", "Drill scorecard");
  body += html_paragraph(fmt::format(
      "{} ordered {} at store {} for {} drill days (scenario {}, seed {}). Every policy below met "
      "exactly the same customers (common random numbers); profit is in {}.",
      c.trainee, items, c.store, c.days, c.scenario, c.seed, c.currency));

  const std::vector<Metric> ms = scorecard_metrics();
  HtmlTable totals("Totals over the drill days");
  std::vector<std::string> head{"metric"};
  for (const auto& p : c.policies) head.push_back(p);
  totals.header(head);
  for (const Metric m : ms) {
    std::vector<HtmlCell> row{{metric_label(m, c.currency), {}, true}};
    for (size_t p = 0; p < c.policies.size(); ++p) {
      row.push_back({value_text(at(c.totals[p], m), m), "num"});
    }
    totals.row(row);
  }
  HtmlTable diff(fmt::format("{} minus each policy", c.trainee));
  std::vector<std::string> dhead{"metric"};
  for (size_t p = 1; p < c.policies.size(); ++p) dhead.push_back("vs " + c.policies[p]);
  diff.header(dhead);
  for (const Metric m : ms) {
    std::vector<HtmlCell> row{{metric_label(m, c.currency, true), {}, true}};
    for (size_t p = 1; p < c.policies.size(); ++p) {
      const double d = at(c.totals[0], m) - at(c.totals[p], m);
      const int better = metric_info(m).better;
      const std::string_view cls = !std::isfinite(d) || d == 0.0 || better == 0 ? "neutral"
                                   : (d > 0) == (better > 0)                    ? "better"
                                                                                : "worse";
      row.push_back({value_text(d, m, true), cls});
    }
    diff.row(row);
  }
  body += html_section("totals", "Totals", totals.str() + diff.str());

  LineChart chart;
  chart.title = fmt::format("Cumulative profit of {} minus each policy", c.trainee);
  chart.x_label = "drill day";
  chart.y_label = fmt::format("profit difference ({})", metric_unit(Metric::profit, c.currency));
  for (int d = 0; d < c.days; ++d) chart.x.push_back(d + 1);
  for (size_t p = 1; p < c.policies.size(); ++p) {
    LineSeries s{"vs " + c.policies[p], {}};
    double sum = 0.0;
    for (size_t d = 0; d < static_cast<size_t>(c.days); ++d) {
      const double v = at(c.daily[0][d], Metric::profit) - at(c.daily[p][d], Metric::profit);
      if (std::isfinite(v)) sum += v;
      s.y.push_back(sum);
    }
    chart.series.push_back(std::move(s));
  }
  HtmlTable days("Day by day");
  std::vector<std::string> yhead{"day", "weekday"};
  for (const auto& p : c.policies) {
    yhead.push_back(fmt::format("{}: {}", p, metric_label(Metric::profit, c.currency)));
    yhead.push_back(fmt::format("{}: {}", p, metric_label(Metric::waste_units, c.currency)));
  }
  days.header(yhead);
  for (size_t d = 0; d < static_cast<size_t>(c.days); ++d) {
    std::vector<HtmlCell> row{{fmt::format("{}", d + 1), "num", true}, {c.weekday[d]}};
    for (size_t p = 0; p < c.policies.size(); ++p) {
      row.push_back({value_text(at(c.daily[p][d], Metric::profit), Metric::profit), "num"});
      row.push_back(
          {value_text(at(c.daily[p][d], Metric::waste_units), Metric::waste_units), "num"});
    }
    days.row(row);
  }
  body += html_section(
      "days", "Day by day",
      html_figure(svg_line_chart(chart), "Above zero: the trainee has earned more so far.") +
          html_details("The table of every day", days.str(), false));

  HtmlTable habits("Habit readings (standard errors after ±)");
  habits.header({"item", "chasing the last sales (theta)", "pull to centre (w)", "service implied",
                 "service justified", "orders"});
  for (const HabitReading& h : c.habits) {
    habits.row({{h.item, {}, true},
                {fit_text(h.chasing), "num"},
                {fit_text(h.pull_to_center), "num"},
                {percent(h.implied_service), "num"},
                {percent(h.justified_service), "num"},
                {fmt::format("{}", h.orders), "num"}});
  }
  std::string reading;
  if (!c.habits.empty()) {
    for (const auto& s : habit_sentences(c.habits.front())) reading += html_paragraph(s);
  }
  body += html_section(
      "habits", "Habits",
      reading + habits.str() +
          html_paragraph(
              "Theta: the least-squares coefficient of S_{t-1} - Q_{t-1} in Q_t - Q_{t-1} (demand "
              "chasing, Q_t = Q_{t-1} + theta (S_{t-1} - Q_{t-1})), with the change of the mean "
              "demand as a second regressor so that following the weekday pattern is not read as "
              "chasing; w: Q = (1 - w) Q* + w mean by least squares, per unit of the day's mean "
              "(pull to centre); both rules from Schweitzer and Cachon (2000). Q is the stock at "
              "opening, S the sales seen when ordering, Q* the profit-maximising stock of the "
              "true demand. Service implied: the mean probability that the stock covered demand, "
              "F(Q); justified: the critical fractile of the margins."));
  body += html_cautions(
      {"One simulated run of model demand: luck matters over a few weeks. Read the scorecard "
       "with the trainer, not as a verdict on a person.",
       "Shelf lives, next-day sale and donation must follow local food-safety law and the "
       "producer's use-by dates."});
  return html_document(fmt::format("Drill scorecard: {}", c.trainee), body);
}

}  // namespace larder
