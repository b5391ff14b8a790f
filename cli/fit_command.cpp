// `larder fit HISTORY.csv --out SCENARIO.yaml`: estimates demand from a sales history that is
// cut off by sell-outs (README, "Fitting a history") and writes a scenario, with a short
// diagnostic table on stdout. Bad input (history, item file, options) exits 2 with
// `file:line:col: error:` messages; the scenario file is written atomically.

#include <fmt/format.h>

#include <cmath>
#include <cstdio>
#include <filesystem>

#include "cli/commands.hpp"
#include "reports/atomic_file.hpp"
#include "reports/output_path.hpp"
#include "sim/fit/scenario_writer.hpp"
#include "sim/history/history_reader.hpp"
#include "sim/runner/fit_check.hpp"
#include "sim/scenario/ids.hpp"
#include "sim/scenario/load_scenario.hpp"

namespace larder {

namespace {

/// "fitted-<file stem>", with characters ids may not hold replaced by '-'.
std::string default_name(const std::string& history) {
  std::string stem = std::filesystem::path(history).stem().string();
  for (char& ch : stem) {
    const bool ok = (ch >= 'a' && ch <= 'z') || (ch >= 'A' && ch <= 'Z') ||
                    (ch >= '0' && ch <= '9') || ch == '_' || ch == '-' || ch == '.';
    if (!ok) ch = '-';
  }
  return "fitted-" + stem;
}

std::string se_cell(double se) {
  return std::isfinite(se) ? fmt::format("{:.3g}", se) : std::string("-");
}

void print_table(const FitResult& r) {
  const FitData& d = r.data;
  fmt::print("{}: {} stores x {} items, {} to {} ({} days, {} rows)\n", d.file, d.stores.size(),
             d.items.size(), to_iso(d.first_date), to_iso(add_days(d.first_date, d.days - 1)),
             d.days, d.rows.size());
  size_t w = 4;
  for (const auto& e : r.fit.items) w = std::max(w, e.id.size());
  fmt::print("  {:<{}}  {:<17} {:>9} {:>8} {:>9} {:>8} {:>6} {:>15} {:>7} {:>14}\n", "item", w,
             "family", "base", "se", "on sales", "sold out", "cv", "cv 95%", "days", "lag-7 95%");
  for (const auto& e : r.fit.items) {
    if (!e.fitted) {
      fmt::print("  {:<{}}  {}\n", e.id, w, e.problem);
      continue;
    }
    const double censored = 100.0 * e.censored_days / std::max(e.days, 1);
    const bool spread = e.family != DemandFamily::poisson;
    std::string interval = "-";
    if (!std::isnan(e.cv_low))
      interval = fmt::format("{}{:.3g}-{}", spread ? "" : "nb ", e.cv_low,
                             std::isfinite(e.cv_high) ? fmt::format("{:.3g}", e.cv_high) : "inf");
    const PersistenceFit& p = r.persistence[static_cast<size_t>(&e - r.fit.items.data())];
    const std::string lag7 = std::isnan(p.correlation)
                                 ? std::string("-")
                                 : fmt::format("{:.2f} to {:.2f}", p.low, p.high);
    fmt::print("  {:<{}}  {:<17} {:>9.4g} {:>8} {:>9.4g} {:>7.1f}% {:>6} {:>15} {:>7} {:>14}{}\n",
               e.id, w, to_string(e.family), e.base, se_cell(e.base_se), e.naive_base, censored,
               spread ? fmt::format("{:.3g}", e.cv) : std::string("-"), interval, e.days, lag7,
               e.converged ? "" : "  (search did not converge)");
  }
  std::string stores;
  for (const auto& s : r.fit.stores) {
    stores += stores.empty() ? "" : ", ";
    stores +=
        s.fitted ? fmt::format("{} {:.3g}", s.id, s.size) : fmt::format("{} (left out)", s.id);
  }
  fmt::print("  store sizes (average 1): {}\n", stores);
  if (r.substitution_asked) {
    if (r.substitution.empty())
      fmt::print(
          "  substitution: not estimated (needs sales_HH and sold_out_time columns and at least "
          "10 store-days on which an item sold out while another was in stock)\n");
    for (const SubstituteShare& x : r.substitution)
      fmt::print("  substitution: {} out -> {} {:.3f} (se {:.3f}, {} store-days)\n",
                 d.items[x.out_item], d.items[x.substitute], x.share, x.se, x.store_days);
    if (!r.substitution_converged)
      fmt::print("  substitution: warning: the shares still moved after {} rounds\n",
                 r.substitution_rounds);
  }
  fmt::print(
      "  base: censored-likelihood estimate at a size-1 store; on sales: the same from sales\n"
      "  taken as demand (biased low when items sell out); cv 95%: profile-likelihood interval\n"
      "  (0 = the Poisson limit; \"nb\": the negative binomial's, for an item fitted as poisson);\n"
      "  lag-7 95%: the correlation with the same weekday a week earlier (censored pairwise\n"
      "  likelihood; an interval holding 0 cannot be told from no persistence)\n");
}

/// The --check table: each item's history against the fitted scenario's 95% range.
std::string check_table(const std::vector<ItemCheck>& checks, int replications) {
  size_t w = 4;
  for (const ItemCheck& c : checks) w = std::max(w, c.item.size());
  std::string t = fmt::format(
      "check: the history's own deliveries replayed on the fitted scenario, {} replications; "
      "history against the fitted scenario's 95% range\n",
      replications);
  t += fmt::format("  {:<{}}  {:>9} {:>9}  {:<15} {:>9} {:>9}  {:<15}\n", "item", w, "sales/day",
                   "history", "fitted 95%", "sold out", "history", "fitted 95%");
  int outside = 0;
  for (const ItemCheck& c : checks) {
    outside += (c.sales.inside() ? 0 : 1) + (c.sold_out.inside() ? 0 : 1);
    t += fmt::format(
        "  {:<{}}  {:>9} {:>9.3f}  {:<15} {:>9} {:>8.1f}%  {:<15}\n", c.item, w, "",
        c.sales.history,
        fmt::format("{:.3f}-{:.3f}{}", c.sales.low, c.sales.high, c.sales.inside() ? "" : " OUT"),
        "", 100 * c.sold_out.history,
        fmt::format("{:.1f}-{:.1f}%{}", 100 * c.sold_out.low, 100 * c.sold_out.high,
                    c.sold_out.inside() ? "" : " OUT"));
  }
  t += outside == 0
           ? "  every item's sales and sell-out share fall within the fitted scenario's range\n"
           : fmt::format(
                 "  {} value(s) OUT of range: the fitted scenario does not reproduce what was "
                 "recorded there (about 1 in 20 falls outside by chance)\n",
                 outside);
  return t;
}

}  // namespace

int fit_command(const FitArgs& args) {
  check_output_files({{args.out, "--out"}},
                     {{args.history, "the history"}, {args.items, "the --items file"}});
  std::vector<ItemRecord> items;
  if (!args.items.empty()) items = read_item_file(args.items);
  WriteOptions w;
  w.name = args.name.empty() ? default_name(args.history) : args.name;
  if (!is_valid_id(w.name)) {
    Diagnostics d;
    d.error({"--name", 0, 0}, fmt::format("--name {}", id_problem(w.name)));
    throw InputError(std::move(d));
  }
  w.history_file = args.history;
  w.items_file = args.items;
  w.items = std::move(items);
  SeriesBuilder builder(args.history);
  const HistoryColumns columns =
      read_history_file(args.history, [&](const HistoryRow& row) { builder.add(row); });
  FitOptions options;
  options.min_uncensored_days = args.min_days;
  options.substitution = args.substitution;
  if (args.family == "poisson") options.family = DemandFamily::poisson;
  if (args.family == "negative_binomial") options.family = DemandFamily::negative_binomial;
  if (args.family == "normal") options.family = DemandFamily::normal;
  FitData data = builder.finish(columns);
  check_fit_writable(data, w);  // before the search: ids or values no scenario could hold
  const FitResult result = fit_history(std::move(data), options);

  const std::string yaml = fitted_scenario_yaml(result, w);
  // The last guard: what is written must load (issue 23). A failure here is larder's fault.
  Diagnostics loaded;
  if (!parse_scenario(yaml, args.out, loaded)) {
    throw std::runtime_error(
        fmt::format("the fitted scenario would not load; nothing written. The loader says:\n{}",
                    loaded.format()));
  }
  const std::filesystem::path out(args.out);
  if (out.has_parent_path()) ensure_directory(out.parent_path());
  write_file_atomically(out, yaml);

  if (!args.quiet) {
    const auto missing = items_without_prices(result, w);
    if (args.items.empty()) {
      fmt::print(stderr,
                 "larder fit: warning: no --items file: prices and unit costs in {} are marked "
                 "placeholders (price 1, unit_cost 0.5)\n",
                 args.out);
    } else if (!missing.empty()) {
      std::string list;
      for (const auto& id : missing) {
        if (!list.empty()) list += ", ";
        list += id;
      }
      fmt::print(stderr,
                 "larder fit: warning: {} does not list {}: their prices are marked placeholders\n",
                 args.items, list);
    }
  }
  print_table(result);
  fmt::print("wrote {}\n", args.out);
  if (args.check) {
    const std::vector<ItemCheck> checks =
        check_fit(result, w, args.check_replications, args.threads);
    fmt::print("{}", check_table(checks, args.check_replications));
  }
  return 0;
}

}  // namespace larder
