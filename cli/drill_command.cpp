// `larder drill SCENARIO`: a training drill (README "Training drills"). The trainee orders the
// drill's items day by day at the prompt (or `--decisions FILE` supplies every order), then the
// same scoring runs either way: the trainee against each comparison policy on identical demand,
// and the habit readings. Writes decisions.csv (after every day, so nothing typed is lost),
// scorecard.json, scorecard.txt and scorecard.html. `--summary DIR...` is the class view.

#include <fmt/format.h>
#include <unistd.h>

#include <filesystem>
#include <iostream>
#include <string>

#include "cli/commands.hpp"
#include "reports/atomic_file.hpp"
#include "reports/class_summary.hpp"
#include "reports/drill_day_text.hpp"
#include "reports/output_claim.hpp"
#include "reports/output_path.hpp"
#include "reports/result_set.hpp"
#include "reports/scorecard_html.hpp"
#include "reports/scorecard_json.hpp"
#include "reports/scorecard_text.hpp"
#include "sim/drill/decision_file.hpp"
#include "sim/drill/order_line.hpp"
#include "sim/drill/scorecard.hpp"
#include "sim/scenario/ids.hpp"

namespace larder {

namespace {

namespace fs = std::filesystem;

[[noreturn]] void input_error(const std::string& where, const std::string& message,
                              const std::string& hint = {}) {
  Diagnostics d;
  d.error({where, 0, 0}, message, hint);
  throw InputError(d);
}

std::string intro(const DrillGame& game, const std::string& trainee) {
  const Scenario& s = game.scenario();
  const DrillSpec& sp = game.spec();
  std::string items;
  for (const int i : sp.items) {
    if (!items.empty()) items += ", ";
    items += s.items[static_cast<size_t>(i)].id;
  }
  std::string compare;
  for (const Policy& p : game.comparisons()) {
    if (!compare.empty()) compare += ", ";
    compare += p.name;
  }
  return fmt::format(
      "Drill '{}' for {}: you order {} at store {} for {} days ({} orders).\n"
      "Until now the store ordered by its house rule ({}); you take over from here. Afterwards\n"
      "you are scored against {} on exactly the same customers. You see what the store saw:\n"
      "sales, sell-outs and leftovers, never the true demand. Type ? for help, q to stop.\n",
      s.name, trainee, items, s.stores[static_cast<size_t>(sp.store)].id, sp.days,
      game.turns().size(), game.comparisons().front().name, compare);
}

/// The interactive loop: reads a line per turn until every turn has its orders, or q / end of
/// input. Saves the decisions after every accepted line. Returns whether the drill finished.
bool play_at_prompt(DrillGame& game, DrillDecisions& decided, const fs::path& csv,
                    const std::string& trainee) {
  const Scenario& s = game.scenario();
  const DrillSpec& sp = game.spec();
  std::vector<std::string> names;
  for (const int i : sp.items) names.push_back(s.items[static_cast<size_t>(i)].id);
  const bool interactive = ::isatty(STDIN_FILENO) != 0;
  std::cout << intro(game, trainee) << '\n';
  for (int j = static_cast<int>(decided.size()); j < static_cast<int>(game.turns().size()); ++j) {
    const DrillView v = game.view(j, decided);
    std::vector<std::optional<int>> previous;
    for (const ItemView& iv : v.items) previous.push_back(iv.last_order);
    std::cout << drill_day_text(s, v) << std::flush;
    while (true) {
      std::cout << drill_prompt_text(s, v) << std::flush;
      std::string line;
      if (!std::getline(std::cin, line)) {
        std::cout << '\n';
        return false;
      }
      if (!interactive) std::cout << line << '\n';  // captured output reads like the terminal
      const OrderLine o = parse_order_line(line, names, previous);
      if (o.kind == OrderLine::Kind::help) {
        std::cout << drill_help_text(s);
        continue;
      }
      if (o.kind == OrderLine::Kind::quit) return false;
      if (o.kind == OrderLine::Kind::error) {
        std::cout << "  ! " << o.message << '\n';
        continue;
      }
      decided.push_back(o.quantities);
      write_file_atomically(csv, decisions_csv(game, decided));
      break;
    }
  }
  return true;
}

std::vector<std::string> drill_file_names() {
  return {"decisions.csv", "scorecard.json", "scorecard.txt", "scorecard.html"};
}

/// Before the drill starts: the folder's paths are safe to write, and a folder holding a
/// drill's saved decisions is not written over without --force.
void check_drill_folder(const fs::path& dir, const DrillArgs& args) {
  check_output_folder(
      dir, drill_file_names(),
      {{args.common.scenario, "the scenario"}, {args.decisions, "the --decisions file"}});
  std::error_code ec;
  if (!args.force && fs::exists(dir / "decisions.csv", ec)) {
    input_error((dir / "decisions.csv").string(),
                "this folder holds a drill's saved decisions; a new session would replace them",
                "choose another --out or --trainee, or pass --force to replace them");
  }
}

int class_view(const DrillArgs& args) {
  const ClassSummary summary = read_class(args.summary);
  const fs::path dir = args.out.empty() ? fs::path("larder-out") / (summary.scenario + "-class")
                                        : fs::path(args.out);
  std::vector<InputFile> inputs;
  for (const std::string& p : args.summary) {
    inputs.push_back({p, "a scorecard given to --summary"});
    inputs.push_back({fs::path(p) / "scorecard.json", "a scorecard given to --summary"});
  }
  check_output_folder(dir, {"class.csv"}, inputs);
  claim_output_folder(dir, args.force);
  publish_result_set(dir, {{"class.csv", class_csv(summary)}}, {});
  std::cout << class_text(summary);
  if (!args.common.quiet) fmt::print(stderr, "wrote {}\n", (dir / "class.csv").string());
  return 0;
}

}  // namespace

int drill_command(const DrillArgs& args) {
  if (!args.summary.empty()) return class_view(args);
  if (args.common.scenario.empty()) {
    input_error("larder drill", "a drill needs a SCENARIO with a drill: section",
                "e.g. larder drill scenarios/drill-bakery.yaml (or --summary DIR... for the "
                "class view)");
  }
  if (!is_valid_id(args.trainee)) {
    input_error("--trainee",
                fmt::format("--trainee '{}' {}", args.trainee, id_problem(args.trainee)),
                "the name becomes part of the output folder's name");
  }
  const PreparedScenario prepared = prepare_scenario(args.common.scenario, args.common.overrides);
  if (!prepared.scenario.drill) {
    input_error(prepared.scenario.file, "the scenario has no drill: section",
                "add e.g. drill: { store: quay, items: [rye, croissant], days: 28, compare: "
                "[newsvendor, habit] } (README, Training drills)");
  }
  const fs::path dir = args.out.empty() ? fs::path("larder-out") / prepared.scenario.name /
                                              fmt::format("drill-{}", args.trainee)
                                        : fs::path(args.out);
  check_drill_folder(dir, args);
  DrillGame game(prepared.scenario);
  DrillDecisions decided;
  if (!args.decisions.empty()) {
    decided = read_decisions(game, args.decisions);
    claim_output_folder(dir, args.force);
  } else {
    claim_output_folder(dir, args.force);
    // --force over a saved drill: its files leave together, so the folder never pairs this
    // session's decisions with the earlier scorecard.
    publish_result_set(dir, {}, drill_file_names());
    if (!play_at_prompt(game, decided, dir / "decisions.csv", args.trainee)) {
      write_file_atomically(dir / "decisions.csv", decisions_csv(game, decided));
      fmt::print(stderr,
                 "Stopped after {} of {} orders; they are saved in {}. An unfinished drill gets "
                 "no scorecard.\n",
                 decided.size(), game.turns().size(), (dir / "decisions.csv").string());
      return 0;
    }
  }
  const Scorecard card = score_drill(game, decided, args.trainee);
  const std::string json = scorecard_json_text(card);
  const std::string text = scorecard_text(card);
  publish_result_set(dir,
                     {{"decisions.csv", decisions_csv(game, decided)},
                      {"scorecard.json", json},
                      {"scorecard.txt", text},
                      {"scorecard.html", scorecard_html(card)}},
                     {});
  if (args.common.format == "json") {
    std::cout << json;
  } else {
    std::cout << '\n' << text;
  }
  if (!args.common.quiet) {
    fmt::print(stderr, "wrote {}/: decisions.csv, scorecard.json, scorecard.txt, scorecard.html\n",
               dir.string());
  }
  return 0;
}

}  // namespace larder
