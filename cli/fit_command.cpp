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
  fmt::print("  {:<{}}  {:<17} {:>9} {:>8} {:>9} {:>8} {:>6} {:>6} {:>7}\n", "item", w, "family",
             "base", "se", "on sales", "sold out", "cv", "se", "days");
  for (const auto& e : r.fit.items) {
    if (!e.fitted) {
      fmt::print("  {:<{}}  {}\n", e.id, w, e.problem);
      continue;
    }
    const double censored = 100.0 * e.censored_days / std::max(e.days, 1);
    const bool spread = e.family != DemandFamily::poisson;
    fmt::print("  {:<{}}  {:<17} {:>9.4g} {:>8} {:>9.4g} {:>7.1f}% {:>6} {:>6} {:>7}{}\n", e.id, w,
               to_string(e.family), e.base, se_cell(e.base_se), e.naive_base, censored,
               spread ? fmt::format("{:.3g}", e.cv) : std::string("-"),
               spread ? se_cell(e.cv_se) : std::string("-"), e.days,
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
          "  substitution: not estimated (needs sales_HH and sold_out_time columns and hours "
          "with one item out)\n");
    for (const SubstituteShare& x : r.substitution)
      fmt::print("  substitution: {} out -> {} {:.3f} (se {:.3f}, {} store-days)\n",
                 d.items[x.out_item], d.items[x.substitute], x.share, x.se, x.store_days);
  }
  fmt::print(
      "  base: censored-likelihood estimate at a size-1 store; on sales: the same from sales\n"
      "  taken as demand (biased low when items sell out)\n");
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
  return 0;
}

}  // namespace larder
