// The drill prompt's line reader: orders, shortcuts and the messages for bad input.

#include "sim/drill/order_line.hpp"

#include <catch2/catch.hpp>

namespace larder {
namespace {

const std::vector<std::string> kItems{"rye", "croissant", "bun"};

OrderLine read(std::string_view line, std::vector<std::optional<int>> previous = {12, 30, 8}) {
  return parse_order_line(line, kItems, previous);
}

TEST_CASE("order lines: numbers per item and the repeat shortcuts", "[drill]") {
  auto o = read("14 28 6");
  REQUIRE(o.kind == OrderLine::Kind::orders);
  CHECK(o.quantities == std::vector<int>{14, 28, 6});
  CHECK(read(" 14, 28 ,6 ").quantities == std::vector<int>{14, 28, 6});
  CHECK(read("r").quantities == std::vector<int>{12, 30, 8});
  CHECK(read("=").quantities == std::vector<int>{12, 30, 8});
  CHECK(read("R").quantities == std::vector<int>{12, 30, 8});
  CHECK(read("0 = 9").quantities == std::vector<int>{0, 30, 9});
  CHECK(read("?").kind == OrderLine::Kind::help);
  CHECK(read("q").kind == OrderLine::Kind::quit);
}

TEST_CASE("order lines: bad input gets one clear line", "[drill]") {
  const auto error = [](std::string_view line, std::string_view part,
                        std::vector<std::optional<int>> previous = {12, 30, 8}) {
    const OrderLine o = read(line, previous);
    INFO(line << " -> " << o.message);
    CHECK(o.kind == OrderLine::Kind::error);
    CHECK(o.message.find(part) != std::string::npos);
    CHECK(o.message.find('\n') == std::string::npos);
  };
  error("abc", "'abc' is not a whole number");
  error("12 x 3", "'x' is not a whole number");
  error("12 -3 4", "-3: croissant cannot order fewer than 0 units");
  error("1 2 3 4", "4 values for 3 items");
  error("1 2", "2 values for 3 items");
  error("2.5 1 1", "'2.5' is not a whole number");
  error("", "nothing typed");
  error("1 2 9999999", "at most 100000 units of bun");
  error("r", "no earlier order of rye to repeat", {std::nullopt, 3, 4});
  CHECK(read("abc").message.find("rye croissant bun") != std::string::npos);
}

}  // namespace
}  // namespace larder
