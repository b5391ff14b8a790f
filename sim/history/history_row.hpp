#pragma once
// One store-item-day of a sales history: what a store records (README, "History format").
// `larder history` writes these rows, `larder fit` reads them. True demand is never in a
// history: on a sold-out day it is only known to be at least `sold`.

#include <optional>
#include <string>
#include <vector>

#include "sim/scenario/iso_date.hpp"

namespace larder {

struct HistoryRow {
  CivilDate date;
  std::string store;
  std::string item;
  int delivered = 0;      ///< units delivered that morning
  int sold = 0;           ///< units sold that day, at any price
  int leftover = 0;       ///< sellable units on the shelf at close
  bool sold_out = false;  ///< the shelf emptied before close: demand >= sold (censored)
  /// Minutes after midnight of the last sale on a sold-out day (column `sold_out_time`, HH:MM);
  /// empty when the column is absent, the cell is blank or the item did not sell out.
  std::optional<int> sold_out_minute;
  /// Sales per opening hour (columns `sales_HH`, HH = the clock hour the hour starts, in header
  /// order, consecutive); empty when the history has no hourly columns.
  std::vector<int> hourly_sales;
};

/// What the header of a history file holds besides the required columns.
struct HistoryColumns {
  bool has_sold_out_time = false;
  int first_hour = 0;  ///< clock hour of the first `sales_HH` column
  int hours = 0;       ///< number of `sales_HH` columns (0 = none)
};

}  // namespace larder
