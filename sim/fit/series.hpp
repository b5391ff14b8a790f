#pragma once
// A sales history in compact form for fitting: one small record per store-item-day (ids
// replaced by indices, dates by day numbers), sorted by item, store and day. Memory grows with
// the number of store-item-days, never with the text of the file.

#include <cstdint>
#include <string>
#include <vector>

#include "sim/history/history_row.hpp"

namespace larder {

/// One store-item-day.
struct FitDay {
  std::int32_t item = 0;
  std::int32_t store = 0;
  std::int32_t day = 0;  ///< days since FitData::first_date
  std::int32_t sold = 0;
  std::int32_t delivered = 0;
  bool sold_out = false;
  std::int16_t sold_out_minute = -1;  ///< minutes after midnight; -1 = not recorded
};

struct FitData {
  std::string file;                 ///< where the history came from, for messages
  std::vector<std::string> stores;  ///< in order of first appearance
  std::vector<std::string> items;   ///< in order of first appearance
  CivilDate first_date;
  int days = 0;  ///< from the first to the last date, inclusive
  HistoryColumns columns;
  std::vector<FitDay> rows;          ///< sorted by (item, store, day)
  std::vector<std::int32_t> hourly;  ///< rows.size() x columns.hours, in row order (may be empty)

  /// Weekday (0 = Monday) of day number `day`.
  int weekday(int day) const { return (first_weekday + day) % 7; }
  int first_weekday = 0;

  /// The hourly sales of row `r` (columns.hours values).
  const std::int32_t* hours_of(size_t r) const {
    return hourly.data() + r * static_cast<size_t>(columns.hours);
  }
};

/// Collects history rows (in any order) into FitData.
class SeriesBuilder {
 public:
  explicit SeriesBuilder(std::string file);
  void add(const HistoryRow& row);
  /// Sorts the rows; throws InputError when a store-item-date appears twice or there are no rows.
  /// `columns` is what the reader found in the header (its hours must match the rows').
  FitData finish(const HistoryColumns& columns);

 private:
  int index_of(std::vector<std::string>& ids, const std::string& id);
  struct Pending {
    FitDay day;
    std::int64_t serial = 0;  ///< days since 1970-01-01
  };
  FitData data_;
  std::vector<Pending> pending_;
  std::vector<std::int32_t> hourly_;
  int hours_ = -1;  ///< hourly values per row, from the first row
};

}  // namespace larder
