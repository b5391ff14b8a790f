// Fuzz target: scenario text → `parse_scenario` (sim/scenario/load_scenario.hpp).
// Contract checked on every input: no crash, hang or sanitizer report; either a Scenario and no
// problem, or no Scenario and at least one problem; every problem names the file and points at
// a line of the text (or at no line). Crashes found become tests in
// tests/fuzz_regressions.test.cpp.

#include <cstddef>
#include <cstdint>
#include <string>

#include "sim/scenario/load_scenario.hpp"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  const std::string text(reinterpret_cast<const char*>(data), size);
  larder::Diagnostics diag;
  const auto scenario = larder::parse_scenario(text, "fuzz.yaml", diag);
  if (scenario.has_value() != diag.ok()) __builtin_trap();
  long long lines = 1;
  for (const char c : text) lines += c == '\n' ? 1 : 0;
  for (const larder::Diagnostic& d : diag.items()) {
    if (d.where.file != "fuzz.yaml" || d.where.line < 0 || d.where.line > lines + 1 ||
        d.message.empty())
      __builtin_trap();
  }
  (void)diag.format();
  return 0;
}
