#include "sim/scenario/yaml_guard.hpp"

#include <catch2/catch.hpp>
#include <fstream>
#include <sstream>

namespace larder {
namespace {

std::string guard_text(const std::string& text, YamlLimits limits = {}) {
  Diagnostics d;
  if (check_yaml_text(text, "t.yaml", d, limits)) return "";
  return d.format();
}

TEST_CASE("the text guard passes ordinary scenarios", "[hostile][scenario]") {
  for (const char* name : {"scenarios/demo.yaml"}) {
    std::ifstream in(std::string(LARDER_SOURCE_DIR) + "/" + name);
    REQUIRE(in);
    std::stringstream s;
    s << in.rdbuf();
    CHECK(guard_text(s.str()).empty());
  }
  // Brackets inside quotes, comments, plain scalars and block scalars are not nesting.
  const std::string tricky =
      "a: \"[[[[[[\"\nb: '{{{{ '' [[['\nc: x[1]   # [[[[[[[\nd: |\n  [[[[[[[[\n  {{{{{{\ne: 1\n";
  CHECK(guard_text(tricky, {.max_depth = 2}).empty());
  CHECK(guard_text("é: ✓ 🍞\n").empty());  // UTF-8 text
}

TEST_CASE("the text guard measures nesting depth", "[hostile][scenario]") {
  // Worked by hand: root map (1) > a's map (2) > b's list (3) > the flow list (4).
  const std::string four = "a:\n  b:\n    - [1, 2]\n";
  CHECK(guard_text(four, {.max_depth = 4}).empty());
  CHECK(guard_text(four, {.max_depth = 3}) ==
        "t.yaml:3:7: error: the YAML nests deeper than 3 levels\n"
        "  hint: a scenario needs about 6 levels; is this the right file?\n");
  CHECK(guard_text("- - - x\n", {.max_depth = 3}).empty());
  CHECK(!guard_text("- - - - x\n", {.max_depth = 3}).empty());
  CHECK(!guard_text("x: {a: {b: {c: 1}}}\n", {.max_depth = 3}).empty());
}

TEST_CASE("the text guard refuses bytes that are not UTF-8 text, at their place",
          "[hostile][scenario]") {
  CHECK(guard_text("a: 1\nb: \x01\n")
            .find("t.yaml:2:4: error: the file is not YAML text: byte "
                  "0x01 is a control character") == 0);
  CHECK(guard_text("a: \xC3\n")
            .find("t.yaml:1:4: error: the file is not YAML text: byte 0xC3 "
                  "is not part of valid UTF-8") == 0);
  CHECK(!guard_text("a: \xC0\xAF\n").empty());      // overlong '/' (RFC 3629)
  CHECK(!guard_text("a: \xED\xA0\x80\n").empty());  // a UTF-16 surrogate
  CHECK(guard_text("a: 1\n", {.max_bytes = 4}).find("too large for a scenario: 5 bytes") !=
        std::string::npos);
}

TEST_CASE("expanded node counts follow aliases without expanding them", "[hostile][scenario]") {
  // Worked by hand: root 1 + key a 1 + [1, 2] 3 + key b 1 + [*x, *x] (1 + 3 + 3) = 13.
  CHECK(expanded_node_count(YAML::Load("a: &x [1, 2]\nb: [*x, *x]\n"), 100) == 13);
  // Each level multiplies by 3: a0 = 4 nodes, a_k = 1 + 3 a_{k-1}: a1 13, a2 40, a3 121.
  const YAML::Node bomb = YAML::Load(
      "- &a0 [x, x, x]\n- &a1 [*a0, *a0, *a0]\n- &a2 [*a1, *a1, *a1]\n"
      "- &a3 [*a2, *a2, *a2]\n");
  CHECK(expanded_node_count(bomb, 1000) == 1 + 4 + 13 + 40 + 121);
  CHECK(expanded_node_count(bomb, 100) == 101);  // saturates
  Diagnostics d;
  CHECK(!check_yaml_expansion(bomb, "t.yaml", d, {.max_expanded_nodes = 100}));
  CHECK(d.format().find("t.yaml:1:1: error: the YAML expands to more than 100 nodes") == 0);
}

}  // namespace
}  // namespace larder
