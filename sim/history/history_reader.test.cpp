// The history reader against hand-written files: every rule of README's "History format" is
// rejected with its line and column (the expected positions are counted by hand from the text),
// the error limit, tolerated CSV forms (quotes, CRLF, byte order mark, blank lines), and binary
// garbage, which must end in an error, not a crash or a hang.

#include "sim/history/history_reader.hpp"

#include <fmt/format.h>

#include <catch2/catch.hpp>
#include <random>
#include <sstream>

namespace larder {
namespace {

struct Read {
  std::vector<HistoryRow> rows;
  HistoryColumns columns;
  std::string error;  ///< empty when the file was accepted
};

Read read_text(const std::string& text, int max_reported = 20) {
  Read r;
  std::istringstream in(text);
  try {
    r.columns = read_history(in, "h.csv", [&](const HistoryRow& row) { r.rows.push_back(row); },
                             {max_reported});
  } catch (const InputError& e) {
    r.error = e.what();
  }
  return r;
}

const std::string kHeader = "date,store,item,delivered,sold,leftover,sold_out\n";

/// `text` is rejected with a message that contains every one of `parts`.
void rejected(const std::string& text, std::initializer_list<std::string> parts) {
  const Read r = read_text(text);
  INFO(text);
  INFO(r.error);
  REQUIRE(!r.error.empty());
  for (const std::string& p : parts) CHECK(r.error.find(p) != std::string::npos);
}

TEST_CASE("history reader: a good file gives its rows in file order", "[history]") {
  const Read r = read_text(
      "store,date,item,sold,delivered,leftover,sold_out,sold_out_time\n"
      "north,2027-03-01,bun,10,12,2,0,\n"
      "north,2027-03-01,pie,5,5,0,1,17:45\n"
      "north,2027-03-02,bun,12,10,0,1,\n"  // 12 <= 10 + 2 left yesterday
      "south,2027-03-02,bun,0,0,0,1,08:00\n");
  REQUIRE(r.error.empty());
  REQUIRE(r.rows.size() == 4);
  CHECK(r.columns.has_sold_out_time);
  CHECK(r.columns.hours == 0);
  const HistoryRow& a = r.rows[0];
  CHECK(a.date == CivilDate{2027, 3, 1});
  CHECK(a.store == "north");
  CHECK(a.item == "bun");
  CHECK(a.delivered == 12);
  CHECK(a.sold == 10);
  CHECK(a.leftover == 2);
  CHECK(!a.sold_out);
  CHECK(!a.sold_out_minute);
  CHECK(r.rows[1].sold_out);
  CHECK(r.rows[1].sold_out_minute == 17 * 60 + 45);
  CHECK(r.rows[2].sold == 12);
  CHECK(!r.rows[2].sold_out_minute);  // blank: not recorded
  CHECK(r.rows[3].store == "south");
  CHECK(r.rows[3].sold_out_minute == 8 * 60);
}

TEST_CASE("history reader: hourly sales columns", "[history]") {
  const Read r = read_text(
      "date,store,item,delivered,sold,leftover,sold_out,sales_08,sales_09,sales_10\n"
      "2027-03-01,s,bun,10,6,4,0,1,2,3\n");
  REQUIRE(r.error.empty());
  CHECK(r.columns.first_hour == 8);
  CHECK(r.columns.hours == 3);
  REQUIRE(r.rows.size() == 1);
  CHECK(r.rows[0].hourly_sales == std::vector<int>{1, 2, 3});
  rejected(
      "date,store,item,delivered,sold,leftover,sold_out,sales_08,sales_09,sales_10\n"
      "2027-03-01,s,bun,10,7,3,0,1,2,3\n",
      {"h.csv:2:27: error: the hourly sales add up to 6 but sold is 7"});
  rejected(kHeader.substr(0, kHeader.size() - 1) + ",sales_08,sales_10\n",
           {"h.csv:1:59: error: hourly sales columns must be consecutive hours in order: expected "
            "sales_09 after sales_08 (got sales_10)"});
  rejected(kHeader.substr(0, kHeader.size() - 1) + ",sales_8\n",
           {"h.csv:1:50: error: hourly sales column 'sales_8' must be sales_HH"});
  rejected(kHeader.substr(0, kHeader.size() - 1) + ",sales_24\n", {"h.csv:1:50: error: hourly"});
  rejected(
      "date,store,item,delivered,sold,leftover,sold_out,sales_08\n"
      "2027-03-01,s,bun,10,1,9,0,x\n",
      {"h.csv:2:27: error: sales_08 must be a whole number (got 'x')"});
}

TEST_CASE("history reader: header problems", "[history]") {
  rejected("date,store,item,delivered,sold,leftover\n",
           {"h.csv:1:1: error: the header has no column 'sold_out'"});
  rejected("date,item,delivered,sold,leftover\n",
           {"h.csv:1:1: error: the header has no column 'store', 'sold_out'"});
  rejected("date,store,item,delivered,sold,leftover,sold_out,demand\n",
           {"h.csv:1:50: error: unknown column 'demand'"});
  rejected("date,store,item,delivered,sold,leftover,sold_out,sold\n",
           {"h.csv:1:50: error: column 'sold' is given twice (first as field 5, at 1:27)"});
  // An unclosed quote is named as such, not as a count of fields (issue 23).
  rejected(kHeader + "2027-03-01,\"north,bun,10,12,2,0\n",
           {"h.csv:2:12: error: the quote opening this field is never closed"});
  rejected("date,store,item,delivered,sold,leftover,soldout\n",
           {"h.csv:1:41: error: unknown column 'soldout'", "hint: did you mean 'sold_out'?"});
}

TEST_CASE("history reader: an empty file", "[history]") {
  rejected("", {"h.csv:1:1: error: the history is empty: expected a header line"});
  rejected("\n  \r\n", {"h.csv:1:1: error: the history is empty"});
  // A header alone is a history without rows: accepted, nothing to sink.
  const Read r = read_text(kHeader);
  CHECK(r.error.empty());
  CHECK(r.rows.empty());
}

TEST_CASE("history reader: bad dates", "[history]") {
  rejected(kHeader + "2027-3-01,s,bun,1,1,0,1\n",
           {"h.csv:2:1: error: date must be an ISO date YYYY-MM-DD (got '2027-3-01')"});
  rejected(kHeader + "01/03/2027,s,bun,1,1,0,1\n", {"h.csv:2:1: error: date must be an ISO"});
  rejected(kHeader + "2027-02-29,s,bun,1,1,0,1\n",
           {"h.csv:2:1: error: date 2027-02-29 is not a date in the calendar"});
  rejected(kHeader + "2027-04-31,s,bun,1,1,0,1\n", {"h.csv:2:1: error: date 2027-04-31 is not"});
  CHECK(read_text(kHeader + "2028-02-29,s,bun,1,1,0,1\n").error.empty());  // a leap year
}

TEST_CASE("history reader: numbers", "[history]") {
  rejected(kHeader + "2027-03-01,s,bun,1.5,1,0,1\n",
           {"h.csv:2:18: error: delivered must be a whole number (got '1.5')"});
  rejected(kHeader + "2027-03-01,s,bun,4,,0,1\n",
           {"h.csv:2:20: error: sold must be a whole number (got '')"});
  rejected(kHeader + "2027-03-01,s,bun,4,2,-2,0\n",
           {"h.csv:2:22: error: leftover must be >= 0 (got -2)"});
  rejected(kHeader + "2027-03-01,s,bun,4,2,99999999999,0\n",
           {"h.csv:2:22: error: leftover must be at most 1000000000"});
  rejected(kHeader + "2027-03-01,s,bun,4,2,2,yes\n",
           {"h.csv:2:24: error: sold_out must be 0 or 1 (got 'yes')"});
  rejected(kHeader + "2027-03-01,s,bun,4,2,2\n",
           {"h.csv:2:1: error: expected 7 fields (date,store,item,delivered,sold,leftover,"
            "sold_out), got 6"});
  rejected(kHeader + "2027-03-01,,bun,4,2,2,0\n", {"h.csv:2:12: error: store is empty"});
}

TEST_CASE("history reader: sold_out and sold_out_time", "[history]") {
  rejected(kHeader + "2027-03-01,s,bun,4,2,2,1\n",
           {"h.csv:2:24: error: sold_out is 1 but leftover is 2"});
  const std::string h = "date,store,item,delivered,sold,leftover,sold_out,sold_out_time\n";
  rejected(h + "2027-03-01,s,bun,4,2,2,0,13:10\n",
           {"h.csv:2:26: error: sold_out_time 13:10 is given but sold_out is 0"});
  rejected(h + "2027-03-01,s,bun,4,4,0,1,7pm\n",
           {"h.csv:2:26: error: sold_out_time must be a time HH:MM (got '7pm')"});
  rejected(h + "2027-03-01,s,bun,4,4,0,1,12:60\n", {"h.csv:2:26: error: sold_out_time must be"});
  rejected(h + "2027-03-01,s,bun,4,4,0,1,24:01\n", {"h.csv:2:26: error: sold_out_time must be"});
  CHECK(read_text(h + "2027-03-01,s,bun,4,4,0,1,24:00\n").rows.size() == 1);
}

TEST_CASE("history reader: sales cannot exceed the stock available", "[history]") {
  // Stock available = delivered + the previous row's leftover of the store-item.
  const std::string two_days = kHeader + "2027-03-01,s,bun,10,7,3,0\n";
  CHECK(read_text(two_days + "2027-03-02,s,bun,5,8,0,1\n").error.empty());  // 8 = 5 + 3
  rejected(two_days + "2027-03-02,s,bun,5,9,0,1\n",
           {"h.csv:3:20: error: sold 9 is more than the stock available: delivered 5 plus "
            "leftover 3 of the previous row (line 2)"});
  // Another store-item in between does not count; the first row of a store-item is not
  // checked (its opening stock is unknown).
  rejected(two_days + "2027-03-01,t,bun,0,4,0,1\n2027-03-02,s,bun,5,9,0,1\n",
           {"h.csv:4:20: error: sold 9 is more than"});
  CHECK(read_text(kHeader + "2027-03-01,s,bun,0,4,0,1\n").error.empty());
}

TEST_CASE("history reader: duplicate rows and dates out of order", "[history]") {
  const std::string first = kHeader + "2027-03-02,s,bun,10,7,3,0\n2027-03-02,s,pie,1,1,0,1\n";
  rejected(first + "2027-03-02,s,bun,10,7,3,0\n",
           {"h.csv:4:1: error: a second row for store 's', item 'bun' on 2027-03-02 (the first "
            "is line 2)"});
  rejected(first + "2027-03-01,s,bun,10,7,3,0\n",
           {"h.csv:4:1: error: date 2027-03-01 comes before the date of the previous row of "
            "store 's', item 'bun' (line 2)"});
  // Gaps (closed days) are fine, and store-items may interleave.
  CHECK(read_text(first + "2027-03-05,s,bun,10,7,3,0\n2027-03-03,s,pie,1,1,0,1\n").error.empty());
}

TEST_CASE("history reader: every bad row is reported, up to the limit, then counted", "[history]") {
  std::string text = kHeader;
  for (int d = 1; d <= 9; ++d) text += fmt::format("2027-03-0{},s,bun,x,1,0,1\n", d);
  const Read all = read_text(text, 20);
  for (int line = 2; line <= 10; ++line) {
    CHECK(all.error.find(fmt::format("h.csv:{}:18: error: delivered", line)) != std::string::npos);
  }
  CHECK(all.error.find("more problems") == std::string::npos);
  const Read few = read_text(text, 3);
  CHECK(few.error.find("h.csv:4:18:") != std::string::npos);
  CHECK(few.error.find("h.csv:5:18:") == std::string::npos);
  CHECK(few.error.find("h.csv: error: ... and 6 more problems\n") != std::string::npos);
  CHECK(few.rows.empty());
  // Good rows still reach the sink in order before the error is thrown.
  const Read mixed = read_text(kHeader + "2027-03-01,s,bun,2,1,1,0\n2027-03-02,s,bun,x,1,0,1\n" +
                               "2027-03-03,s,bun,2,1,1,0\n");
  CHECK(!mixed.error.empty());
  CHECK(mixed.rows.size() == 2);
}

TEST_CASE("history reader: quoted fields, CRLF, a byte order mark and blank lines", "[history]") {
  const Read r = read_text(
      "\xEF\xBB\xBF"
      "date,store,item,delivered,sold,leftover,sold_out\r\n"
      "2027-03-01,\"north, main street\",\"rye \"\"dark\"\"\",3,3,0,1\r\n"
      "\r\n"
      " 2027-03-02 , \"north, main street\" , \"rye \"\"dark\"\"\" , 4 , 2 , 2 , 0 \r\n");
  REQUIRE(r.error.empty());
  REQUIRE(r.rows.size() == 2);
  CHECK(r.rows[0].store == "north, main street");
  CHECK(r.rows[0].item == "rye \"dark\"");
  CHECK(r.rows[1].date == CivilDate{2027, 3, 2});
  CHECK(r.rows[1].leftover == 2);
}

TEST_CASE("history reader: binary garbage ends in an error, never a crash or a hang", "[history]") {
  std::mt19937 gen(20270301);  // fixed seed
  std::uniform_int_distribution<int> byte(0, 255);
  for (int trial = 0; trial < 50; ++trial) {
    std::string junk(static_cast<size_t>(1 + trial * 997), '\0');
    for (char& c : junk) c = static_cast<char>(byte(gen));
    const Read r = read_text(junk);
    CHECK(!r.error.empty());
    CHECK(r.rows.empty());
  }
  // A good header followed by garbage: every garbage line is an error, none is a row.
  std::string tail = kHeader;
  for (int k = 0; k < 2000; ++k) tail += static_cast<char>(byte(gen));
  const Read r = read_text(tail);
  CHECK(!r.error.empty());
  CHECK(r.rows.empty());
  // A line with no end longer than the limit is cut and reported, not held.
  const Read longline = read_text(kHeader + std::string(3u << 20, 'x'));
  CHECK(longline.error.find("h.csv:2:1: error: line is longer than") != std::string::npos);
}

TEST_CASE("history reader: a missing file is an input error", "[history]") {
  CHECK_THROWS_AS(read_history_file("/nonexistent/h.csv", [](const HistoryRow&) {}), InputError);
  CHECK_THROWS_WITH(read_history_file("/nonexistent/h.csv", [](const HistoryRow&) {}),
                    Catch::Contains("/nonexistent/h.csv: error: no such history file"));
}

}  // namespace
}  // namespace larder
