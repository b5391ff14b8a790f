// `larder allocate SCENARIO --policy NAME`: the levels a `network_in_stock` policy would roll
// out (cli.md). Replications run through the warm-up (or to --day) with the policy re-planning
// as it would in `larder run`; then the policy plans on that day (and the --days - 1 days
// after) from its own forecasts, the plans are averaged (averaged_plan.hpp), and the plan is
// printed per group with why each group got its level (group_why.hpp), written per group and
// store-item as CSV, shown as an HTML page, and with --rollout written as a rollout table.

#include <fmt/format.h>

#include <cmath>
#include <filesystem>
#include <limits>

#include "cli/commands.hpp"
#include "reports/allocation_report.hpp"
#include "reports/atomic_file.hpp"
#include "reports/csv.hpp"
#include "reports/output_claim.hpp"
#include "reports/output_folder.hpp"
#include "reports/output_path.hpp"
#include "reports/rollout_csv.hpp"
#include "sim/engine/demand_model.hpp"
#include "sim/runner/averaged_plan.hpp"

namespace larder {

namespace {

/// Sums of the plan's per-store-item expectations (per plan) over a set of store-items.
struct Totals {
  double days = 0, quantity = 0, in_stock = 0, leftover = 0, profit = 0;
  int store_items = 0;
  void add(const AveragedPlan& p, size_t k) {
    days += p.days[k];
    quantity += p.quantity[k] * p.days[k];
    in_stock += p.in_stock[k];
    leftover += p.leftover[k];
    profit += p.profit[k];
    ++store_items;
  }
  /// Store-item-days per day: the store-items, fewer where stores close on planned days.
  double per_day() const {
    const double store_days = std::max(days / std::max(store_items, 1), 1.0);
    return 1.0 / store_days;
  }
};

std::string csv_row(std::string_view scope, std::string_view group, std::string_view store,
                    std::string_view item, double level, const Totals& t,
                    const GroupWhy* why = nullptr) {
  const double per = t.days > 0 ? 1.0 / t.days : 0.0;
  std::string row = fmt::format(
      "{},{},{},{},{},{},{},{},{},{}", scope, csv_field(group), csv_field(store), csv_field(item),
      csv_number(level), csv_number(t.quantity * per), csv_number(t.days),
      csv_number(t.in_stock * per), csv_number(t.leftover), csv_number(t.profit));
  if (why != nullptr) {
    const double day = t.per_day();
    row += fmt::format(",{},{},{},{},{},{}\n", csv_number(why->critical_ratio), csv_number(why->cv),
                       csv_number(why->in_stock), csv_number(why->leftover * day),
                       csv_number(why->profit * day), csv_number(why->point_cost * day));
  } else {
    row += ",,,,,,\n";
  }
  return row;
}

/// A number for the terminal, "-" when not available.
std::string cell(double v, int decimals) {
  return std::isfinite(v) ? fmt::format("{:.{}f}", v, decimals) : std::string("-");
}

int find_policy(const PreparedScenario& p, const std::string& name) {
  std::string known;
  for (size_t k = 0; k < p.policies.size(); ++k) {
    if (p.policies[k].name == name && p.policies[k].quantity->network() != nullptr) {
      return static_cast<int>(k);
    }
    if (p.policies[k].quantity->network() != nullptr) {
      known += (known.empty() ? "" : ", ") + p.policies[k].name;
    }
  }
  Diagnostics d;
  d.error({p.scenario.file, 0, 0},
          fmt::format("--policy {}: no network_in_stock policy of that name in the scenario", name),
          known.empty() ? "add a policy with quantity: { rule: network_in_stock, target: 0.7 }"
                        : fmt::format("network_in_stock policies: {}", known));
  throw InputError(d);
}

}  // namespace

int allocate_command(const AllocateArgs& args) {
  PreparedScenario prepared = prepare_scenario(args.common.scenario, args.common.overrides);
  const Scenario& sc = prepared.scenario;
  const int k = find_policy(prepared, args.policy);
  const int day = args.day.value_or(sc.horizon.warmup_days);
  // -r counts the replications planned from (1 unless given: one plan is the policy's own).
  const int replications = args.common.replications_text.empty() ? 1 : sc.replications;
  if (day < 0 || day >= sc.horizon.days) {
    Diagnostics d;
    d.error({sc.file, 0, 0},
            fmt::format("--day {} is outside the horizon (0 to {})", day, sc.horizon.days - 1));
    throw InputError(d);
  }
  if (args.days < 1 || day + args.days > sc.horizon.days) {
    Diagnostics d;
    d.error({sc.file, 0, 0},
            fmt::format("--days {}: the plan days {} to {} must lie within the horizon (0 to {})",
                        args.days, day, day + args.days - 1, sc.horizon.days - 1),
            fmt::format("at most --days {} from day {}", sc.horizon.days - day, day));
    throw InputError(d);
  }
  const std::string& name = prepared.policies[static_cast<size_t>(k)].name;

  const std::filesystem::path file =
      args.out.empty()
          ? std::filesystem::path("larder-out") / sc.name / fmt::format("allocation-{}.csv", name)
          : std::filesystem::path(args.out);
  const std::filesystem::path html = file.parent_path() / fmt::format("allocation-{}.html", name);
  std::vector<OutputFile> outputs = {{file, "--out"}, {html, "the HTML page beside --out"}};
  if (!args.rollout.empty()) outputs.push_back({args.rollout, "--rollout"});
  check_output_files(outputs, {{args.common.scenario, "the scenario"}});
  // The folders are made and tested for writing before the days are simulated.
  for (const OutputFile& o : outputs) {
    const std::filesystem::path folder = o.path.has_parent_path() ? o.path.parent_path() : ".";
    ensure_directory(folder);
    check_writable(folder);
  }

  const DemandModel demand(sc);
  const SimSetup setup{sc, demand, prepared.policies, sc.seed};
  tbb::task_arena arena(args.common.threads > 0 ? args.common.threads : tbb::task_arena::automatic);
  const AveragedPlan plan = averaged_plan(setup, k, day, replications, args.days, arena);
  const NetworkTarget& target = *prepared.policies[static_cast<size_t>(k)].quantity->network();
  const std::vector<GroupWhy> why =
      group_why(plan.curves, plan.allocation, plan.level_grid, plan.margins, plan.plans);
  const PointPrice point =
      network_point_price(plan.curves, plan.allocation, target.target, plan.plans);

  // Per group and per store-item, then the network.
  const size_t n_items = sc.items.size();
  std::vector<Totals> groups(static_cast<size_t>(plan.groups.count()));
  Totals network;
  std::string rows;
  for (size_t s = 0; s < sc.stores.size(); ++s) {
    for (size_t i = 0; i < n_items; ++i) {
      const size_t key = s * n_items + i;
      const int g = plan.groups.of_store_item[key];
      Totals one;
      one.add(plan, key);
      rows += csv_row("store_item", plan.groups.names[static_cast<size_t>(g)], sc.stores[s].id,
                      sc.items[i].id, plan.level[key], one);
      groups[static_cast<size_t>(g)].add(plan, key);
      network.add(plan, key);
    }
  }
  std::string csv =
      "scope,group,store,item,level,order_basis,open_days,expected_in_stock,"
      "expected_leftover_units,expected_profit,critical_ratio,demand_cv,"
      "planned_in_stock,leftover_per_day,profit_per_day,point_cost_per_day\n";
  for (size_t g = 0; g < groups.size(); ++g) {
    csv += csv_row("group", plan.groups.names[g], "", "", plan.group_level[g], groups[g], &why[g]);
  }
  csv += rows;
  csv += csv_row("network", "", "", "", target.target, network);
  write_file_atomically(file, csv);
  if (!args.rollout.empty()) {
    write_file_atomically(args.rollout, rollout_csv(sc, target.grouping, plan));
  }

  AllocationPage page;
  page.scenario = sc.name;
  page.policy = name;
  page.grouping = to_string(target.grouping);
  page.currency = sc.currency;
  page.day = day;
  page.days = args.days;
  page.replications = replications;
  page.seed = sc.seed;
  const auto row = [&](const std::string& group, double level, const Totals& t, const GroupWhy* w) {
    const double per = t.days > 0 ? 1.0 / t.days : 0.0;
    const double day_share = t.per_day();
    AllocationRow r;
    r.group = group;
    r.level = level;
    r.store_items = t.store_items;
    r.in_stock = t.in_stock * per;
    r.order_basis = t.quantity * per;
    r.leftover_per_day = t.leftover * day_share;
    r.profit_per_day = t.profit * day_share;
    if (w != nullptr) {
      r.critical_ratio = w->critical_ratio;
      r.cv = w->cv;
      r.in_stock = w->in_stock;
      r.leftover_per_day = w->leftover * day_share;
      r.profit_per_day = w->profit * day_share;
      r.point_cost_per_day = w->point_cost * day_share;
    }
    return r;
  };
  for (size_t g = 0; g < groups.size(); ++g) {
    page.groups.push_back(row(plan.groups.names[g], plan.group_level[g], groups[g], &why[g]));
  }
  page.network = row("network", target.target, network, nullptr);
  const double network_day = network.per_day();
  page.network.point_cost_per_day = point.finite_difference * network_day;
  page.note = fmt::format(
      "One more point of network in-stock costs {} {} a day (the best plan at {:.0f}% against "
      "{:.0f}%);\nthe multiplier says {} {} a day ({:.4g} per expected in-stock "
      "store-item-day).\nThe plan is within {:.4g} {} of the best possible for its {}{}.",
      cell(point.finite_difference * network_day, 2), sc.currency, 100 * target.target + 1,
      100 * target.target, cell(point.multiplier * network_day, 2), sc.currency,
      plan.allocation.lambda, plan.allocation.gap_bound / std::max(plan.plans, 1), sc.currency,
      plan.plans == 1 ? "week" : "weeks on average",
      plan.allocation.feasible ? ""
                               : " (the target cannot be met: every group at its "
                                 "highest level)");
  write_file_atomically(html, allocation_html(page));

  fmt::print("{}: network_in_stock, target {:.0f}% in stock at close, groups {}\n", page.policy,
             100 * target.target, page.grouping);
  fmt::print(
      "planned on day {} from the policy's own forecasts of the next {} days ({}; seed {})\n\n",
      day, kPlanDays,
      plan.plans == 1 ? std::string("replication 0")
                      : fmt::format("the average of {} plans: {} replication{} x {} day{}",
                                    plan.plans, replications, replications == 1 ? "" : "s",
                                    args.days, args.days == 1 ? "" : "s"),
      sc.seed);
  fmt::print("{:<24} {:>6} {:>11} {:>6} {:>6} {:>9} {:>10} {:>12} {:>12} {:>11}\n", "group",
             "level", "store-items", "ratio", "cv", "in stock", "basis", "leftover/d", "profit/d",
             "+1 pt/d");
  const auto line = [](const AllocationRow& r) {
    fmt::print(
        "{:<24} {:>5.0f}% {:>11} {:>6} {:>6} {:>8.1f}% {:>10.1f} {:>12.1f} {:>12.2f} {:>11}\n",
        r.group, 100 * r.level, r.store_items, cell(r.critical_ratio, 2), cell(r.cv, 2),
        100 * r.in_stock, r.order_basis, r.leftover_per_day, r.profit_per_day,
        cell(r.point_cost_per_day, 2));
  };
  for (size_t g = 0; g < page.groups.size() && g < 40; ++g) line(page.groups[g]);
  if (groups.size() > 40) fmt::print("... {} more groups in the CSV\n", groups.size() - 40);
  AllocationRow total = page.network;
  total.group = "network (target)";
  total.critical_ratio = total.cv = std::numeric_limits<double>::quiet_NaN();
  line(total);
  fmt::print(
      "\nratio: critical ratio of the group's margins, (p - c + g) / (p - s + g) weighted by\n"
      "expected demand; cv: sd / mean of demand; leftover, profit: per day over the group;\n"
      "+1 pt/d: profit a day given up for one more point of in-stock in that group.\n");
  fmt::print("\n{}\n", page.note);
  if (!args.common.quiet) {
    fmt::print(stderr, "allocation written to {} and {}{}\n", file.string(), html.string(),
               args.rollout.empty() ? "" : fmt::format("; rollout table to {}", args.rollout));
  }
  return 0;
}

}  // namespace larder
