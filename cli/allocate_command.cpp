// `larder allocate SCENARIO --policy NAME`: the levels a `network_in_stock` policy would roll
// out (cli.md). One replication runs through the warm-up (or to --day) with the policy re-planning
// as it would in `larder run`; then the policy plans on that day from its own forecasts, and the
// plan is printed per group, written per group and store-item as CSV, and shown as an HTML page.

#include <fmt/format.h>

#include <filesystem>

#include "cli/commands.hpp"
#include "reports/allocation_report.hpp"
#include "reports/atomic_file.hpp"
#include "reports/csv.hpp"
#include "reports/output_claim.hpp"
#include "reports/output_folder.hpp"
#include "reports/output_path.hpp"
#include "sim/engine/demand_model.hpp"
#include "sim/runner/network_phases.hpp"

namespace larder {

namespace {

/// Sums of the plan's per-store-item expectations over a set of store-items.
struct Totals {
  double days = 0, quantity = 0, in_stock = 0, leftover = 0, profit = 0;
  int store_items = 0;
  void add(const NetworkPlan& p, size_t k) {
    days += p.days[k];
    quantity += p.quantity[k] * p.days[k];
    in_stock += p.in_stock[k];
    leftover += p.leftover[k];
    profit += p.profit[k];
    ++store_items;
  }
};

std::string csv_row(std::string_view scope, std::string_view group, std::string_view store,
                    std::string_view item, double level, const Totals& t) {
  const double per = t.days > 0 ? 1.0 / t.days : 0.0;
  return fmt::format("{},{},{},{},{},{},{},{},{},{}\n", scope, csv_field(group), csv_field(store),
                     csv_field(item), csv_number(level), csv_number(t.quantity * per),
                     csv_number(t.days), csv_number(t.in_stock * per), csv_number(t.leftover),
                     csv_number(t.profit));
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
  if (day < 0 || day >= sc.horizon.days) {
    Diagnostics d;
    d.error({sc.file, 0, 0},
            fmt::format("--day {} is outside the horizon (0 to {})", day, sc.horizon.days - 1));
    throw InputError(d);
  }

  const std::filesystem::path file =
      args.out.empty() ? std::filesystem::path("larder-out") / sc.name /
                             fmt::format("allocation-{}.csv", prepared.policies[size_t(k)].name)
                       : std::filesystem::path(args.out);
  const std::filesystem::path html =
      file.parent_path() /
      fmt::format("allocation-{}.html", prepared.policies[static_cast<size_t>(k)].name);
  check_output_files({{file, "--out"}, {html, "the HTML page beside --out"}},
                     {{args.common.scenario, "the scenario"}});
  // The folder is made and tested for writing before the days are simulated.
  const std::filesystem::path folder = file.has_parent_path() ? file.parent_path() : ".";
  ensure_directory(folder);
  check_writable(folder);

  const DemandModel demand(sc);
  const SimSetup setup{sc, demand, prepared.policies, sc.seed};
  tbb::task_arena arena(args.common.threads > 0 ? args.common.threads : tbb::task_arena::automatic);
  PhasedRuns runs(setup, 0, 1, arena);
  runs.run_until(day);
  const NetworkPlan plan = runs.plan(0, k, true);

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
      "expected_leftover_units,expected_profit\n";
  for (size_t g = 0; g < groups.size(); ++g) {
    csv += csv_row("group", plan.groups.names[g], "", "", plan.group_level[g], groups[g]);
  }
  csv += rows;
  const NetworkTarget& target = *prepared.policies[static_cast<size_t>(k)].quantity->network();
  csv += csv_row("network", "", "", "", target.target, network);

  write_file_atomically(file, csv);

  AllocationPage page;
  page.scenario = sc.name;
  page.policy = prepared.policies[static_cast<size_t>(k)].name;
  page.grouping = to_string(target.grouping);
  page.currency = sc.currency;
  page.day = day;
  page.seed = sc.seed;
  const auto row = [&](const std::string& name, double level, const Totals& t) {
    const double per = t.days > 0 ? 1.0 / t.days : 0.0;
    const double store_days = std::max(t.days / std::max(t.store_items, 1), 1.0);
    return AllocationRow{name,
                         level,
                         t.store_items,
                         t.in_stock * per,
                         t.quantity * per,
                         t.leftover / store_days,
                         t.profit / store_days};
  };
  for (size_t g = 0; g < groups.size(); ++g) {
    page.groups.push_back(row(plan.groups.names[g], plan.group_level[g], groups[g]));
  }
  page.network = row("network", target.target, network);
  page.note = fmt::format(
      "multiplier {:.4g} per expected in-stock store-item-day; the plan is within {:.4g} "
      "{} of the best possible for the week{}",
      plan.allocation.lambda, plan.allocation.gap_bound, sc.currency,
      plan.allocation.feasible ? ""
                               : " (the target cannot be met: every group at its "
                                 "highest level)");
  write_file_atomically(html, allocation_html(page));

  fmt::print("{}: network_in_stock, target {:.0f}% in stock at close, groups {}\n", page.policy,
             100 * target.target, page.grouping);
  fmt::print(
      "planned on day {} from the policy's own forecasts of the next {} days "
      "(replication 0, seed {})\n\n",
      day, kPlanDays, sc.seed);
  fmt::print("{:<24} {:>7} {:>11} {:>10} {:>14} {:>14} {:>14}\n", "group", "level", "store-items",
             "in stock", "order basis", "leftover/day", "profit/day");
  const auto line = [](const AllocationRow& r) {
    fmt::print("{:<24} {:>6.0f}% {:>11} {:>9.1f}% {:>14.1f} {:>14.1f} {:>14.2f}\n", r.group,
               100 * r.level, r.store_items, 100 * r.in_stock, r.order_basis, r.leftover_per_day,
               r.profit_per_day);
  };
  for (size_t g = 0; g < page.groups.size() && g < 40; ++g) line(page.groups[g]);
  if (groups.size() > 40) fmt::print("... {} more groups in the CSV\n", groups.size() - 40);
  AllocationRow total = page.network;
  total.group = "network (target)";
  line(total);
  fmt::print("\n{}\n", page.note);
  if (!args.common.quiet) {
    fmt::print(stderr, "allocation written to {} and {}\n", file.string(), html.string());
  }
  return 0;
}

}  // namespace larder
