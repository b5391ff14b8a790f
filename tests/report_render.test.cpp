// report.html end to end: `larder run` writes it beside the data files, with the numbers of
// summary.json and a sample store-item day by day, and Debian's chromium renders it (headless)
// to a screenshot that is not blank. The screenshot is read by a small PNG decoder in Python
// (zlib and the five PNG row filters of the PNG specification, section 9), not by larder.

#include <fmt/format.h>

#include <algorithm>
#include <catch2/catch.hpp>
#include <cstdlib>
#include <nlohmann/json.hpp>
#include <sstream>

#include "reports/markup_check.test.hpp"
#include "reports/number_format.hpp"

namespace larder {
namespace {

namespace fs = std::filesystem;

const char* kScenario = R"(format: 1
name: render
seed: 8
horizon: { days: 60, warmup_days: 7 }
replications: 5
stores: [ { id: corner }, { id: market, size: 1.4 } ]
items:
  - { id: roll, price: 1.5, unit_cost: 0.4, weight_kg: 0.06, demand: { base: 30 } }
  - { id: pie, price: 4, unit_cost: 1.5, shelf_life_days: 2, weight_kg: 0.2, demand: { base: 8 } }
policies:
  - name: fixed
    forecast: { method: oracle }
    quantity: { rule: fixed, quantity: { roll: 35, pie: 9 } }
  - name: fractile
    forecast: { method: ses_weekday, alpha: 0.2 }
    quantity: { rule: critical_fractile }
  - name: net
    forecast: { method: ses_weekday, alpha: 0.2 }
    quantity: { rule: network_in_stock, target: 0.7, replan_days: 14 }
)";

/// Runs `larder run` on kScenario into `dir`/out and returns the output folder.
fs::path run_larder(const fs::path& dir) {
  const fs::path scenario = dir / "render.yaml";
  std::ofstream(scenario) << kScenario;
  const fs::path out = dir / "out";
  const test::ProcessResult r = test::run_command_line(fmt::format(
      "{} run {} --quiet --threads 2 --out {}", LARDER_BINARY, scenario.string(), out.string()));
  INFO(r.output);
  REQUIRE(r.code == 0);
  return out;
}

TEST_CASE("larder run writes report.html with summary.json's numbers", "[html][cli]") {
  const test::ScratchDir dir("report-e2e");
  const fs::path out = run_larder(dir.path());
  const std::vector<std::string> entries = test::folder_entries(out);
  CHECK(std::count(entries.begin(), entries.end(), "report.html") == 1);
  for (const std::string& e : entries) {
    // No temporary file left; the marker and the run's record are larder's own.
    CHECK((e.front() != '.' || e == ".larder-output" || e == ".larder-run"));
  }
  const std::string html = test::read_all(out / "report.html");
  CHECK(test::markup_problems(html, "html", "html").empty());
  const nlohmann::json summary = nlohmann::json::parse(test::read_all(out / "summary.json"));
  // Profit of every policy as summary.json has it, rounded as the report rounds it.
  int decimals = 0;
  for (const auto& p : summary["policies"]) {
    const auto& e = p["metrics"]["profit"];
    decimals = std::max(
        decimals,
        estimate_decimals((e["ci_high"].get<double>() - e["ci_low"].get<double>()) / 2, "money"));
  }
  for (const auto& p : summary["policies"]) {
    const auto& e = p["metrics"]["profit"];
    const std::string cell = format_estimate(
        e["mean"].get<double>(), (e["ci_high"].get<double>() - e["ci_low"].get<double>()) / 2,
        "money", decimals);
    INFO(p["name"] << " " << cell);
    // The page keeps the half-width with its sign: U+00A0 after the "\u00b1".
    std::string kept = cell;
    kept.replace(kept.find("\u00b1 "), std::string("\u00b1 ").size(), "\u00b1\u00a0");
    CHECK_THAT(html, Catch::Contains("<td class=\"num\">" + kept + "</td>"));
  }
  // Weights give the kilogram chart; the sample store-item is the busiest item of the first
  // store; the network policy cannot run alone and is named.
  CHECK_THAT(html, Catch::Contains("aria-label=\"Waste (kg) by policy\""));
  CHECK_THAT(html, Catch::Contains("aria-label=\"fixed: roll at corner, days 0 to 41\""));
  CHECK_THAT(html, Catch::Contains("aria-label=\"fractile: roll at corner, days 0 to 41\""));
  CHECK_THAT(html, Catch::Contains("Not shown: net."));
  CHECK_THAT(html, Catch::Contains("id=\"plan-groups\""));
  CHECK_THAT(html, Catch::Contains("2 stores (sizes 1.00 to 1.40): corner, market"));
}

/// Decodes a PNG (8-bit RGB or RGBA, not interlaced) and prints its width, height, the number
/// of distinct colours and the share of non-white pixels (every 2nd pixel of every 4th row),
/// and how many sampled pixels have the colour given as the second argument.
constexpr std::string_view kPngScript = R"py(
import sys, zlib, struct
data = open(sys.argv[1], 'rb').read()
if data[:8] != b'\x89PNG\r\n\x1a\n':
    sys.exit('not a PNG')
pos, idat = 8, []
while pos < len(data):
    n, = struct.unpack('>I', data[pos:pos + 4])
    kind, body = data[pos + 4:pos + 8], data[pos + 8:pos + 8 + n]
    pos += 12 + n
    if kind == b'IHDR':
        w, h, depth, ctype, _, _, interlace = struct.unpack('>IIBBBBB', body)
    elif kind == b'IDAT':
        idat.append(body)
    elif kind == b'IEND':
        break
if depth != 8 or ctype not in (2, 6) or interlace != 0:
    sys.exit('unexpected PNG: depth %d, colour type %d, interlace %d' % (depth, ctype, interlace))
bpp = 3 if ctype == 2 else 4
raw = zlib.decompress(b''.join(idat))
stride = w * bpp
if len(raw) != h * (stride + 1):
    sys.exit('image data has %d bytes, not %d' % (len(raw), h * (stride + 1)))
prev = bytearray(stride)
counts = {}
for y in range(h):
    f = raw[y * (stride + 1)]
    row = bytearray(raw[y * (stride + 1) + 1:(y + 1) * (stride + 1)])
    if f == 1:
        for i in range(bpp, stride): row[i] = (row[i] + row[i - bpp]) & 255
    elif f == 2:
        for i in range(stride): row[i] = (row[i] + prev[i]) & 255
    elif f == 3:
        for i in range(stride):
            left = row[i - bpp] if i >= bpp else 0
            row[i] = (row[i] + ((left + prev[i]) >> 1)) & 255
    elif f == 4:
        for i in range(stride):
            a = row[i - bpp] if i >= bpp else 0
            b, c = prev[i], (prev[i - bpp] if i >= bpp else 0)
            p = a + b - c
            pa, pb, pc = abs(p - a), abs(p - b), abs(p - c)
            row[i] = (row[i] + (a if pa <= pb and pa <= pc else b if pb <= pc else c)) & 255
    elif f != 0:
        sys.exit('unknown filter %d in row %d' % (f, y))
    if y % 4 == 0:
        for x in range(0, stride, bpp * 2):
            px = bytes(row[x:x + 3])
            counts[px] = counts.get(px, 0) + 1
    prev = row
total = sum(counts.values())
white = counts.get(b'\xff\xff\xff', 0)
wanted = bytes(int(sys.argv[2][i:i + 2], 16) for i in (0, 2, 4))
print(w, h, len(counts), 1 - white / total, counts.get(wanted, 0))
)py";

TEST_CASE("chromium renders report.html to a screenshot that is not blank", "[html]") {
  const std::string chromium = test::find_chromium();
  if (chromium.empty()) {
    const std::string message =
        "chromium is not installed, so report.html was not rendered: install it with "
        "`sudo apt-get install chromium` (bash .ci/install-deps does)";
    if (std::getenv("CI") != nullptr) FAIL(message);  // CI installs it: never skip there
    WARN("SKIPPED: " + message);
    return;
  }
  const test::ScratchDir dir("report-render");
  const fs::path out = run_larder(dir.path());
  const fs::path png = dir.path() / "report.png";
  const test::ProcessResult shot = test::run_command_line(
      fmt::format("timeout 180 {} --headless --disable-gpu --no-sandbox --hide-scrollbars "
                  "--user-data-dir={} --screenshot={} --window-size=1200,2000 file://{}",
                  chromium, (dir.path() / "profile").string(), png.string(),
                  fs::absolute(out / "report.html").string()));
  INFO(shot.output);
  REQUIRE(shot.code == 0);
  REQUIRE(fs::exists(png));

  // #fff6ee is the background of the cautions box near the top of the page: seeing it shows
  // the style sheet was applied.
  const test::ProcessResult r =
      test::run_python(kPngScript, fmt::format("{} fff6ee", png.string()), dir.path());
  INFO(r.output);
  REQUIRE(r.code == 0);
  std::istringstream in(r.output);
  int width = 0, height = 0, colours = 0, caution_pixels = 0;
  double ink = 0.0;
  in >> width >> height >> colours >> ink >> caution_pixels;
  CHECK(width == 1200);
  CHECK(height == 2000);
  CHECK(colours >= 16);  // text, tables and charts: anti-aliased text alone gives many
  CHECK(ink > 0.05);     // not a blank page
  CHECK(ink < 0.95);     // nor a page of one colour
  CHECK(caution_pixels > 1000);
}

}  // namespace
}  // namespace larder
