// Diagnostics keep the first kMaxKept problems in full and count the rest (issue 23: a file of a
// million bad lines, or an endless pipe, must not make the report grow without bound); the
// reason a reader stopped is always shown. Expected texts written by hand.

#include "sim/scenario/diagnostics.hpp"

#include <fmt/format.h>

#include <catch2/catch.hpp>

namespace larder {
namespace {

TEST_CASE("diagnostics keep 100 problems, count the rest, and always say why reading stopped",
          "[scenario]") {
  Diagnostics diag;
  for (int line = 1; line <= 250; ++line) diag.error({"f.csv", line, 1}, "bad row");
  CHECK(diag.items().size() == 100);
  CHECK(diag.dropped() == 150);
  CHECK(!diag.ok());
  // Copied problems carry the count along (parse_scenario sorts and copies them).
  Diagnostics copy;
  for (const Diagnostic& d : diag.items()) copy.error(d.where, d.message, d.hint);
  copy.count_dropped(diag);
  CHECK(copy.dropped() == 150);
  CHECK(copy.format() == diag.format());
  diag.final_error({"f.csv", 251, 1}, "larger than the limit");
  const std::string text = diag.format();
  CHECK(text.find("f.csv:100:1: error: bad row\n"
                  "f.csv: error: ... and 150 more problems\n"
                  "f.csv:251:1: error: larger than the limit\n") != std::string::npos);
  CHECK(text.find("f.csv:101:1:") == std::string::npos);
  CHECK(text.starts_with("f.csv:1:1: error: bad row\n"));

  // Below the limit nothing changes: every problem, no count line.
  Diagnostics few;
  few.error({"g.yaml", 2, 3}, "one");
  few.final_error({"g.yaml", 0, 0}, "stopped");
  CHECK(few.format() == "g.yaml:2:3: error: one\ng.yaml: error: stopped\n");
}

}  // namespace
}  // namespace larder
