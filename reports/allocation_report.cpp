#include "reports/allocation_report.hpp"

#include <fmt/format.h>

#include <cmath>
#include <limits>

#include "reports/html_page.hpp"
#include "reports/number_format.hpp"
#include "reports/report_context.hpp"
#include "reports/svg_chart.hpp"
#include "reports/xml_text.hpp"

namespace larder {

namespace {

/// Groups shown in the bar chart (the table holds them all).
constexpr std::size_t kChartGroups = 40;

std::vector<HtmlCell> cells(const AllocationRow& r) {
  return {
      {r.group, {}, true},
      {format_number(100.0 * r.level, 0), "num"},
      {fmt::format("{}", r.store_items), "num"},
      {std::isfinite(r.critical_ratio) ? format_number(r.critical_ratio, 2) : "-", "num"},
      {std::isfinite(r.cv) ? format_number(r.cv, 2) : "-", "num"},
      {format_number(100.0 * r.in_stock, 1), "num"},
      {format_number(r.order_basis, 1), "num"},
      {format_number(r.leftover_per_day, 1), "num"},
      {format_number(r.profit_per_day, 2), "num"},
      {std::isfinite(r.point_cost_per_day) ? format_number(r.point_cost_per_day, 2) : "-", "num"}};
}

}  // namespace

std::string allocation_html(const AllocationPage& page) {
  HtmlTable table(fmt::format("The plan of {} per group, the network last", page.policy));
  table.header({"group", "level, %", "store-items", "critical ratio", "demand cv",
                "expected in stock, %", "order basis, units", "leftover/day, units",
                fmt::format("profit/day, {}", unit_label("money", page.currency)),
                fmt::format("one more point/day, {}", unit_label("money", page.currency))});
  for (const AllocationRow& r : page.groups) table.row(cells(r));
  AllocationRow network = page.network;
  network.group += " (target)";
  network.critical_ratio = network.cv = std::numeric_limits<double>::quiet_NaN();
  table.row(cells(network));

  BarChart chart;
  chart.width = 640;
  chart.title = fmt::format("planned level per group, {}", page.policy);
  chart.axis_label = "planned in-stock level, %";
  for (std::size_t g = 0; g < page.groups.size() && g < kChartGroups; ++g) {
    const AllocationRow& r = page.groups[g];
    chart.bars.push_back({r.group, 100.0 * r.level, 0.0, format_number(100.0 * r.level, 0) + "%"});
  }
  const std::string caption =
      page.groups.size() > kChartGroups
          ? fmt::format(
                "The planned in-stock level of the first {} of {} groups; the table "
                "and the CSV hold them all.",
                kChartGroups, page.groups.size())
          : std::string("The planned in-stock level of each group.");

  std::string body = html_cautions(report_cautions());
  body += html_section(
      "plan", "Plan groups",
      html_paragraph(fmt::format(
          "Planned on day {} from the policy's own forecasts of the coming week ({}, seed {}); "
          "target {}% in stock at close, groups by {}. Leftover and profit are per day, summed "
          "over the group's store-items. The critical ratio is (p - c + g) / (p - s + g) of the "
          "group's items weighted by expected demand, the demand cv its sd over its mean; one "
          "more point is the profit a day given up to raise the group's in-stock by one point.",
          page.day,
          page.replications * page.days == 1
              ? std::string("replication 0")
              : fmt::format("the average of {} replications x {} days", page.replications,
                            page.days),
          page.seed, format_number(100.0 * page.network.level, 0), page.grouping)) +
          table.str() + html_paragraph(page.note) + html_figure(svg_bar_chart(chart), caption));
  body += fmt::format(
      "<footer><p>Written by larder. allocation-{}.csv beside this page holds the plan per "
      "group and per store-item with every digit.</p></footer>\n",
      xml_escape(page.policy));
  const std::string header = fmt::format(
      "<header>\n<h1>{}</h1>\n{}</header>\n",
      xml_escape(fmt::format("Network plan: {}, {}", page.policy, page.scenario)),
      html_paragraph(fmt::format("The in-stock levels {} would roll out to its {} groups.",
                                 page.policy, page.groups.size()),
                     "lead"));
  return html_document(fmt::format("larder allocation: {} ({})", page.policy, page.scenario),
                       header + body);
}

}  // namespace larder
