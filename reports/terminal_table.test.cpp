#include "reports/terminal_table.hpp"

#include <catch2/catch.hpp>
#include <sstream>

#include "reports/sample_run.test.hpp"

namespace {

/// Columns on screen: UTF-8 code points, not bytes ("±" is two bytes, one column).
std::size_t columns(std::string_view s) {
  std::size_t n = 0;
  for (char c : s) n += (static_cast<unsigned char>(c) & 0xC0) != 0x80;
  return n;
}

std::vector<std::string> lines_of(const std::string& text) {
  std::vector<std::string> out;
  std::istringstream in(text);
  for (std::string line; std::getline(in, line);) out.push_back(line);
  return out;
}

/// Blocks separated by blank lines, each as its lines.
std::vector<std::vector<std::string>> blocks_of(const std::string& text) {
  std::vector<std::vector<std::string>> out(1);
  for (const auto& line : lines_of(text)) {
    if (line.empty()) {
      out.emplace_back();
    } else {
      out.back().push_back(line);
    }
  }
  return out;
}

/// The line that starts with `label` followed by a space.
std::string line_starting(const std::string& text, const std::string& label) {
  for (const auto& line : lines_of(text)) {
    if (line.rfind(label + " ", 0) == 0) return line;
  }
  return {};
}

/// The column (in code points) just after the end of `needle` in `line`; 0 if absent.
std::size_t end_column(const std::string& line, const std::string& needle) {
  const std::size_t at = line.find(needle);
  if (at == std::string::npos) return 0;
  return columns(std::string_view(line).substr(0, at + needle.size()));
}

/// `text` without ANSI escape sequences.
std::string strip_ansi(const std::string& text) {
  std::string out;
  for (std::size_t i = 0; i < text.size(); ++i) {
    if (text[i] == '\x1b') {
      while (i < text.size() && text[i] != 'm') ++i;
    } else {
      out += text[i];
    }
  }
  return out;
}

}  // namespace

TEST_CASE("table_metrics keeps the key metrics the run reports, in table order", "[reports]") {
  larder::RunResult r = larder::test::sample_run();
  using larder::Metric;
  CHECK(larder::table_metrics(r) == std::vector<Metric>{Metric::waste_units, Metric::waste_share,
                                                        Metric::fill_rate, Metric::lost_units,
                                                        Metric::sold_units, Metric::profit});
  r.metrics.push_back(Metric::co2e_kg);
  r.metrics.push_back(Metric::demand_units);  // reported, but not a key metric
  r.metrics.push_back(Metric::waste_kg);
  CHECK(larder::table_metrics(r).back() == Metric::co2e_kg);
  CHECK(larder::table_metrics(r).size() == 8);
}

TEST_CASE("comparison_table names the run and shows rounded estimates", "[reports]") {
  const larder::RunResult r = larder::test::sample_run();
  const std::string table = larder::comparison_table(r);
  INFO(table);
  CHECK(table.find('\x1b') == std::string::npos);  // no colour unless asked
  CHECK(table.back() == '\n');
  const auto lines = lines_of(table);
  REQUIRE(lines.size() > 2);
  CHECK(lines[0] == "scenario two-shops (scenarios/two-shops.yaml)");
  CHECK(lines[1] ==
        "5 replications, seed 20270104, horizon 91 days, warm-up 14 days, 2 stores, 3 items");

  // Worked by hand from the scipy intervals (half-width = (ci_high - ci_low) / 2): one rounding
  // per row, the finest any policy needs (display_decimals: 2 significant digits of the
  // half-width, at most 3 decimals; shares always 1 decimal of a percent).
  // waste_units half-widths 11.08, 10.68, 9.47 -> 1 decimal.
  const std::string waste = line_starting(table, "waste_units");
  CHECK_THAT(waste, Catch::Contains("units") && Catch::Contains("126.8 ± 11.1") &&
                        Catch::Contains("107.0 ± 10.7") && Catch::Contains("127.2 ± 9.5"));
  // Shares in percent: 12.28% ± 0.83, 10.50% ± 0.84, 12.40% ± 0.75.
  const std::string share = line_starting(table, "waste_share");
  CHECK_THAT(share, Catch::Contains(" % ") && Catch::Contains("12.3 ± 0.8") &&
                        Catch::Contains("10.5 ± 0.8") && Catch::Contains("12.4 ± 0.7"));
  const std::string fill = line_starting(table, "fill_rate");
  CHECK_THAT(fill, Catch::Contains("92.0 ± 2.0") && Catch::Contains("90.2 ± 2.4") &&
                       Catch::Contains("92.2 ± 2.1"));
  // lost_units half-widths 12.2, 15.6, 13.3 -> 0 decimals.
  const std::string lost = line_starting(table, "lost_units");
  CHECK_THAT(
      lost, Catch::Contains("67 ± 12") && Catch::Contains("78 ± 16") && Catch::Contains("67 ± 13"));
  const std::string sold = line_starting(table, "sold_units");
  CHECK_THAT(sold, Catch::Contains("906 ± 12") && Catch::Contains("912 ± 14") &&
                       Catch::Contains("897 ± 11"));
  // Money with thousands separators and the currency in the unit column.
  const std::string profit = line_starting(table, "profit");
  CHECK_THAT(profit, Catch::Contains(" EUR ") && Catch::Contains("2,570 ± 111") &&
                         Catch::Contains("2,718 ± 122") && Catch::Contains("2,566 ± 113"));
  // Metrics the run does not report have no row.
  CHECK(line_starting(table, "in_stock_at_close").empty());
  CHECK(line_starting(table, "waste_kg").empty());
}

TEST_CASE("comparison_table shows differences against the baseline with verdicts", "[reports]") {
  const larder::RunResult r = larder::test::sample_run();
  const std::string table = larder::comparison_table(r);
  INFO(table);
  const auto blocks = blocks_of(table);
  REQUIRE(blocks.size() == 4);         // run header, policies, one block per other policy
  REQUIRE(blocks[2].size() == 3 + 6);  // title, header, rule, 6 metrics
  CHECK(blocks[2][0] == "newsvendor: difference vs fixed_order (paired, 95% CI)");
  CHECK(blocks[3][0] == "cautious, v2: difference vs fixed_order (paired, 95% CI)");

  auto row = [&](size_t block, const std::string& metric) {
    for (const auto& line : blocks[block]) {
      if (line.rfind(metric + " ", 0) == 0) return line;
    }
    return std::string();
  };
  // Worked by hand from the scipy paired intervals (see summary_json.test.cpp).
  CHECK_THAT(row(2, "waste_units"), Catch::Contains("-19.8") && Catch::Contains("-22.2 to -17.4") &&
                                        Catch::Contains("better: lower waste_units (significant)"));
  CHECK_THAT(row(2, "waste_share"), Catch::Contains("% pts") && Catch::Contains("-1.8") &&
                                        Catch::Contains("-1.9 to -1.6") &&
                                        Catch::Contains("better: lower waste_share (significant)"));
  CHECK_THAT(row(2, "fill_rate"), Catch::Contains("-2.4 to -1.2") &&
                                      Catch::Contains("worse: lower fill_rate (significant)"));
  CHECK_THAT(row(2, "lost_units"), Catch::Contains("11.0") && Catch::Contains("7.4 to 14.6") &&
                                       Catch::Contains("worse: higher lost_units (significant)"));
  CHECK_THAT(row(2, "sold_units"), Catch::Contains("6.2") && Catch::Contains("2.0 to 10.4") &&
                                       Catch::Contains("higher sold_units (significant)"));
  CHECK_THAT(row(2, "profit"), Catch::Contains(" 149 ") && Catch::Contains("127 to 170") &&
                                   Catch::Contains("better: higher profit (significant)"));
  CHECK_THAT(row(3, "waste_units"), Catch::Contains("0.4") && Catch::Contains("-1.9 to 2.7") &&
                                        Catch::Contains("no significant difference"));
  CHECK_THAT(row(3, "lost_units"), Catch::Contains(" 0.0 ") && Catch::Contains("-2.5 to 2.5") &&
                                       Catch::Contains("no significant difference"));
  CHECK_THAT(row(3, "profit"), Catch::Contains(" -3 ") && Catch::Contains("-16 to 9") &&
                                   Catch::Contains("no significant difference"));
}

TEST_CASE("comparison_table aligns every block", "[reports]") {
  const larder::RunResult r = larder::test::sample_run();
  const std::string table = larder::comparison_table(r);
  INFO(table);
  const auto blocks = blocks_of(table);
  REQUIRE(blocks.size() == 4);
  for (size_t b = 1; b < blocks.size(); ++b) {
    // After the block's title: header, rule and rows all have the same width.
    const auto& block = blocks[b];
    REQUIRE(block.size() > 3);
    for (size_t i = 2; i < block.size(); ++i) {
      INFO("block " << b << ", line " << i << ": " << block[i]);
      CHECK(columns(block[i]) == columns(block[1]));
    }
  }
  // Numbers are right-aligned under their policy's name.
  const auto& policies = blocks[1];
  const std::string& header = policies[1];
  CHECK(end_column(header, "newsvendor") ==
        end_column(line_starting(table, "profit"), "2,718 ± 122"));
  CHECK(end_column(header, "newsvendor") ==
        end_column(line_starting(table, "lost_units"), "78 ± 16"));
  CHECK(end_column(header, "cautious, v2") ==
        end_column(line_starting(table, "waste_units"), "127.2 ± 9.5"));
}

TEST_CASE("comparison_table in colour has the same text and widths", "[reports]") {
  const larder::RunResult r = larder::test::sample_run();
  const std::string plain = larder::comparison_table(r);
  const std::string colored = larder::comparison_table(r, true);
  CHECK(colored != plain);
  CHECK(strip_ansi(colored) == plain);
  // Green for a significant improvement, red for a significant deterioration.
  CHECK(colored.find("\x1b[32mbetter: lower waste_units (significant)") != std::string::npos);
  CHECK(colored.find("\x1b[31mworse: lower fill_rate (significant)") != std::string::npos);
}

TEST_CASE("comparison_table with one policy has no difference block", "[reports]") {
  larder::RunResult r = larder::test::sample_run();
  r.policies.resize(1);
  r.values.resize(1);
  const std::string table = larder::comparison_table(r);
  CHECK(blocks_of(table).size() == 2);
  CHECK(table.find("difference vs") == std::string::npos);
}
