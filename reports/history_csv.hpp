#pragma once
// Sales histories as CSV (README, "History format"), written row by row to a file that appears
// under its final name only when complete (`larder history`).

#include <filesystem>
#include <string>

#include "reports/atomic_file.hpp"
#include "sim/history/history_row.hpp"

namespace larder {

/// The header line (with its line end): date,store,item,delivered,sold,leftover,sold_out, then
/// sold_out_time and sales_HH when `columns` has them.
std::string history_csv_header(const HistoryColumns& columns);

/// Appends one row as a CSV line (ids quoted when needed, the sell-out time as HH:MM).
void append_history_csv_row(std::string& out, const HistoryRow& row, const HistoryColumns& columns);

/// Streams rows to `path`; nothing is visible there until `commit`.
class HistoryCsvWriter {
 public:
  HistoryCsvWriter(const std::filesystem::path& path, const HistoryColumns& columns);
  void add(const HistoryRow& row);
  /// Makes the file visible under its name.
  void commit() { file_.commit(); }
  long long rows() const { return rows_; }

 private:
  AtomicFileWriter file_;
  HistoryColumns columns_;
  std::string line_;
  long long rows_ = 0;
};

}  // namespace larder
