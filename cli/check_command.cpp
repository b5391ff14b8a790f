#include <fmt/format.h>

#include <algorithm>
#include <nlohmann/json.hpp>
#include <thread>

#include "cli/commands.hpp"
#include "cli/progress.hpp"
#include "policies/quantity/rule_warnings.hpp"
#include "sim/runner/memory_limit.hpp"
#include "sim/runner/run_estimate.hpp"
#include "sim/scenario/scenario_warnings.hpp"

namespace larder {

namespace {
/// How an item's leftovers are handled, in a few words: "donate", "discount_next_day then
/// donate", "discard + markdown from 18 (surplus only)".
std::string handling_text(const Item& it) {
  std::string s = to_string(it.leftovers);
  if (it.next_day && it.next_day->fallback != Leftovers::discard)
    s += fmt::format(" then {}", to_string(it.next_day->fallback));
  if (it.markdown) {
    s += fmt::format(" + markdown from {}{}", it.markdown->from_hour,
                     it.markdown->surplus_only ? " (surplus only)" : "");
  }
  return s;
}

std::string policy_text(const Scenario& sc, const PolicySpec& p) {
  std::string s = fmt::format("forecast {}, censoring {}, quantity {}", p.forecast.method,
                              p.censoring.method, p.quantity.method);
  for (const auto& a : p.adjustments) s += fmt::format(", {}", a.method);
  // `leftovers:` on the policy: the handlings that differ from the items' own (prices and
  // values aside), with counts.
  std::vector<std::pair<std::string, int>> changed;
  for (size_t i = 0; i < p.items.size() && i < sc.items.size(); ++i) {
    const std::string own = handling_text(p.items[i]);
    if (own == handling_text(sc.items[i])) continue;
    auto at =
        std::find_if(changed.begin(), changed.end(), [&](const auto& c) { return c.first == own; });
    if (at == changed.end()) at = changed.insert(changed.end(), {own, 0});
    ++at->second;
  }
  for (const auto& [text, n] : changed)
    s += fmt::format("; leftovers {} for {} item{}", text, n, n == 1 ? "" : "s");
  return s;
}

/// The `drill:` section in words, for the trainer checking an exercise: hidden events are
/// shown too (README, "Training drills").
std::string drill_text(const Scenario& sc, const DrillSpec& d) {
  std::string items;
  for (int i : d.items) items += fmt::format("{}{}", items.empty() ? "" : ", ", sc.items[i].id);
  std::string compare;
  for (int p : d.compare)
    compare += fmt::format("{}{}", compare.empty() ? "" : ", ", sc.policies[p].name);
  std::string s = fmt::format(
      "  drill         store {}, items {}; {} days after the warm-up\n"
      "                compared with {} (house rule: {})\n",
      sc.stores[d.store].id, items, d.days, compare, sc.policies[d.compare.front()].name);
  for (const DrillEvent& e : d.events)
    s += fmt::format("                day {}: demand x {} ({})\n", e.day, e.demand,
                     e.announced ? "announced the day before" : "hidden from the trainee");
  return s;
}

nlohmann::json drill_json(const Scenario& sc, const DrillSpec& d) {
  nlohmann::json j;
  j["store"] = sc.stores[d.store].id;
  j["items"] = nlohmann::json::array();
  for (int i : d.items) j["items"].push_back(sc.items[i].id);
  j["days"] = d.days;
  for (int p : d.compare) j["compare"].push_back(sc.policies[p].name);
  j["events"] = nlohmann::json::array();
  for (const DrillEvent& e : d.events)
    j["events"].push_back({{"day", e.day}, {"demand", e.demand}, {"announced", e.announced}});
  return j;
}
}  // namespace

int check_command(const CommonOptions& args) {
  const PreparedScenario prepared = prepare_scenario(args.scenario, args.overrides);
  const Scenario& sc = prepared.scenario;
  for (const std::string& w : scenario_warnings(sc)) fmt::print(stderr, "{}\n", w);
  for (const std::string& w : setting_warnings(sc)) fmt::print(stderr, "{}\n", w);
  for (const std::string& w : rule_warnings(sc)) fmt::print(stderr, "{}\n", w);
  const int threads = args.threads > 0
                          ? args.threads
                          : static_cast<int>(std::max(1u, std::thread::hardware_concurrency()));
  // Too large to even estimate by building the demand model: say so from the sizes alone.
  if (const std::size_t floor = minimum_memory(sc, prepared.policies.size());
      floor > default_memory_limit()) {
    fmt::print(
        "{}: scenario '{}' is valid but needs at least {} of memory, more than larder "
        "run's default --max-memory of {}: this run would be refused\n",
        sc.file, sc.name, format_bytes(floor), format_bytes(default_memory_limit()));
    return 0;
  }
  RunEstimate e = estimate_run(sc, prepared.policies, threads);
  add_network_plan_time(e, sc, prepared.policies, threads);
  const auto& baseline = sc.policies[static_cast<size_t>(sc.baseline)].name;

  if (args.format == "json") {
    nlohmann::json j;
    j["scenario"] = sc.name;
    j["file"] = sc.file;
    j["stores"] = sc.stores.size();
    j["items"] = sc.items.size();
    j["horizon_days"] = sc.horizon.days;
    j["warmup_days"] = sc.horizon.warmup_days;
    j["replications"] = sc.replications;
    j["seed"] = sc.seed;
    j["open_store_item_days"] = e.open_store_item_days;
    j["scored_store_item_days"] = e.scored_store_item_days;
    j["poisson_fallback_days"] = e.poisson_fallback_days;
    j["estimated_seconds"] = e.seconds;
    j["estimated_plan_seconds"] = e.plan_seconds;
    j["estimated_memory_bytes"] = e.memory_bytes;
    j["threads"] = threads;
    j["baseline"] = baseline;
    for (const auto& p : sc.policies)
      j["policies"].push_back({{"name", p.name}, {"parts", policy_text(sc, p)}});
    if (sc.drill) j["drill"] = drill_json(sc, *sc.drill);
    fmt::print("{}\n", j.dump(2));
    return 0;
  }
  fmt::print("{}: scenario '{}' is valid\n", sc.file, sc.name);
  fmt::print("  network       {} store{} x {} item{}\n", sc.stores.size(),
             sc.stores.size() == 1 ? "" : "s", sc.items.size(), sc.items.size() == 1 ? "" : "s");
  fmt::print("  horizon       {} days ({} warm-up, {} scored), {} replications, seed {}{}\n",
             sc.horizon.days, sc.horizon.warmup_days, sc.scored_days(), sc.replications, sc.seed,
             sc.seed_given ? "" : " (drawn at random)");
  fmt::print(
      "  days          {} open store-item-days per replication ({} scored);\n"
      "                {} simulated in all (x replications x policies)\n",
      e.open_store_item_days, e.scored_store_item_days,
      e.open_store_item_days * sc.replications * static_cast<std::int64_t>(sc.policies.size()));
  if (e.poisson_fallback_days > 0) {
    fmt::print(
        "  note          {} open store-item-days per replication have a negative binomial\n"
        "                whose cv is too low to exceed the mean; they are drawn as Poisson\n",
        e.poisson_fallback_days);
  }
  fmt::print("  policies      {} (baseline: {})\n", sc.policies.size(), baseline);
  for (const auto& p : sc.policies) fmt::print("    {:<20} {}\n", p.name, policy_text(sc, p));
  if (sc.drill) fmt::print("{}", drill_text(sc, *sc.drill));
  fmt::print("  estimate      about {} on {} thread{}{}, about {} of memory\n",
             format_duration(e.seconds), threads, threads == 1 ? "" : "s",
             e.plan_seconds > 0
                 ? fmt::format(" (network plans about {})", format_duration(e.plan_seconds))
                 : std::string(),
             format_bytes(e.memory_bytes));
  const std::size_t limit = default_memory_limit();
  fmt::print("  memory limit  {} (larder run's default --max-memory){}\n", format_bytes(limit),
             e.memory_bytes > limit ? ": this run would be refused" : "");
  return 0;
}

}  // namespace larder
