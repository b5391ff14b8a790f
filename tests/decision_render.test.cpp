// The decision summary of report.html rendered by Debian's chromium (headless), as a reader sees
// it: with eight policies every table fits a 1280-pixel-wide window (no box scrolls sideways and
// the page does not either), and each policy's sentence agrees with the verdicts summary.json
// gives for waste (kg), lost customers and profit. Sizes are read from the rendered page by a
// script added to a copy of it (the report itself has none): the browser's own layout, not ours.

#include <fmt/format.h>

#include <catch2/catch.hpp>
#include <cstdlib>
#include <nlohmann/json.hpp>

#include "reports/markup_check.test.hpp"

namespace larder {
namespace {

namespace fs = std::filesystem;

// Eight policies with long names, items with weights and CO2e per unit.
const char* kScenario = R"(format: 1
name: eight-rules
seed: 24
horizon: { days: 45, warmup_days: 10 }
replications: 4
currency: EUR
stores: [ { id: corner }, { id: market, size: 1.4 }, { id: station, size: 0.8 } ]
items:
  - { id: roll, price: 1.5, unit_cost: 0.4, weight_kg: 0.06, co2e_kg: 0.1, demand: { base: 30 } }
  - { id: pie, price: 4, unit_cost: 1.5, shelf_life_days: 2, weight_kg: 0.2, co2e_kg: 0.6,
      demand: { base: 8 } }
policies:
  - name: habit-in-stock-95
    forecast: { method: ses_weekday, alpha: 0.3 }
    quantity: { rule: in_stock_target, level: 0.95, assume: normal }
  - name: fixed-quantity-every-day
    forecast: { method: oracle }
    quantity: { rule: fixed, quantity: { roll: 35, pie: 9 } }
  - name: newsvendor-on-sales
    forecast: { method: ses_weekday, alpha: 0.3 }
    censoring: ignore
    quantity: { rule: critical_fractile }
  - name: newsvendor-corrected
    forecast: { method: ses_weekday, alpha: 0.3 }
    censoring: normal_tail
    quantity: { rule: critical_fractile }
  - name: newsvendor-oracle
    forecast: { method: oracle }
    quantity: { rule: critical_fractile }
  - name: fill-rate-target-90
    forecast: { method: ses_weekday, alpha: 0.3 }
    censoring: normal_tail
    quantity: { rule: fill_rate_target, level: 0.9 }
  - name: in-stock-target-70
    forecast: { method: ses_weekday, alpha: 0.3 }
    censoring: normal_tail
    quantity: { rule: in_stock_target, level: 0.7 }
  - name: base-stock-level-20
    forecast: { method: oracle }
    quantity: { rule: base_stock, level: 20 }
baseline: habit-in-stock-95
)";

// Added before </body> of a copy: measures every table box and the page, collects the
// sentences, and writes them as JSON into the page for --dump-dom.
constexpr std::string_view kMeasure = R"(<script>
const out = { viewport: window.innerWidth, page: document.documentElement.scrollWidth,
              boxes: [], sentences: [] };
for (const box of document.querySelectorAll('.scroll')) {
  const caption = box.querySelector('caption');
  const r = box.getBoundingClientRect();
  out.boxes.push({ caption: caption ? caption.textContent : '', scroll: box.scrollWidth,
                   client: box.clientWidth, right: r.right,
                   decision: box.closest('#decision') !== null });
}
for (const li of document.querySelectorAll('#decision li')) out.sentences.push(li.textContent);
const pre = document.createElement('pre');
pre.id = 'measured';
pre.textContent = 'MEASURED' + JSON.stringify(out) + 'END';
document.body.appendChild(pre);
</script>
)";

std::string unescape(std::string s) {
  for (const auto& [from, to] : {std::pair<std::string, std::string>{"&lt;", "<"},
                                 {"&gt;", ">"},
                                 {"&quot;", "\""},
                                 {"&amp;", "&"}}) {
    for (std::size_t at = s.find(from); at != std::string::npos; at = s.find(from, at + 1)) {
      s.replace(at, from.size(), to);
    }
  }
  return s;
}

TEST_CASE("decision summary in chromium: eight policies fit 1280 pixels, sentences agree",
          "[html][cli]") {
  const std::string chromium = test::find_chromium();
  if (chromium.empty()) {
    const std::string message =
        "chromium is not installed, so the decision summary was not rendered: install it with "
        "`sudo apt-get install chromium` (bash .ci/install-deps does)";
    if (std::getenv("CI") != nullptr) FAIL(message);  // CI installs it: never skip there
    WARN("SKIPPED: " + message);
    return;
  }
  const test::ScratchDir dir("decision-render");
  const fs::path scenario = dir.path() / "eight.yaml";
  std::ofstream(scenario) << kScenario;
  const fs::path out = dir.path() / "out";
  const test::ProcessResult run = test::run_command_line(fmt::format(
      "{} run {} --quiet --threads 2 --out {}", LARDER_BINARY, scenario.string(), out.string()));
  INFO(run.output);
  REQUIRE(run.code == 0);

  std::string html = test::read_all(out / "report.html");
  const std::size_t body_end = html.rfind("</body>");
  REQUIRE(body_end != std::string::npos);
  html.insert(body_end, kMeasure);
  const fs::path page = dir.path() / "measure.html";
  std::ofstream(page, std::ios::binary) << html;
  const test::ProcessResult dom = test::run_command_line(
      fmt::format("timeout 180 {} --headless --disable-gpu --no-sandbox --hide-scrollbars "
                  "--user-data-dir={} --window-size=1280,900 --dump-dom file://{}",
                  chromium, (dir.path() / "profile").string(), fs::absolute(page).string()));
  REQUIRE(dom.code == 0);
  const std::size_t begin = dom.output.find("MEASURED{");  // not the script's own text
  const std::size_t end = dom.output.find("END</pre>");
  INFO(dom.output.substr(0, 2000));
  REQUIRE(begin != std::string::npos);
  REQUIRE(end != std::string::npos);
  const nlohmann::json m =
      nlohmann::json::parse(unescape(dom.output.substr(begin + 8, end - begin - 8)));
  INFO(m.dump(1));

  // The window is the 1280 pixels asked for; the page does not scroll sideways.
  REQUIRE(m["viewport"].get<int>() == 1280);
  CHECK(m["page"].get<int>() <= 1280);
  // No table box scrolls sideways, the decision table's first.
  int decision_tables = 0;
  for (const auto& box : m["boxes"]) {
    INFO(box["caption"].get<std::string>());
    CHECK(box["scroll"].get<int>() <= box["client"].get<int>());
    CHECK(box["right"].get<double>() <= 1280.0);
    decision_tables += box["decision"].get<bool>() ? 1 : 0;
  }
  CHECK(decision_tables == 1);
  CHECK(m["boxes"].size() > 10);  // the key metrics, 7 differences, breakdowns...

  // One sentence per policy but the baseline, agreeing with summary.json's verdicts.
  const nlohmann::json summary = nlohmann::json::parse(test::read_all(out / "summary.json"));
  const auto& differences = summary["differences"];
  REQUIRE(differences.size() == 7);
  REQUIRE(m["sentences"].size() == 7);
  for (std::size_t k = 0; k < differences.size(); ++k) {
    const auto& d = differences[k];
    const std::string s = m["sentences"][k].get<std::string>();
    INFO(s);
    CHECK(s.starts_with(d["policy"].get<std::string>() + " "));
    const std::string waste = d["metrics"]["waste_kg"]["verdict"].get<std::string>();
    const std::string lost = d["metrics"]["lost_units"]["verdict"].get<std::string>();
    const std::string profit = d["metrics"]["profit"]["verdict"].get<std::string>();
    INFO(waste << " | " << lost << " | " << profit);
    CHECK((s.find(" cuts waste by ") != std::string::npos) == waste.starts_with("better"));
    CHECK((s.find(" of waste a year") != std::string::npos) == waste.starts_with("worse"));
    CHECK((s.find("no clear difference to waste") != std::string::npos) ==
          (waste == "no significant difference"));
    CHECK((s.find("fewer customers") != std::string::npos) == lost.starts_with("better"));
    CHECK((s.find("more lost customers") != std::string::npos) == lost.starts_with("worse"));
    CHECK((s.find("no clear difference in lost customers") != std::string::npos) ==
          (lost == "no significant difference"));
    CHECK((s.find("; profit +") != std::string::npos) == profit.starts_with("better"));
    CHECK((s.find("; profit -") != std::string::npos) == profit.starts_with("worse"));
    CHECK((s.find("no clear difference in profit") != std::string::npos) ==
          (profit == "no significant difference"));
  }
}

}  // namespace
}  // namespace larder
