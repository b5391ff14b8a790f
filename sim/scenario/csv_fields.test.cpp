// CSV fields and lines for the strict readers, against RFC 4180's quoting rules (common
// practice: a quoted field may hold commas, "" is one quote) and cases counted by hand.

#include "sim/scenario/csv_fields.hpp"

#include <catch2/catch.hpp>
#include <sstream>

#include "sim/scenario/line_reader.hpp"

namespace larder {
namespace {

std::vector<std::string> texts(const std::vector<CsvField>& f) {
  std::vector<std::string> out;
  for (const CsvField& x : f) out.push_back(x.text);
  return out;
}

std::vector<int> columns(const std::vector<CsvField>& f) {
  std::vector<int> out;
  for (const CsvField& x : f) out.push_back(x.column);
  return out;
}

using Texts = std::vector<std::string>;

TEST_CASE("split_fields: commas, blanks, quotes and columns", "[history][csv]") {
  CHECK(texts(split_fields("a,b,c")) == Texts{"a", "b", "c"});
  CHECK(columns(split_fields("a,bb,c")) == std::vector<int>{1, 3, 6});
  CHECK(texts(split_fields("")) == Texts{""});
  CHECK(texts(split_fields("a,,")) == Texts{"a", "", ""});
  CHECK(texts(split_fields(" a \t, b ")) == Texts{"a", "b"});
  CHECK(texts(split_fields("\"a,b\",c")) == Texts{"a,b", "c"});
  CHECK(texts(split_fields("\"say \"\"hi\"\"\",x")) == Texts{"say \"hi\"", "x"});
  CHECK(texts(split_fields(" \"q\" ,x")) == Texts{"q", "x"});
  CHECK(columns(split_fields("x,\"a,b\",c")) == std::vector<int>{1, 3, 9});
  // Text after a closing quote is kept, not dropped; an unclosed quote runs to the line end.
  CHECK(texts(split_fields("\"a\"b,c")) == Texts{"ab", "c"});
  CHECK(texts(split_fields("\"a,b")) == Texts{"a,b"});
  // The reusing form gives the same fields.
  std::vector<CsvField> reuse = split_fields("1,2,3,4");
  split_fields("x,y", reuse);
  CHECK(texts(reuse) == Texts{"x", "y"});
}

TEST_CASE("whole_number: digits with an optional sign only", "[history][csv]") {
  CHECK(whole_number("42") == 42);
  CHECK(whole_number("+7") == 7);
  CHECK(whole_number("-3") == -3);
  CHECK(whole_number("0") == 0);
  for (const char* bad : {"", "+", "-", "1.0", "1e3", " 1", "1 ", "0x10", "+-1", "--1", "one",
                          "99999999999999999999"}) {
    INFO(bad);
    CHECK(!whole_number(bad));
  }
}

TEST_CASE("printable: control and high bytes escaped, long text cut", "[history][csv]") {
  CHECK(printable("abc") == "abc");
  CHECK(printable(std::string("a\0b\xff", 4)) == "a\\x00b\\xff");
  CHECK(printable(std::string(50, 'x'), 10) == std::string(10, 'x') + "...");
}

TEST_CASE("LineReader: line ends, a byte order mark and over-long lines", "[history][csv]") {
  std::string text = "\xEF\xBB\xBFh1\r\nrow\n\nlast";
  text += "\n" + std::string(LineReader::kMaxLine + 10, 'z') + "\nafter";
  std::istringstream in(text);
  LineReader r(in);
  std::string line;
  bool too_long = false;
  std::vector<std::string> got;
  std::vector<int> numbers;
  while (r.next(line, too_long)) {
    got.push_back(too_long ? "<long:" + std::to_string(line.size()) + ">" : line);
    numbers.push_back(r.line_number());
  }
  CHECK(got == Texts{"h1", "row", "", "last", "<long:1048576>", "after"});
  CHECK(numbers == std::vector<int>{1, 2, 3, 4, 5, 6});
  std::istringstream empty("");
  LineReader e(empty);
  CHECK(!e.next(line, too_long));
}

}  // namespace
}  // namespace larder
