// Fuzz target: a drill's scorecard.json as `larder drill --summary` reads it
// (reports/class_summary.hpp, parse_class), given twice under two names as two trainees of one
// exercise. Contract checked on every input: no crash, hang or sanitizer report; no exception
// escapes (every problem is reported); either both copies are refused, each with one problem
// naming its file, or both are read: two trainee rows first, then the same reference rows, and
// the text and CSV views can be written. Crashes found become tests in
// tests/fuzz_regressions.test.cpp.

#include <cstddef>
#include <cstdint>
#include <string>
#include <vector>

#include "reports/class_summary.hpp"
#include "sim/scenario/diagnostics.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  const std::vector<larder::ScorecardSource> cards = {{"a/scorecard.json", text},
                                                      {"b/scorecard.json", text}};
  larder::Diagnostics diag;
  const larder::ClassSummary s = larder::parse_class(cards, diag);
  if (!diag.ok()) {
    if (diag.items().size() != 2 || !s.rows.empty()) __builtin_trap();
    if (diag.items()[0].where.file != "a/scorecard.json" ||
        diag.items()[1].where.file != "b/scorecard.json")
      __builtin_trap();
    for (const larder::Diagnostic& d : diag.items())
      if (d.message.empty() || d.message.find("[json.exception") != std::string::npos)
        __builtin_trap();
    (void)diag.format();
    return 0;
  }
  if (s.rows.size() < 2 || s.rows[0].source != "a/scorecard.json" ||
      s.rows[1].source != "b/scorecard.json" || s.rows[0].name != s.rows[1].name || !s.same_seed)
    __builtin_trap();
  for (size_t k = 2; k < s.rows.size(); ++k)
    if (s.rows[k].source != "a/scorecard.json") __builtin_trap();
  (void)larder::class_text(s);
  (void)larder::class_csv(s);
  return 0;
}
