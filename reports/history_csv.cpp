#include "reports/history_csv.hpp"

#include <fmt/format.h>

#include <iterator>

#include "reports/csv.hpp"

namespace larder {

std::string history_csv_header(const HistoryColumns& columns) {
  std::string out = "date,store,item,delivered,sold,leftover,sold_out";
  if (columns.has_sold_out_time) out += ",sold_out_time";
  for (int h = 0; h < columns.hours; ++h) {
    fmt::format_to(std::back_inserter(out), ",sales_{:02}", columns.first_hour + h);
  }
  out += '\n';
  return out;
}

void append_history_csv_row(std::string& out, const HistoryRow& row,
                            const HistoryColumns& columns) {
  auto it = std::back_inserter(out);
  fmt::format_to(it, "{:04}-{:02}-{:02},", row.date.year, row.date.month, row.date.day);
  out += csv_field(row.store);
  out += ',';
  out += csv_field(row.item);
  fmt::format_to(it, ",{},{},{},{}", row.delivered, row.sold, row.leftover, row.sold_out ? 1 : 0);
  if (columns.has_sold_out_time) {
    out += ',';
    if (row.sold_out_minute) {
      fmt::format_to(it, "{:02}:{:02}", *row.sold_out_minute / 60, *row.sold_out_minute % 60);
    }
  }
  for (int h = 0; h < columns.hours; ++h) {
    fmt::format_to(it, ",{}", row.hourly_sales[static_cast<size_t>(h)]);
  }
  out += '\n';
}

HistoryCsvWriter::HistoryCsvWriter(const std::filesystem::path& path, const HistoryColumns& columns)
    : file_(path), columns_(columns) {
  file_.write(history_csv_header(columns_));
}

void HistoryCsvWriter::add(const HistoryRow& row) {
  line_.clear();
  append_history_csv_row(line_, row, columns_);
  file_.write(line_);
  ++rows_;
}

}  // namespace larder
