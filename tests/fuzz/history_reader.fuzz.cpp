// Fuzz target: a sales history CSV → `read_history` (sim/history/history_reader.hpp).
// Contract checked on every input: no crash, hang or sanitizer report; bad input ends in
// InputError with at least one problem, each naming the file; every row handed to the sink obeys
// the format's rules (README, "History format"): no negative count, a sold-out row has no
// leftover, a sell-out time only on a sold-out row and within the day, hourly sales that sum to
// the day's sales. Crashes found become tests in tests/fuzz_regressions.test.cpp.

#include "sim/history/history_reader.hpp"

#include <cstddef>
#include <cstdint>
#include <numeric>
#include <sstream>
#include <string>

namespace {

void check_row(const larder::HistoryRow& r, const larder::HistoryColumns& columns) {
  if (r.delivered < 0 || r.sold < 0 || r.leftover < 0) __builtin_trap();
  if (r.sold_out && r.leftover > 0) __builtin_trap();
  if (r.sold_out_minute && (!r.sold_out || *r.sold_out_minute < 0 || *r.sold_out_minute >= 1440))
    __builtin_trap();
  if (static_cast<int>(r.hourly_sales.size()) != columns.hours) __builtin_trap();
  if (!r.hourly_sales.empty() &&
      std::accumulate(r.hourly_sales.begin(), r.hourly_sales.end(), 0LL) != r.sold)
    __builtin_trap();
}

}  // namespace

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  std::istringstream in(std::string(reinterpret_cast<const char*>(data), size));
  std::vector<larder::HistoryRow> rows;
  larder::HistoryColumns columns;
  try {
    columns = larder::read_history(in, "history.csv",
                                   [&](const larder::HistoryRow& r) { rows.push_back(r); });
  } catch (const larder::InputError& e) {
    if (e.diagnostics().ok()) __builtin_trap();
    for (const larder::Diagnostic& d : e.diagnostics().items())
      if (d.where.file != "history.csv" || d.message.empty()) __builtin_trap();
    return 0;
  }
  for (const larder::HistoryRow& r : rows) check_row(r, columns);
  return 0;
}
