#pragma once
// The strict, streaming reader of sales histories (README, "History format"): a CSV with one
// row per store-item-day the store was open. Every bad row is reported as
// `file:line:col: error: ...` (up to a limit, then a count) and nothing is guessed; good rows go
// to a sink one at a time, so memory holds only the per store-item state (the last date, line
// and leftover), never the rows.

#include <functional>
#include <istream>
#include <string>

#include "sim/history/history_row.hpp"
#include "sim/scenario/diagnostics.hpp"

namespace larder {

struct HistoryReadOptions {
  int max_reported = 20;  ///< problems reported in full; the rest are counted
  /// Problems after which the reader stops, saying so: a file that is not a history, or an
  /// endless pipe of bad lines, is not read to its end.
  long long stop_after = 100000;
};

/// Reads a history CSV from `in` (called `file` in messages), calling `sink` for every good row
/// in file order. Reads the whole input (or up to stop_after problems), then throws InputError
/// listing the bad rows (the first max_reported, then one line "... and N more problems") if
/// there were any. A bad header stops the reading at once (the rows cannot be interpreted
/// without it).
HistoryColumns read_history(std::istream& in, const std::string& file,
                            const std::function<void(const HistoryRow&)>& sink,
                            const HistoryReadOptions& options = {});

/// Same for a file path; a missing/unreadable file is an InputError.
HistoryColumns read_history_file(const std::string& path,
                                 const std::function<void(const HistoryRow&)>& sink,
                                 const HistoryReadOptions& options = {});

}  // namespace larder
