// `larder history SCENARIO --policy NAME --out FILE.csv`: what the stores would have recorded
// under one policy in one replication (cli.md), in the history format that `larder fit` reads
// (README, "History format"): every store, item and open day, warm-up days included, without
// the true demand. `--items-out` writes the scenario's item file beside it.

#include <fmt/format.h>

#include <nlohmann/json.hpp>

#include "cli/commands.hpp"
#include "cli/progress.hpp"
#include "reports/atomic_file.hpp"
#include "reports/history_csv.hpp"
#include "reports/item_file_csv.hpp"
#include "reports/output_path.hpp"
#include "sim/runner/record_history.hpp"

namespace larder {

namespace {

int find_policy(const PreparedScenario& p, const std::string& name) {
  std::string known;
  for (size_t k = 0; k < p.policies.size(); ++k) {
    if (p.policies[k].name == name) return static_cast<int>(k);
    if (!known.empty()) known += ", ";
    known += p.policies[k].name;
  }
  Diagnostics d;
  d.error({p.scenario.file, 0, 0}, fmt::format("--policy {}: no policy of that name", name),
          fmt::format("the scenario's policies: {}", known));
  throw InputError(std::move(d));
}

/// The item file is read line by line (`larder fit --items`): an attribute value holding a line
/// break (possible in YAML, "a\nb") would make a file larder cannot read back, so it is refused
/// before the days are simulated.
void check_item_file_values(const Scenario& sc) {
  Diagnostics d;
  for (const Item& it : sc.items) {
    for (const auto& [key, value] : it.attributes) {
      if (value.find_first_of("\r\n") != std::string::npos) {
        d.error({sc.file, 0, 0},
                fmt::format("item '{}': attribute {} holds a line break, which the item file "
                            "(--items-out) cannot hold",
                            it.id, key),
                "write the value on one line, or leave out --items-out");
      }
    }
  }
  if (!d.ok()) throw InputError(std::move(d));
}

void make_parent(const std::filesystem::path& file) {
  if (file.has_parent_path()) ensure_directory(file.parent_path());
}

}  // namespace

int history_command(const HistoryArgs& args) {
  std::vector<OutputFile> outputs = {{args.out, "--out"}};
  if (!args.items_out.empty()) outputs.push_back({args.items_out, "--items-out"});
  check_output_files(outputs, {{args.common.scenario, "the scenario"}});
  PreparedScenario prepared = prepare_scenario(args.common.scenario, args.common.overrides);
  const Scenario& sc = prepared.scenario;
  const int k = find_policy(prepared, args.policy);
  if (!args.items_out.empty()) check_item_file_values(sc);
  const std::filesystem::path out(args.out);

  tbb::task_arena arena(args.common.threads > 0 ? args.common.threads : tbb::task_arena::automatic);
  HistoryRecorder recorder(sc, prepared.policies, k, args.replication, arena);
  make_parent(out);
  HistoryCsvWriter writer(out, recorder.columns());
  Progress progress("days", args.common.quiet);
  recorder.run([&](const HistoryRow& row) { writer.add(row); },
               [&](int done, int total) { progress.update(done, total); });
  progress.finish();
  writer.commit();
  if (!args.items_out.empty()) {
    const std::filesystem::path items(args.items_out);
    make_parent(items);
    write_file_atomically(items, item_file_csv(sc));
  }

  const CivilDate first = history_start_date(sc);
  const CivilDate last = add_days(first, sc.horizon.days - 1);
  const HistoryColumns& c = recorder.columns();
  if (args.common.format == "json") {
    nlohmann::json j = {{"file", out.string()},
                        {"policy", args.policy},
                        {"replication", args.replication},
                        {"seed", sc.seed},
                        {"rows", writer.rows()},
                        {"first_date", to_iso(first)},
                        {"last_date", to_iso(last)},
                        {"warmup_days", sc.horizon.warmup_days},
                        {"sold_out_time", c.has_sold_out_time},
                        {"hourly_sales", c.hours > 0}};
    if (!args.items_out.empty()) j["items_file"] = args.items_out;
    fmt::print("{}\n", j.dump(2));
  } else {
    fmt::print(
        "history of policy {} (replication {}, seed {}): {} rows, {} stores x {} items, "
        "{} to {}{}\n",
        args.policy, args.replication, sc.seed, writer.rows(), sc.stores.size(), sc.items.size(),
        to_iso(first), to_iso(last),
        sc.horizon.start_date ? "" : " (invented dates: the scenario has no start_date)");
    fmt::print("the first {} days are the warm-up; columns {}", sc.horizon.warmup_days,
               c.has_sold_out_time
                   ? "with sold_out_time and hourly sales (the days run hour by hour)\n"
                   : "without sold_out_time or hourly sales (the days do not run hour by hour)\n");
  }
  if (!args.common.quiet) {
    fmt::print(
        stderr, "history written to {}{}\n", out.string(),
        args.items_out.empty() ? std::string{} : fmt::format(", items to {}", args.items_out));
  }
  return 0;
}

}  // namespace larder
