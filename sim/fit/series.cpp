#include "sim/fit/series.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <chrono>
#include <map>
#include <numeric>

#include "sim/scenario/diagnostics.hpp"

namespace larder {

SeriesBuilder::SeriesBuilder(std::string file) {
  data_.file = std::move(file);
}

int SeriesBuilder::index_of(std::vector<std::string>& ids, const std::string& id) {
  // Linear from the back: rows of one store or item usually come together.
  for (size_t k = ids.size(); k-- > 0;)
    if (ids[k] == id) return static_cast<int>(k);
  ids.push_back(id);
  return static_cast<int>(ids.size() - 1);
}

void SeriesBuilder::add(const HistoryRow& row) {
  Pending p;
  p.day.item = index_of(data_.items, row.item);
  p.day.store = index_of(data_.stores, row.store);
  p.day.sold = row.sold;
  p.day.delivered = row.delivered;
  p.day.sold_out = row.sold_out;
  if (row.sold_out && row.sold_out_minute) {
    p.day.sold_out_minute = static_cast<std::int16_t>(*row.sold_out_minute);
  }
  p.serial = day_number(row.date);
  pending_.push_back(p);
  if (hours_ < 0) hours_ = static_cast<int>(row.hourly_sales.size());
  for (int h = 0; h < hours_; ++h) {
    hourly_.push_back(h < static_cast<int>(row.hourly_sales.size()) ? row.hourly_sales[h] : 0);
  }
}

FitData SeriesBuilder::finish(const HistoryColumns& columns) {
  data_.columns = columns;
  if (hours_ >= 0 && columns.hours != hours_) {
    data_.columns.hours = 0;  // inconsistent: drop the hourly values rather than misread them
    hourly_.clear();
  }
  if (pending_.empty()) {
    Diagnostics d;
    d.error({data_.file, 0, 0}, "the history has no rows",
            "a history needs one row per store-item-day");
    throw InputError(std::move(d));
  }
  std::int64_t first = pending_[0].serial, last = first;
  for (const Pending& p : pending_)
    first = std::min(first, p.serial), last = std::max(last, p.serial);
  std::vector<size_t> order(pending_.size());
  std::iota(order.begin(), order.end(), size_t{0});
  std::sort(order.begin(), order.end(), [&](size_t x, size_t y) {
    const FitDay& a = pending_[x].day;
    const FitDay& b = pending_[y].day;
    if (a.item != b.item) return a.item < b.item;
    if (a.store != b.store) return a.store < b.store;
    return pending_[x].serial < pending_[y].serial;
  });
  using namespace std::chrono;
  const year_month_day ymd{sys_days{days{first}}};
  data_.first_date = {static_cast<int>(ymd.year()), static_cast<int>(unsigned(ymd.month())),
                      static_cast<int>(unsigned(ymd.day()))};
  data_.first_weekday = weekday_of_date(data_.first_date);
  data_.days = static_cast<int>(last - first + 1);
  const int hours = data_.columns.hours;
  Diagnostics diag;
  data_.rows.reserve(order.size());
  data_.hourly.reserve(hourly_.size());
  for (size_t k = 0; k < order.size(); ++k) {
    Pending p = pending_[order[k]];
    p.day.day = static_cast<std::int32_t>(p.serial - first);
    if (!data_.rows.empty()) {
      const FitDay& prev = data_.rows.back();
      if (prev.item == p.day.item && prev.store == p.day.store && prev.day == p.day.day &&
          diag.items().size() < 20) {
        diag.error(
            {data_.file, 0, 0},
            fmt::format("store '{}' item '{}' has two rows for {}", data_.stores[p.day.store],
                        data_.items[p.day.item], to_iso(add_days(data_.first_date, p.day.day))),
            "a history has one row per store, item and date");
        continue;
      }
    }
    data_.rows.push_back(p.day);
    if (hours > 0) {
      const auto from = hourly_.begin() + static_cast<std::ptrdiff_t>(order[k] * hours);
      data_.hourly.insert(data_.hourly.end(), from, from + hours);
    }
  }
  if (!diag.ok()) throw InputError(std::move(diag));
  pending_.clear();
  hourly_.clear();
  return std::move(data_);
}

}  // namespace larder
