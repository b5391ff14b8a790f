// `larder sweep SCENARIO --set PATH=V1,V2,...`: the scenario rerun at every point of the grid
// of settings on one seed (common random numbers); prints the key metrics per point and policy
// with the frontier marks and writes sweep.csv and sweep.html.

#include <fmt/format.h>

#include <filesystem>

#include "cli/commands.hpp"
#include "cli/demo_scenario.hpp"
#include "reports/atomic_file.hpp"
#include "reports/comparison.hpp"
#include "reports/number_format.hpp"
#include "reports/output_claim.hpp"
#include "reports/output_folder.hpp"
#include "reports/output_path.hpp"
#include "reports/policy_ranks.hpp"
#include "reports/result_set.hpp"
#include "reports/sensitivity.hpp"
#include "reports/sweep_csv.hpp"
#include "reports/sweep_report.hpp"
#include "sim/runner/monte_carlo.hpp"
#include "sim/scenario/load_scenario.hpp"
#include "sim/scenario/params.hpp"

namespace larder {

namespace {

std::vector<Setting> read_settings(const std::vector<std::string>& raw, const std::string& label,
                                   const char* option) {
  std::vector<Setting> out;
  Diagnostics d;
  for (const std::string& r : raw) {
    auto s = parse_setting(r);
    if (!s) {
      d.error({label, 0, 0}, fmt::format("--{} {}: expected PATH=V1,V2,...", option, r),
              "e.g. --set policies.per-item.quantity.target=0.6,0.7,0.8 or --vary price=-10%,+10%");
      continue;
    }
    out.push_back(std::move(*s));
  }
  if (!d.ok()) throw InputError(d);
  return out;
}

/// The metric --waste-metric names: one with a better direction that the scenario reports
/// (surplus, CO2e and the rest are chosen by their field names, so a new metric needs no
/// change here).
Metric rank_metric(const std::string& name, const std::optional<Scenario>& base,
                   const std::string& label) {
  std::vector<Metric> candidates;
  const std::vector<Metric> reported = base ? applicable_metrics(*base) : std::vector<Metric>{};
  for (std::size_t k = 0; k < kMetricCount; ++k) {
    const Metric m = static_cast<Metric>(k);
    if (metric_info(m).better == 0) continue;
    if (base && std::ranges::find(reported, m) == reported.end()) continue;
    if (metric_name(m) == name) return m;
    candidates.push_back(m);
  }
  std::string names;
  std::string closest;
  int distance = 3;
  for (const Metric m : candidates) {
    names += (names.empty() ? "" : ", ") + std::string(metric_name(m));
    const int d = edit_distance(name, metric_name(m));
    if (d < distance) {
      distance = d;
      closest = metric_name(m);
    }
  }
  Diagnostics d;
  d.error({label, 0, 0},
          fmt::format("--waste-metric {}: not a metric this scenario ranks policies on", name),
          closest.empty() ? fmt::format("one of {}", names)
                          : fmt::format("did you mean {}? (one of {})", closest, names));
  throw InputError(d);
}

}  // namespace

int sweep_command(const SweepArgs& args) {
  SweepSpec spec;
  spec.label = args.common.scenario.empty() ? "<demo>" : args.common.scenario;
  spec.text = args.common.scenario.empty() ? demo_scenario_text()
                                           : read_scenario_text(args.common.scenario);
  spec.settings = read_settings(args.set, spec.label, "set");
  spec.varies = read_settings(args.vary, spec.label, "vary");
  if (spec.settings.empty() == spec.varies.empty()) {
    Diagnostics d;
    d.error({spec.label, 0, 0},
            "give --set (a grid of settings) or --vary (one at a time), not both",
            "--set policies.<name>.quantity.level=0.6,0.8, or --vary price=-10%,+10%");
    throw InputError(d);
  }
  spec.replications = args.common.overrides.replications;
  spec.seed = args.common.overrides.seed;
  spec.options.threads = args.common.threads;
  // The output folder is claimed (and tested for writing) before the points run.
  std::filesystem::path dir = args.out;
  if (dir.empty()) {
    Diagnostics ignored;  // run_sweep reports the scenario's problems
    if (const auto base = parse_scenario(spec.text, spec.label, ignored)) {
      dir = std::filesystem::path("larder-out") / base->name;
    }
  }
  std::optional<Metric> waste_metric;
  if (!spec.varies.empty()) {
    Diagnostics ignored;  // run_sweep reports the scenario's problems
    waste_metric =
        rank_metric(args.waste_metric, parse_scenario(spec.text, spec.label, ignored), spec.label);
  }
  const std::vector<std::string> names = {"sweep.csv", "sensitivity.csv", "ranks.csv",
                                          "sweep.html"};
  const auto claim = [&] {
    check_output_folder(dir, names, {{args.common.scenario, "the scenario"}});
    claim_output_folder(dir, args.force);
  };
  const bool claimed_early = !dir.empty();
  if (claimed_early) claim();
  const std::vector<SweepPoint> points = run_sweep(spec, [&](int k, int n) {
    if (!args.common.quiet) fmt::print(stderr, "sweep: point {} of {}\n", k + 1, n);
  });

  const RunInfo& info = points.front().result.info;
  if (!claimed_early) {
    dir = std::filesystem::path("larder-out") / info.scenario_name;
    claim();
  }
  if (!spec.varies.empty()) {
    const RunResult& base = points.front().result;
    const std::vector<TornadoRow> rows = tornado(spec.varies, points);
    std::vector<RankTable> ranks = {rank_table(points, Metric::profit)};
    if (*waste_metric != Metric::profit) ranks.push_back(rank_table(points, *waste_metric));
    std::string ranks_csv(kRankCsvHeader);
    for (const RankTable& t : ranks) ranks_csv += rank_csv_rows(t);
    publish_result_set(dir,
                       {{"sensitivity.csv", sensitivity_csv(points)},
                        {"ranks.csv", ranks_csv},
                        {"sweep.html", sensitivity_html(points, rows, ranks)}},
                       {"sweep.csv"});
    fmt::print("sensitivity of {} ({} replications per point, seed {})\n", spec.label,
               info.replications, info.seed);
    for (const RankTable& t : ranks) fmt::print("{}\n", rank_text(t));
    fmt::print("{}", tornado_table(rows, base.policies[static_cast<size_t>(base.baseline)]));
    if (!args.common.quiet) {
      fmt::print(stderr, "sensitivity written to {}, {} and {}\n",
                 (dir / "sensitivity.csv").string(), (dir / "ranks.csv").string(),
                 (dir / "sweep.html").string());
    }
    return 0;
  }
  const FrontierMarks marks = sweep_frontiers(points);
  publish_result_set(dir,
                     {{"sweep.csv", sweep_csv(spec.settings, points)},
                      {"sweep.html", sweep_html(spec.settings, points, marks)}},
                     {"sensitivity.csv", "ranks.csv"});
  fmt::print("sweep of {} ({} points, {} replications each, seed {})\n", spec.label, points.size(),
             info.replications, info.seed);
  const bool on_surplus = marks.waste == Metric::surplus_share;
  const char* waste_word = on_surplus ? "surplus" : "waste";
  fmt::print(
      "frontier marks: W = no other row has less {0} and more in stock; P = none has less "
      "{0} and more profit{1}\n\n",
      waste_word,
      on_surplus ? " (surplus: units not sold at full price, donated and salvaged "
                   "included, so donation does not win by definition)"
                 : "");
  std::string head = fmt::format("{:>5}", "point");
  for (const Setting& s : spec.settings)
    head += fmt::format("  {:>12}", s.path.substr(s.path.rfind('.') + 1));
  head += fmt::format("  {:<18} {:>9} {:>9} {:>9} {:>14}  {}\n", "policy", waste_word, "in stock",
                      "fill rate", "profit", "frontier");
  fmt::print("{}", head);
  size_t row = 0;
  for (size_t i = 0; i < points.size(); ++i) {
    const RunResult& r = points[i].result;
    for (size_t p = 0; p < r.policies.size(); ++p, ++row) {
      const int k = static_cast<int>(p);
      std::string line = fmt::format("{:>5}", i + 1);
      for (const std::string& v : points[i].values) line += fmt::format("  {:>12}", v);
      line += fmt::format("  {:<18} {:>8.1f}% {:>8.1f}% {:>8.1f}% {:>14.0f}  {}{}\n", r.policies[p],
                          100 * policy_estimate(r, k, marks.waste).mean,
                          100 * policy_estimate(r, k, Metric::in_stock_at_close).mean,
                          100 * policy_estimate(r, k, Metric::fill_rate).mean,
                          policy_estimate(r, k, Metric::profit).mean,
                          marks.waste_in_stock[row] ? "W" : "", marks.profit_waste[row] ? "P" : "");
      fmt::print("{}", line);
    }
  }
  if (!args.common.quiet) {
    fmt::print(stderr, "sweep written to {} and {}\n", (dir / "sweep.csv").string(),
               (dir / "sweep.html").string());
  }
  return 0;
}

}  // namespace larder
