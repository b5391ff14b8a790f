// The history CSV writer: rows written and read back by the strict reader are the same rows
// (ids with commas and quotes, sell-out times, hourly sales), and the file appears under its
// name only when committed.

#include "reports/history_csv.hpp"

#include <unistd.h>

#include <catch2/catch.hpp>
#include <fstream>
#include <sstream>

#include "sim/history/history_reader.hpp"

namespace larder {
namespace {

namespace fs = std::filesystem;

std::vector<HistoryRow> sample_rows(bool hourly) {
  std::vector<HistoryRow> rows;
  HistoryRow a;
  a.date = {2027, 12, 31};
  a.store = "north, \"main\"";
  a.item = "bun";
  a.delivered = 12;
  a.sold = 12;
  a.leftover = 0;
  a.sold_out = true;
  a.sold_out_minute = 17 * 60 + 5;
  if (hourly) a.hourly_sales = {5, 0, 7};
  rows.push_back(a);
  HistoryRow b = a;
  b.date = {2028, 1, 1};
  b.delivered = 3;
  b.sold = 2;
  b.leftover = 1;
  b.sold_out = false;
  b.sold_out_minute.reset();
  if (hourly) b.hourly_sales = {0, 2, 0};
  rows.push_back(b);
  HistoryRow c = b;
  c.item = "tart";
  c.sold_out = true;
  c.leftover = 0;
  c.sold = 3;
  if (hourly) c.hourly_sales = {1, 1, 1};
  rows.push_back(c);  // sold out, time not recorded
  return rows;
}

TEST_CASE("history CSV: written rows read back unchanged", "[history]") {
  for (const bool hourly : {false, true}) {
    HistoryColumns columns;
    columns.has_sold_out_time = true;
    if (hourly) columns.first_hour = 21, columns.hours = 3;
    const std::vector<HistoryRow> rows = sample_rows(hourly);
    std::string text = history_csv_header(columns);
    for (const HistoryRow& r : rows) append_history_csv_row(text, r, columns);
    CHECK(text.rfind(hourly ? "date,store,item,delivered,sold,leftover,sold_out,sold_out_time,"
                              "sales_21,sales_22,sales_23\n"
                            : "date,store,item,delivered,sold,leftover,sold_out,sold_out_time\n",
                     0) == 0);
    CHECK(text.find("2027-12-31,\"north, \"\"main\"\"\",bun,12,12,0,1,17:05") != std::string::npos);
    std::istringstream in(text);
    std::vector<HistoryRow> back;
    const HistoryColumns c =
        read_history(in, "t.csv", [&](const HistoryRow& r) { back.push_back(r); });
    CHECK(c.has_sold_out_time);
    CHECK(c.first_hour == columns.first_hour);
    CHECK(c.hours == columns.hours);
    REQUIRE(back.size() == rows.size());
    for (size_t k = 0; k < rows.size(); ++k) {
      CHECK(back[k].date == rows[k].date);
      CHECK(back[k].store == rows[k].store);
      CHECK(back[k].item == rows[k].item);
      CHECK(back[k].delivered == rows[k].delivered);
      CHECK(back[k].sold == rows[k].sold);
      CHECK(back[k].leftover == rows[k].leftover);
      CHECK(back[k].sold_out == rows[k].sold_out);
      CHECK(back[k].sold_out_minute == rows[k].sold_out_minute);
      CHECK(back[k].hourly_sales == rows[k].hourly_sales);
    }
  }
}

TEST_CASE("history CSV: the file appears only when committed", "[history]") {
  const fs::path dir =
      fs::temp_directory_path() / ("larder-history-csv-" + std::to_string(::getpid()));
  fs::remove_all(dir);
  fs::create_directories(dir);
  const fs::path file = dir / "h.csv";
  {
    HistoryCsvWriter w(file, HistoryColumns{});
    for (const HistoryRow& r : sample_rows(false)) w.add(r);
    CHECK(!fs::exists(file));
    CHECK(w.rows() == 3);
  }  // destroyed without commit: nothing left behind
  CHECK(fs::is_empty(dir));
  {
    HistoryCsvWriter w(file, HistoryColumns{});
    for (const HistoryRow& r : sample_rows(false)) w.add(r);
    w.commit();
  }
  CHECK(fs::exists(file));
  std::ifstream in(file);
  std::string header;
  std::getline(in, header);
  CHECK(header == "date,store,item,delivered,sold,leftover,sold_out");
  fs::remove_all(dir);
}

}  // namespace
}  // namespace larder
