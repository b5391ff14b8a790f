// The parser of `replay` order files (see replay_file.hpp): split from the policy part so the
// fuzz target (tests/fuzz/replay_orders.fuzz.cpp) and tests can call it on text.

#include "policies/quantity/replay_file.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <chrono>
#include <map>
#include <tuple>
#include <unordered_map>

#include "sim/scenario/csv_fields.hpp"
#include "sim/scenario/iso_date.hpp"
#include "sim/scenario/line_reader.hpp"
#include "sim/scenario/params.hpp"

namespace larder {

namespace {

int days_between(const CivilDate& from, const CivilDate& to) {
  const auto ymd = [](const CivilDate& d) {
    return std::chrono::sys_days{std::chrono::year_month_day{
        std::chrono::year{d.year}, std::chrono::month{static_cast<unsigned>(d.month)},
        std::chrono::day{static_cast<unsigned>(d.day)}}};
  };
  return static_cast<int>((ymd(to) - ymd(from)).count());
}

/// The id closest to `id` (edit distance below 3), for "did you mean" hints.
std::string did_you_mean(const std::string& id, const std::unordered_map<std::string, int>& ids) {
  std::string best;
  int best_d = 3;
  for (const auto& [known, index] : ids) {
    const int d = edit_distance(id, known);
    if (d < best_d || (d == best_d && !best.empty() && known < best)) best_d = d, best = known;
  }
  return best.empty() ? std::string{} : fmt::format("did you mean '{}'?", best);
}

}  // namespace

std::optional<ReplayOrders> parse_replay_orders(std::istream& in, const std::string& name,
                                                const Scenario& sc, Diagnostics& diag) {
  // Bounded reading (issue 23): lines capped as the history's, the whole file at
  // kMaxReplayFileBytes, so a 1 GB line or /dev/zero is never held; rows are checked as they
  // are read, never all kept (a file of empty lines costs nothing).
  const auto at = [&](int line, int column) { return Location{name, line, column}; };
  LineReader reader(in, kMaxReplayFileBytes);
  bool too_long = false;
  std::string text_line;
  // The next line; false at the end, at an over-long line or at the size cap (reported).
  const auto next_line = [&] {
    if (!reader.next(text_line, too_long)) {
      if (reader.over_size()) {
        diag.final_error(
            at(reader.line_number() + 1, 1),
            fmt::format("the order file is larger than the limit of {} MiB (larder read no "
                        "further)",
                        kMaxReplayFileBytes >> 20));
      }
      return false;
    }
    if (too_long) {
      diag.final_error(
          at(reader.line_number(), 1),
          fmt::format("line is longer than {} bytes; is this a CSV file?", LineReader::kMaxLine),
          "columns: store, item, quantity and either day or date");
      return false;
    }
    return true;
  };
  if (!next_line()) {
    if (diag.ok()) {
      diag.error(at(1, 1), "expected a header such as store,item,day,quantity",
                 "columns: store, item, quantity and either day or date");
    }
    return std::nullopt;
  }
  if (text_line.find_first_not_of(" \t") == std::string::npos) {
    diag.error(at(1, 1), "expected a header such as store,item,day,quantity",
               "columns: store, item, quantity and either day or date");
    return std::nullopt;
  }

  // Header.
  enum Column { store_col, item_col, quantity_col, day_col, date_col, column_kinds };
  constexpr const char* kNames[column_kinds] = {"store", "item", "quantity", "day", "date"};
  std::array<int, column_kinds> col;
  col.fill(-1);
  bool ok = true;
  const std::vector<CsvField> header = split_fields(text_line);
  // A first line naming none of the columns is not a header with typos but another file (a
  // wrong path, or a file that is not larder's): nothing of it is repeated in the message,
  // which may be shown to people who cannot read the file.
  if (std::none_of(header.begin(), header.end(), [&](const CsvField& f) {
        return std::find(std::begin(kNames), std::end(kNames), f.text) != std::end(kNames);
      })) {
    diag.error(at(1, 1),
               "not an order file: the first line names none of the columns store, item, "
               "quantity, day, date",
               "is the path right? The order file's first line is a header such as "
               "store,item,day,quantity");
    return std::nullopt;
  }
  for (size_t c = 0; c < header.size(); ++c) {
    const auto known = std::find(std::begin(kNames), std::end(kNames), header[c].text);
    if (known == std::end(kNames)) {
      diag.error(at(1, header[c].column), fmt::format("unknown column '{}'", header[c].text),
                 "columns: store, item, quantity and either day or date");
      ok = false;
      continue;
    }
    const auto k = static_cast<size_t>(known - std::begin(kNames));
    if (col[k] >= 0) {
      diag.error(at(1, header[c].column), fmt::format("column '{}' is given twice", *known));
      ok = false;
    }
    col[k] = static_cast<int>(c);
  }
  std::string missing;
  for (const Column k : {store_col, item_col, quantity_col}) {
    if (col[k] < 0) missing += (missing.empty() ? "'" : ", '") + std::string(kNames[k]) + "'";
  }
  if (!missing.empty()) {
    diag.error(at(1, 1), fmt::format("the header has no column {}", missing),
               "columns: store, item, quantity and either day or date");
    ok = false;
  }
  if (col[day_col] >= 0 && col[date_col] >= 0) {
    diag.error(at(1, header[static_cast<size_t>(col[date_col])].column),
               "columns 'day' and 'date' are both given", "keep one of them");
    ok = false;
  } else if (col[day_col] < 0 && col[date_col] < 0) {
    diag.error(at(1, 1), "the header has no column 'day' or 'date'",
               "day: the scenario day on which the order is placed; date: its ISO date");
    ok = false;
  }
  std::optional<CivilDate> start;
  if (sc.horizon.start_date) start = parse_iso_date(*sc.horizon.start_date);
  if (col[date_col] >= 0 && col[day_col] < 0 && !start) {
    diag.error(at(1, header[static_cast<size_t>(col[date_col])].column),
               "column 'date' needs horizon.start_date in the scenario",
               "set horizon.start_date, or give the scenario day in a column 'day'");
    ok = false;
  }
  if (!ok) return std::nullopt;

  // Rows.
  std::unordered_map<std::string, int> store_index;
  std::unordered_map<std::string, int> item_index;
  for (size_t s = 0; s < sc.stores.size(); ++s) store_index[sc.stores[s].id] = static_cast<int>(s);
  for (size_t i = 0; i < sc.items.size(); ++i) item_index[sc.items[i].id] = static_cast<int>(i);
  const int lead = sc.logistics.lead_time_days;
  const int first_day = -lead;
  const int last_day = sc.horizon.days - 1;
  std::string header_text;
  for (const CsvField& f : header) header_text += (header_text.empty() ? "" : ",") + f.text;
  std::vector<std::vector<ReplayOrder>> orders(sc.stores.size());
  std::map<std::tuple<int, int, int>, int> first_line;  // (store, item, day) -> line
  while (next_line()) {
    const int line = reader.line_number();
    if (text_line.find_first_not_of(" \t") == std::string::npos) continue;  // blank line
    const std::vector<CsvField> f = split_fields(text_line);
    if (f.size() != header.size()) {
      if (const auto quote = unclosed_quote(text_line)) {
        diag.error(at(line, *quote),
                   "the quote opening this field is never closed (a quoted field ends with \" "
                   "on the same line)");
      } else {
        diag.error(at(line, 1), fmt::format("expected {} fields ({}), got {}", header.size(),
                                            header_text, f.size()));
      }
      ok = false;
      continue;
    }
    bool row_ok = true;
    const CsvField& store_f = f[static_cast<size_t>(col[store_col])];
    const auto s = store_index.find(store_f.text);
    if (s == store_index.end()) {
      diag.error(at(line, store_f.column), fmt::format("unknown store '{}'", store_f.text),
                 did_you_mean(store_f.text, store_index));
      row_ok = false;
    }
    const CsvField& item_f = f[static_cast<size_t>(col[item_col])];
    const auto it = item_index.find(item_f.text);
    if (it == item_index.end()) {
      diag.error(at(line, item_f.column), fmt::format("unknown item '{}'", item_f.text),
                 did_you_mean(item_f.text, item_index));
      row_ok = false;
    }
    std::optional<int> day;
    if (col[day_col] >= 0) {
      const CsvField& day_f = f[static_cast<size_t>(col[day_col])];
      const auto v = whole_number(day_f.text);
      if (!v) {
        diag.error(at(line, day_f.column),
                   fmt::format("day must be a whole number (got '{}')", day_f.text));
      } else if (*v < first_day || *v > last_day) {
        diag.error(at(line, day_f.column),
                   fmt::format("day must be in [{}, {}] (got {})", first_day, last_day, *v),
                   fmt::format("orders are placed from day {} (the opening orders, lead time {}) "
                               "to the last day of the horizon",
                               first_day, lead));
      } else {
        day = static_cast<int>(*v);
      }
    } else {
      const CsvField& date_f = f[static_cast<size_t>(col[date_col])];
      const auto d = parse_iso_date(date_f.text);
      if (!d) {
        diag.error(at(line, date_f.column),
                   fmt::format("date must be an ISO date YYYY-MM-DD (got '{}')", date_f.text));
      } else if (!is_real_date(*d)) {
        diag.error(at(line, date_f.column),
                   fmt::format("date is not a date in the calendar (got {})", date_f.text));
      } else {
        const int v = days_between(*start, *d);
        if (v < first_day || v > last_day) {
          diag.error(at(line, date_f.column),
                     fmt::format("date must be from {} to {} (got {})",
                                 to_iso(add_days(*start, first_day)),
                                 to_iso(add_days(*start, last_day)), date_f.text),
                     fmt::format("orders are placed from {} day(s) before horizon.start_date "
                                 "(the opening orders) to the last day of the horizon",
                                 lead));
        } else {
          day = v;
        }
      }
    }
    row_ok = row_ok && day.has_value();
    const CsvField& q_f = f[static_cast<size_t>(col[quantity_col])];
    const auto q = whole_number(q_f.text);
    if (!q || *q < 0 || *q > 1000000000) {
      diag.error(
          at(line, q_f.column),
          fmt::format("quantity must be a whole number in [0, 1000000000] (got '{}')", q_f.text));
      row_ok = false;
    }
    if (!row_ok) {
      ok = false;
      continue;
    }
    const auto [seen, fresh] = first_line.try_emplace({s->second, it->second, *day}, line);
    if (!fresh) {
      diag.error(at(line, 1),
                 fmt::format("a second order of item '{}' at store '{}' placed on day {} (the "
                             "first is on line {})",
                             item_f.text, store_f.text, *day, seen->second));
      ok = false;
      continue;
    }
    const int arrival = *day + lead;
    if (arrival < sc.horizon.days && !sc.is_open(s->second, arrival)) {
      diag.error(at(line, 1),
                 fmt::format("store '{}' is closed on day {}, when an order placed on day {} "
                             "would arrive (lead time {})",
                             store_f.text, arrival, *day, lead),
                 "remove the row, or check the lead time and the store's opening days");
      ok = false;
      continue;
    }
    if (arrival < sc.horizon.days &&
        !sc.logistics.delivery_weekdays[static_cast<size_t>(sc.weekday_of(arrival))]) {
      diag.error(at(line, 1),
                 fmt::format("day {} is not a delivery day (logistics.delivery_weekdays), when "
                             "an order placed on day {} would arrive (lead time {})",
                             arrival, *day, lead),
                 "remove the row, or check the lead time and the delivery weekdays");
      ok = false;
      continue;
    }
    orders[static_cast<size_t>(s->second)].push_back({*day, it->second, static_cast<int>(*q)});
  }
  if (!ok || !diag.ok()) return std::nullopt;
  for (auto& v : orders) std::sort(v.begin(), v.end());
  return orders;
}

}  // namespace larder
