// Training drills end to end: a decision file that orders what `fixed` orders scores exactly
// like it; decisions.csv replayed by the `replay` rule reproduces the trainee; habit readings
// recover the parameters of players written as the rules of checks.md 7.2; the worked
// exercises load and score; the command's scripted play and class view; and the prompt driven
// through a pseudo-terminal (tmux) with bad input.

#include <fmt/format.h>

#include <catch2/catch.hpp>
#include <chrono>
#include <cmath>
#include <cstdlib>
#include <cstring>
#include <fstream>
#include <nlohmann/json.hpp>
#include <pcg_random.hpp>
#include <sstream>
#include <thread>

#include "reports/csv.hpp"
#include "reports/markup_check.test.hpp"
#include "reports/scorecard_html.hpp"
#include "reports/scorecard_json.hpp"
#include "sim/drill/decision_file.hpp"
#include "sim/drill/scorecard.hpp"
#include "tests/fixture.hpp"

namespace larder {
namespace {

namespace fs = std::filesystem;

const std::string kFixed = R"(format: 1
name: drill-fixed
seed: 99
horizon: { days: 100, warmup_days: 14 }
stores: [ { id: a }, { id: b, size: 1.5 } ]
items:
  - { id: loaf, price: 3, unit_cost: 1, demand: { base: 12, weekday: { sat: 1.5 } } }
  - { id: pie, price: 5, unit_cost: 2, shelf_life_days: 3, pack_size: 4, demand: { base: 6, distribution: negative_binomial, cv: 0.5 } }
  - { id: tart, price: 4, unit_cost: 1.5, demand: { base: 8 } }
policies:
  - { name: steady, forecast: { method: ses_weekday }, quantity: { rule: fixed, quantity: { loaf: 13, pie: 5, tart: 9 } } }
  - { name: newsvendor, forecast: { method: ses_weekday }, censoring: normal_tail, quantity: { rule: critical_fractile } }
)";

const std::string kDrill =
    "drill: { store: b, items: [pie, loaf], days: 21, compare: [steady, newsvendor],\n"
    "         events: [ { day: 5, demand: 1.8 }, { day: 9, demand: 0.5, announced: true } ] }\n";

bool same_bits(double a, double b) {
  return std::memcmp(&a, &b, sizeof a) == 0;
}

/// Every metric of two rows, bit for bit.
bool identical(const MetricVector& a, const MetricVector& b) {
  for (size_t m = 0; m < kMetricCount; ++m) {
    if (!same_bits(a[m], b[m])) return false;
  }
  return true;
}

TEST_CASE("a decision file ordering what fixed orders scores exactly like fixed", "[drill]") {
  const Scenario sc = test::scenario_from(kFixed + kDrill);
  DrillGame game(sc);
  REQUIRE(game.turns().size() == 21);
  // The fixed quantities of pie (5, rounded up to packs of 4 by the engine for both) and loaf.
  DrillDecisions fixed(game.turns().size(), std::vector<int>{5, 13});
  // Through the file format, as `larder drill --decisions` reads it.
  const DrillDecisions read = parse_decisions(game, decisions_csv(game, fixed), "fixed.csv");
  REQUIRE(read == fixed);
  const Scorecard c = score_drill(game, read, "trainee");
  REQUIRE(c.policies == std::vector<std::string>{"trainee", "steady", "newsvendor"});
  CHECK(identical(c.totals[0], c.totals[1]));
  for (int d = 0; d < c.days; ++d) {
    INFO("drill day " << d + 1);
    CHECK(identical(c.daily[0][static_cast<size_t>(d)], c.daily[1][static_cast<size_t>(d)]));
  }
  // The comparison can tell policies apart: the newsvendor, and one loaf more on one day.
  CHECK_FALSE(identical(c.totals[0], c.totals[2]));
  DrillDecisions one_more = fixed;
  one_more[3][1] += 1;
  CHECK_FALSE(identical(score_drill(game, one_more, "t").totals[0], c.totals[1]));
}

TEST_CASE("the replay rule reproduces a drill from its decisions.csv", "[drill]") {
  const Scenario sc = test::scenario_from(kFixed + kDrill);
  DrillGame game(sc);
  DrillDecisions decided;
  for (size_t j = 0; j < game.turns().size(); ++j) {
    decided.push_back({static_cast<int>(2 + j % 5), static_cast<int>(9 + (j * 7) % 6)});
  }
  const test::ScratchDir dir("drill-replay");
  const fs::path csv = dir.path() / "decisions.csv";
  std::ofstream(csv) << decisions_csv(game, decided);
  const Scorecard c = score_drill(game, decided, "trainee");

  // The same scenario with a replay policy of that file among the comparisons.
  std::string text = kFixed;
  text += fmt::format(
      "  - {{ name: replayed, forecast: {{ method: ses_weekday }}, quantity: {{ rule: replay, "
      "file: '{}' }} }}\n",
      csv.string());
  text +=
      "drill: { store: b, items: [pie, loaf], days: 21, compare: [steady, replayed],\n"
      "         events: [ { day: 5, demand: 1.8 }, { day: 9, demand: 0.5, announced: true } ] }\n";
  const Scenario with_replay = test::scenario_from(text);
  DrillGame again(with_replay);
  const Scorecard r = score_drill(again, decided, "trainee");
  REQUIRE(r.policies[2] == "replayed");
  CHECK(identical(r.totals[0], c.totals[0]));  // the trainee does not depend on the others
  CHECK(identical(r.totals[2], c.totals[0]));  // replay orders what the trainee ordered
  CHECK_FALSE(identical(r.totals[1], c.totals[0]));
}

/// A whole number with expectation v (stochastic rounding), so rounding adds noise, not bias.
int unbiased_round(double v, pcg32& g) {
  const double f = std::floor(v);
  const double u = (static_cast<double>(g()) + 0.5) / 4294967296.0;
  return static_cast<int>(f) + (u < v - f ? 1 : 0);
}

const std::string kSteady = R"(format: 1
name: drill-habits
seed: 4242
horizon: { days: 200, warmup_days: 14 }
stores: [ { id: shop } ]
items:
  - { id: roll, price: 1.0, unit_cost: 0.2, demand: { base: 20, weekday: { mon: 0.8, fri: 1.3, sat: 1.6 } } }
  - { id: cake, price: 3.0, unit_cost: 2.1, demand: { base: 30, weekday: { tue: 0.7, sat: 1.4 } } }
policies:
  - { name: house, forecast: { method: ses_weekday }, quantity: { rule: in_stock_target, level: 0.7 } }
drill: { store: shop, items: [roll, cake], days: 150 }
)";

TEST_CASE("habit readings recover the weights of scripted players", "[drill]") {
  const Scenario sc = test::scenario_from(kSteady);
  SECTION("a player smoothing the last sales with weight 0.6 reads about 0.6") {
    // Rule (iii) of checks.md 7.2 on the stock at opening (one-day items: the delivery), by a
    // planner who also follows the weekday pattern: Q_a = Q_d + 0.6 (S_d - Q_d) + mu_a - mu_d.
    DrillGame game(sc);
    pcg32 g(17, 3);
    DrillDecisions decided;
    for (int j = 0; j < static_cast<int>(game.turns().size()); ++j) {
      const DrillView v = game.view(j, decided);
      const DrillTurn& t = v.turn;
      std::vector<int> orders;
      for (size_t k = 0; k < 2; ++k) {
        const int item = game.spec().items[k];
        const SeenDay& last = v.items[k].recent.back();
        REQUIRE(last.day == t.order_day);
        const double mu_d = game.demand().mean(0, item, t.order_day);
        const double mu_a = game.demand().mean(0, item, t.arrival_day);
        const double q = last.delivered + 0.6 * (last.sold - last.delivered) + (mu_a - mu_d);
        orders.push_back(std::max(0, unbiased_round(q, g)));
      }
      decided.push_back(orders);
    }
    const Scorecard c = score_drill(game, decided, "smoother");
    const SlopeFit& f = c.habits.front().chasing;
    INFO("read " << f.value << " +- " << f.std_error << " from " << f.n);
    REQUIRE(f.n > 250);
    REQUIRE(f.std_error < 0.05);
    CHECK(std::abs(f.value - 0.6) < 4.0 * f.std_error);
  }
  SECTION("a player at w of the way from Q* to the mean reads about w") {
    // Rule (i) of checks.md 7.2 with the true law: Q = (1 - w) Q* + w mu, w = 0.4.
    DrillGame game(sc);
    pcg32 g(23, 9);
    DrillDecisions decided;
    const std::vector<double> ratio{0.8, 0.3};  // (p - c) / p of roll and cake
    for (const DrillTurn& t : game.turns()) {
      std::vector<int> orders;
      for (size_t k = 0; k < 2; ++k) {
        const CountLaw law = game.demand().law(0, game.spec().items[k], t.arrival_day);
        const double q_star = law.quantile(ratio[k]);
        orders.push_back(unbiased_round(0.6 * q_star + 0.4 * law.mean, g));
      }
      decided.push_back(orders);
    }
    const Scorecard c = score_drill(game, decided, "centre");
    const HabitReading& h = c.habits.front();
    INFO("read " << h.pull_to_center.value << " +- " << h.pull_to_center.std_error);
    REQUIRE(h.pull_to_center.std_error < 0.08);
    CHECK(std::abs(h.pull_to_center.value - 0.4) < 4.0 * h.pull_to_center.std_error);
    // The margins justify 80% and 30% cover (the critical fractiles, common practice).
    CHECK(c.habits[1].justified_service == Approx(0.8));
    CHECK(c.habits[2].justified_service == Approx(0.3));
    // Pulled toward the mean: less cover than justified for roll, more for cake.
    CHECK(c.habits[1].implied_service < 0.8);
    CHECK(c.habits[2].implied_service > 0.3);
  }
}

TEST_CASE("the worked exercises load, play and score", "[drill]") {
  for (const char* name : {"drill-bakery.yaml", "drill-dairy.yaml"}) {
    INFO(name);
    const Scenario sc = load_scenario_file(std::string(LARDER_SOURCE_DIR) + "/scenarios/" + name);
    REQUIRE(sc.drill);
    DrillGame game(sc);
    // A trainee who copies the house rule's order of the same day.
    DrillDecisions decided;
    for (const DrillTurn& t : game.turns()) {
      std::vector<int> orders;
      for (const int i : game.spec().items) orders.push_back(game.house_order(t.order_day, i));
      decided.push_back(orders);
    }
    const DrillView first = game.view(0, {});
    CHECK(first.items.size() == game.spec().items.size());
    CHECK_FALSE(first.items[0].recent.empty());
    const Scorecard c = score_drill(game, decided, "copy");
    REQUIRE(c.policies.size() == game.spec().compare.size() + 1);
    CHECK(c.habits.size() == game.spec().items.size() + 1);
    for (size_t p = 0; p < c.policies.size(); ++p) {
      CHECK(std::isfinite(at(c.totals[p], Metric::profit)));
      CHECK(at(c.totals[p], Metric::fill_rate) > 0.0);
    }
    const auto j = nlohmann::json::parse(scorecard_json_text(c));
    CHECK(j["policies"][0]["role"] == "trainee");
    CHECK(j["policies"][0]["daily"]["profit"].size() == static_cast<size_t>(c.days));
    CHECK(test::markup_problems(scorecard_html(c), "html", "html").empty());
  }
}

// --- the command -------------------------------------------------------------------------

struct Outcome {
  int code = -1;
  std::string out;
  std::string err;
};

std::string slurp(const fs::path& p) {
  std::ifstream in(p);
  std::stringstream s;
  s << in.rdbuf();
  return s.str();
}

Outcome larder(const std::string& args, const fs::path& dir) {
  const fs::path err = dir / "stderr.txt";
  const test::ProcessResult r =
      test::run_command_line(fmt::format("({} {} 2>{})", LARDER_BINARY, args, err.string()));
  return {r.code, r.output, slurp(err)};
}

TEST_CASE("larder drill --decisions scores a file; --summary combines scorecards", "[drill]") {
  const test::ScratchDir dir("drill-cli");
  const fs::path scenario = dir.path() / "ex.yaml";
  std::ofstream(scenario) << kFixed + kDrill;
  const Scenario sc = test::scenario_from(kFixed + kDrill);
  DrillGame game(sc);
  const fs::path ann = dir.path() / "ann.csv";
  const fs::path ben = dir.path() / "ben.csv";
  std::ofstream(ann) << decisions_csv(game, DrillDecisions(game.turns().size(), {5, 13}));
  std::ofstream(ben) << decisions_csv(game, DrillDecisions(game.turns().size(), {8, 20}));
  for (const auto& [who, file] : {std::pair{"ann", ann}, std::pair{"ben", ben}}) {
    const Outcome o =
        larder(fmt::format("drill {} --decisions {} --trainee {} --out {}", scenario.string(),
                           file.string(), who, (dir.path() / who).string()),
               dir.path());
    INFO(o.err);
    REQUIRE(o.code == 0);
    CHECK(o.out.find("Drill scorecard") != std::string::npos);
    for (const char* f : {"decisions.csv", "scorecard.json", "scorecard.txt", "scorecard.html"}) {
      CHECK(fs::exists(dir.path() / who / f));
    }
  }
  // ann ordered what steady orders: the same profit in her scorecard.
  const auto card = nlohmann::json::parse(slurp(dir.path() / "ann" / "scorecard.json"));
  CHECK(card["policies"][0]["metrics"]["profit"] == card["policies"][1]["metrics"]["profit"]);

  const Outcome s =
      larder(fmt::format("drill --summary {} {} --out {}", (dir.path() / "ann").string(),
                         (dir.path() / "ben").string(), (dir.path() / "class").string()),
             dir.path());
  INFO(s.err);
  REQUIRE(s.code == 0);
  CHECK(s.out.find("ann") != std::string::npos);
  CHECK(s.out.find("ben") != std::string::npos);
  const std::string csv = slurp(dir.path() / "class" / "class.csv");
  std::istringstream lines(csv);
  std::vector<std::vector<std::string>> rows;
  for (std::string l; std::getline(lines, l);) {
    std::vector<std::string> cells;
    std::istringstream fields(l);
    for (std::string c; std::getline(fields, c, ',');) cells.push_back(c);
    rows.push_back(cells);
  }
  REQUIRE(rows.size() == 5);  // header, ann, ben, steady, newsvendor
  REQUIRE(rows[0].size() == 12);
  CHECK(rows[0][7] == "profit_vs_house");
  CHECK((rows[1][0] == "ann" && rows[1][1] == "trainee"));
  CHECK((rows[2][0] == "ben" && rows[2][1] == "trainee"));
  CHECK((rows[3][0] == "steady" && rows[3][1] == "house"));
  CHECK((rows[4][0] == "newsvendor" && rows[4][1] == "comparison"));
  // ann ordered what the house orders: 0; ben's is his scorecard's difference against it.
  const auto ben_card = nlohmann::json::parse(slurp(dir.path() / "ben" / "scorecard.json"));
  const double ben_diff = ben_card["differences"][0]["metrics"]["profit"].get<double>();
  CHECK(rows[1][7] == "0");
  CHECK(rows[2][7] == csv_number(ben_diff));
  CHECK(rows[2][6] == csv_number(ben_card["policies"][0]["metrics"]["profit"].get<double>()));

  // A bad decision file: compiler-style messages, exit 2, nothing scored.
  const fs::path bad = dir.path() / "bad.csv";
  std::ofstream(bad) << "day,store,item,quantity\n13,b,pie,x\n13,a,loaf,4\n13,b,tart,1\n";
  const Outcome e = larder(fmt::format("drill {} --decisions {} --out {}", scenario.string(),
                                       bad.string(), (dir.path() / "bad").string()),
                           dir.path());
  CHECK(e.code == 2);
  CHECK(e.err.find(bad.string() + ":2:10: error: quantity must be a whole number") !=
        std::string::npos);
  CHECK(e.err.find(bad.string() + ":3:4: error: store 'a' is not the drill's store 'b'") !=
        std::string::npos);
  CHECK(e.err.find(bad.string() + ":4:6: error: item 'tart' is not one of the drill's items") !=
        std::string::npos);
  CHECK(e.err.find("no order of item 'loaf' placed on day 13 (drill day 1)") != std::string::npos);
  CHECK_FALSE(fs::exists(dir.path() / "bad" / "scorecard.json"));
}

TEST_CASE("a drill folder with saved decisions is not written over without --force", "[drill]") {
  // Issue 23: a new session in a finished trainee's folder, quit at once, replaced its
  // decisions.csv and left the old scorecard beside them.
  const test::ScratchDir dir("drill-keep");
  const fs::path scenario = dir.path() / "ex.yaml";
  std::ofstream(scenario) << kFixed + kDrill;
  DrillGame game(test::scenario_from(kFixed + kDrill));
  const fs::path ann = dir.path() / "ann.csv";
  std::ofstream(ann) << decisions_csv(game, DrillDecisions(game.turns().size(), {5, 13}));
  const fs::path out = dir.path() / "ann";
  REQUIRE(larder(fmt::format("drill {} --decisions {} --out {} --quiet", scenario.string(),
                             ann.string(), out.string()),
                 dir.path())
              .code == 0);
  const std::string decisions = slurp(out / "decisions.csv");
  const std::string card = slurp(out / "scorecard.json");

  // The class view: the same folder three times, and a damaged scorecard, are refused plainly.
  const Outcome thrice =
      larder(fmt::format("drill --summary {0} {0} {1}/scorecard.json --out {2}", out.string(),
                         out.string(), (dir.path() / "class").string()),
             dir.path());
  CHECK(thrice.code == 2);
  CHECK(thrice.err.find("this scorecard is given more than once (first as " + out.string() + ")") !=
        std::string::npos);
  const fs::path damaged = dir.path() / "damaged.json";
  std::ofstream(damaged) << R"({"format": "larder-drill-scorecard", "scenario": 5})";
  const Outcome broken = larder(
      fmt::format("drill --summary {} --out {}", damaged.string(), (dir.path() / "class").string()),
      dir.path());
  CHECK(broken.code == 2);
  CHECK(broken.err.find("not a scorecard larder can read (damaged or edited?)") !=
        std::string::npos);
  CHECK(broken.err.find("[json.exception") == std::string::npos);

  const Outcome again =
      larder(fmt::format("drill {} --out {} --quiet < /dev/null", scenario.string(), out.string()),
             dir.path());
  INFO(again.err);
  CHECK(again.code == 2);
  CHECK(again.err.find("this folder holds a drill's saved decisions") != std::string::npos);
  CHECK(again.err.find("--force") != std::string::npos);
  CHECK(slurp(out / "decisions.csv") == decisions);
  CHECK(slurp(out / "scorecard.json") == card);

  // Its own decisions.csv given back as --decisions into the same folder: an output that is an
  // input of the same command.
  const Outcome self =
      larder(fmt::format("drill {} --decisions {} --out {} --force --quiet", scenario.string(),
                         (out / "decisions.csv").string(), out.string()),
             dir.path());
  CHECK(self.code == 2);
  CHECK(self.err.find("larder would overwrite its own input") != std::string::npos);

  // With --force a session that stops at once leaves its (empty) decisions and no scorecard of
  // the earlier session.
  const Outcome forced = larder(
      fmt::format("drill {} --out {} --force --quiet < /dev/null", scenario.string(), out.string()),
      dir.path());
  INFO(forced.err);
  CHECK(forced.code == 0);
  CHECK(slurp(out / "decisions.csv") != decisions);
  CHECK_FALSE(fs::exists(out / "scorecard.json"));
  CHECK_FALSE(fs::exists(out / "scorecard.txt"));
  CHECK_FALSE(fs::exists(out / "scorecard.html"));
}

/// Runs tmux on its own server socket (never the user's).
test::ProcessResult tmux(const std::string& socket, const std::string& args) {
  return test::run_command_line(fmt::format("tmux -f /dev/null -L {} {} 2>&1", socket, args));
}

std::size_t count(const std::string& text, const std::string& needle) {
  std::size_t n = 0;
  for (auto p = text.find(needle); p != std::string::npos; p = text.find(needle, p + 1)) ++n;
  return n;
}

TEST_CASE("the drill prompt through a pseudo-terminal, bad input included", "[drill]") {
  if (std::system("command -v tmux >/dev/null 2>&1") != 0) {
    if (std::getenv("CI") != nullptr) FAIL("tmux is missing: .ci/install-deps installs it");
    WARN("tmux is not installed: the pseudo-terminal test of larder drill is skipped");
    return;
  }
  const test::ScratchDir dir("drill-pty");
  const fs::path scenario = dir.path() / "ex.yaml";
  std::ofstream(scenario) << kFixed << "drill: { store: b, items: [pie, loaf], days: 3 }\n";
  const fs::path out = dir.path() / "out";
  const std::string socket = fmt::format("larder-drill-test-{}", static_cast<long>(::getpid()));
  const std::string command =
      fmt::format("'{} drill {} --trainee pty --out {}; echo DRILL-EXIT=$?; sleep 600'",
                  LARDER_BINARY, scenario.string(), out.string());
  REQUIRE(tmux(socket, "new-session -d -s drill -x 132 -y 60 " + command).code == 0);
  struct Server {
    std::string socket;
    ~Server() { tmux(socket, "kill-server"); }
  } server{socket};
  const auto screen = [&] { return tmux(socket, "capture-pane -p -J -S - -t drill").output; };
  const auto wait_for = [&](const std::string& needle, std::size_t times) {
    for (int k = 0; k < 300; ++k) {
      if (count(screen(), needle) >= times) return true;
      std::this_thread::sleep_for(std::chrono::milliseconds(100));
    }
    return false;
  };
  const auto type = [&](const std::string& line) {
    REQUIRE(tmux(socket, fmt::format("send-keys -t drill -l -- '{}'", line)).code == 0);
    REQUIRE(tmux(socket, "send-keys -t drill Enter").code == 0);
  };
  const std::string prompt = "Order for ";
  REQUIRE(wait_for(prompt, 1));
  type("abc");
  REQUIRE(wait_for(prompt, 2));
  type("-3 4");
  REQUIRE(wait_for(prompt, 3));
  type("1 2 3");
  REQUIRE(wait_for(prompt, 4));
  type("?");
  REQUIRE(wait_for(prompt, 5));
  type("7 14");
  REQUIRE(wait_for(prompt, 6));
  type("r");
  REQUIRE(wait_for(prompt, 7));
  type("= 11");
  REQUIRE(wait_for("DRILL-EXIT=", 1));
  const std::string s = screen();
  INFO(s);
  CHECK(s.find("DRILL-EXIT=0") != std::string::npos);
  CHECK(s.find("'abc' is not a whole number of units") != std::string::npos);
  CHECK(s.find("-3: pie cannot order fewer than 0 units") != std::string::npos);
  CHECK(s.find("3 values for 2 items") != std::string::npos);
  CHECK(s.find("Type one whole number per item") != std::string::npos);
  // The same day was asked again: one screen of day 1, five prompts before day 2's screen.
  CHECK(count(s, "Drill day 1 of 3") == 1);
  const std::string day1 = s.substr(0, s.find("Drill day 2 of 3"));
  CHECK(count(day1, prompt) == 5);
  CHECK(s.find("Drill scorecard: pty") != std::string::npos);
  // Nothing lost: the three accepted lines, in the replay format.
  const std::string csv = slurp(out / "decisions.csv");
  CHECK(csv.find("13,b,pie,7\n13,b,loaf,14\n14,b,pie,7\n14,b,loaf,14\n15,b,pie,7\n"
                 "15,b,loaf,11\n") != std::string::npos);
  CHECK(fs::exists(out / "scorecard.json"));
}

}  // namespace
}  // namespace larder
