#include "sim/history/history_reader.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <filesystem>
#include <fstream>
#include <optional>
#include <string_view>
#include <unordered_map>

#include "sim/scenario/bounded_read.hpp"
#include "sim/scenario/csv_fields.hpp"
#include "sim/scenario/line_reader.hpp"
#include "sim/scenario/params.hpp"

namespace larder {

namespace {

constexpr long long kMaxUnits = 1000000000;

enum Column {
  date_col,
  store_col,
  item_col,
  delivered_col,
  sold_col,
  leftover_col,
  sold_out_col,
  sold_out_time_col,
  column_kinds
};
constexpr std::array<std::string_view, column_kinds> kNames = {
    "date", "store", "item", "delivered", "sold", "leftover", "sold_out", "sold_out_time"};
constexpr int kRequired = sold_out_time_col;  // columns before this one are required

const char* kColumnsHint =
    "columns: date,store,item,delivered,sold,leftover,sold_out (any order), optionally "
    "sold_out_time (HH:MM) and hourly sales sales_HH (HH = the clock hour, consecutive)";

/// `HH:MM` (00:00 to 23:59, or 24:00) as minutes after midnight.
std::optional<int> clock_minutes(std::string_view t) {
  if (t.size() != 5 || t[2] != ':') return std::nullopt;
  for (size_t k : {0u, 1u, 3u, 4u}) {
    if (t[k] < '0' || t[k] > '9') return std::nullopt;
  }
  const int h = (t[0] - '0') * 10 + (t[1] - '0');
  const int m = (t[3] - '0') * 10 + (t[4] - '0');
  if (m > 59 || h > 24 || (h == 24 && m != 0)) return std::nullopt;
  return h * 60 + m;
}

/// What the reader remembers of a store-item: its last row.
struct LastRow {
  long day = 0;
  int line = 0;
  int leftover = -1;  ///< -1 when that row's leftover was not a valid number
};

/// Problems of one input: the first `max` in full, the others counted.
class Problems {
 public:
  Problems(std::string file, int max) : file_(std::move(file)), max_(max) {}
  void add(int line, int column, std::string message, std::string hint = {}) {
    if (count_++ < max_) diag_.error({file_, line, column}, std::move(message), std::move(hint));
  }
  bool any() const { return count_ > 0; }
  long long count() const { return count_; }
  /// The reader gave up after `line` (too many problems: not a history, or an endless pipe).
  void stop(int line) { stopped_after_ = line; }
  [[noreturn]] void raise() {
    if (count_ > max_) {
      diag_.error({file_, 0, 0},
                  stopped_after_ > 0
                      ? fmt::format("... and {} more problems; larder read no further than line "
                                    "{}",
                                    count_ - max_, stopped_after_)
                      : fmt::format("... and {} more problems", count_ - max_));
    }
    throw InputError(std::move(diag_));
  }

 private:
  std::string file_;
  int max_;
  long long count_ = 0;
  int stopped_after_ = 0;
  Diagnostics diag_;
};

/// The header's columns: col[kind] is the field index or -1; hour_fields the sales_HH fields.
struct Header {
  std::array<int, column_kinds> col{};
  std::vector<int> hour_fields;
  HistoryColumns columns;
  size_t fields = 0;
  std::string text;  ///< the column names, for "expected N fields (...)"
};

std::optional<int> sales_hour(std::string_view name) {
  if (name.size() != 8 || name.substr(0, 6) != "sales_") return std::nullopt;
  if (name[6] < '0' || name[6] > '9' || name[7] < '0' || name[7] > '9') return std::nullopt;
  const int h = (name[6] - '0') * 10 + (name[7] - '0');
  return h <= 23 ? std::optional<int>(h) : std::nullopt;
}

std::string closest_name(std::string_view name) {
  std::string best;
  int best_d = 3;
  for (std::string_view k : kNames) {
    const int d = edit_distance(name, k);
    if (d < best_d) best_d = d, best = std::string(k);
  }
  return best.empty() ? std::string(kColumnsHint) : fmt::format("did you mean '{}'?", best);
}

/// Reads the header; nullopt when it has problems (reported).
std::optional<Header> read_header(const std::vector<CsvField>& f, Problems& problems) {
  // A first line naming none of the columns is another file (a wrong path, or not a history):
  // nothing of it is repeated in the message, which may be shown to people who cannot read it.
  if (std::none_of(f.begin(), f.end(), [](const CsvField& field) {
        return std::find(kNames.begin(), kNames.end(), field.text) != kNames.end() ||
               field.text.starts_with("sales_");
      })) {
    problems.add(1, 1, "not a sales history: the first line names none of its columns",
                 kColumnsHint);
    return std::nullopt;
  }
  Header h;
  h.col.fill(-1);
  h.fields = f.size();
  bool ok = true;
  int last_hour = -1;
  for (size_t c = 0; c < f.size(); ++c) {
    const std::string& name = f[c].text;
    if (!h.text.empty()) h.text += ',';
    h.text += name;
    const auto known = std::find(kNames.begin(), kNames.end(), name);
    if (known != kNames.end()) {
      const auto k = static_cast<size_t>(known - kNames.begin());
      if (h.col[k] >= 0) {
        problems.add(1, f[c].column,
                     fmt::format("column '{}' is given twice (first as field {}, at 1:{})", name,
                                 h.col[k] + 1, f[static_cast<size_t>(h.col[k])].column));
        ok = false;
      }
      h.col[k] = static_cast<int>(c);
      continue;
    }
    if (name.rfind("sales_", 0) == 0) {
      const auto hour = sales_hour(name);
      if (!hour) {
        problems.add(1, f[c].column,
                     fmt::format("hourly sales column '{}' must be sales_HH with HH the clock "
                                 "hour 00 to 23",
                                 printable(name)),
                     "e.g. sales_08 for the sales from 08:00 to 09:00");
        ok = false;
      } else if (last_hour >= 0 && *hour != last_hour + 1) {
        problems.add(1, f[c].column,
                     fmt::format("hourly sales columns must be consecutive hours in order: "
                                 "expected sales_{:02} after sales_{:02} (got {})",
                                 last_hour + 1, last_hour, name),
                     *hour <= last_hour ? "each hour has one column"
                                        : "give every hour between, 0 for hours without sales");
        ok = false;
      } else {
        if (last_hour < 0) h.columns.first_hour = *hour;
        last_hour = *hour;
        h.hour_fields.push_back(static_cast<int>(c));
      }
      continue;
    }
    problems.add(1, f[c].column,
                 name.empty() ? std::string("column name is empty")
                              : fmt::format("unknown column '{}'", printable(name)),
                 closest_name(name));
    ok = false;
  }
  std::string missing;
  for (int k = 0; k < kRequired; ++k) {
    if (h.col[static_cast<size_t>(k)] >= 0) continue;
    missing += missing.empty() ? "'" : ", '";
    missing += kNames[static_cast<size_t>(k)];
    missing += "'";
  }
  if (!missing.empty()) {
    problems.add(1, 1, fmt::format("the header has no column {}", missing), kColumnsHint);
    ok = false;
  }
  if (!ok) return std::nullopt;
  h.columns.has_sold_out_time = h.col[sold_out_time_col] >= 0;
  h.columns.hours = static_cast<int>(h.hour_fields.size());
  return h;
}

/// Reads the rows after the header; reports every problem.
class RowReader {
 public:
  RowReader(const Header& header, Problems& problems,
            const std::function<void(const HistoryRow&)>& sink)
      : h_(header), problems_(problems), sink_(sink) {
    row_.hourly_sales.resize(h_.hour_fields.size());
  }

  void read(const std::vector<CsvField>& f, int line) {
    line_ = line;
    bad_ = false;
    if (f.size() != h_.fields) {
      problem(1, fmt::format("expected {} fields ({}), got {}", h_.fields, printable(h_.text, 200),
                             f.size()));
      return;
    }
    const CsvField& date_f = field(f, date_col);
    const CsvField& store_f = field(f, store_col);
    const CsvField& item_f = field(f, item_col);
    std::optional<long> day;
    if (const auto d = parse_iso_date(date_f.text); !d) {
      problem(date_f.column, fmt::format("date must be an ISO date YYYY-MM-DD (got '{}')",
                                         printable(date_f.text)));
    } else if (!is_real_date(*d)) {
      problem(date_f.column, fmt::format("date {} is not a date in the calendar", date_f.text));
    } else {
      row_.date = *d;
      day = static_cast<long>(day_number(*d));
    }
    if (store_f.text.empty()) problem(store_f.column, "store is empty");
    if (item_f.text.empty()) problem(item_f.column, "item is empty");
    const auto delivered = units(field(f, delivered_col), "delivered");
    const auto sold = units(field(f, sold_col), "sold");
    const auto leftover = units(field(f, leftover_col), "leftover");
    const CsvField& out_f = field(f, sold_out_col);
    std::optional<bool> sold_out;
    if (out_f.text == "0" || out_f.text == "1") {
      sold_out = out_f.text == "1";
    } else {
      problem(out_f.column,
              fmt::format("sold_out must be 0 or 1 (got '{}')", printable(out_f.text)),
              "1 when the item sold out before closing (demand was at least sold), else 0");
    }
    if (sold_out && *sold_out && leftover && *leftover > 0) {
      problem(out_f.column,
              fmt::format("sold_out is 1 but leftover is {}: an item that sold out has nothing "
                          "left at close",
                          *leftover));
    }
    row_.sold_out_minute.reset();
    if (h_.columns.has_sold_out_time) {
      const CsvField& t_f = field(f, sold_out_time_col);
      if (!t_f.text.empty()) {
        const auto minute = clock_minutes(t_f.text);
        if (!minute) {
          problem(t_f.column, fmt::format("sold_out_time must be a time HH:MM (got '{}')",
                                          printable(t_f.text)));
        } else if (sold_out && !*sold_out) {
          problem(t_f.column, fmt::format("sold_out_time {} is given but sold_out is 0", t_f.text),
                  "the time of the last sale is only recorded on days the item sold out; leave "
                  "it blank");
        } else {
          row_.sold_out_minute = *minute;
        }
      }
    }
    if (!h_.hour_fields.empty()) {
      long long sum = 0;
      bool all = true;
      for (size_t k = 0; k < h_.hour_fields.size(); ++k) {
        const CsvField& s_f = f[static_cast<size_t>(h_.hour_fields[k])];
        const std::string name =
            fmt::format("sales_{:02}", h_.columns.first_hour + static_cast<int>(k));
        const auto v = units(s_f, name.c_str());
        if (v) {
          sum += *v;
          row_.hourly_sales[k] = *v;
        } else {
          all = false;
        }
      }
      if (all && sold && sum != *sold) {
        problem(f[static_cast<size_t>(h_.hour_fields.front())].column,
                fmt::format("the hourly sales add up to {} but sold is {}", sum, *sold));
      }
    }
    if (day && !store_f.text.empty() && !item_f.text.empty()) {
      check_sequence(*day, store_f.text, item_f.text, date_f, field(f, sold_col), delivered, sold,
                     leftover);
    }
    if (bad_) return;
    row_.store = store_f.text;
    row_.item = item_f.text;
    row_.delivered = *delivered;
    row_.sold = *sold;
    row_.leftover = *leftover;
    row_.sold_out = *sold_out;
    sink_(row_);
  }

 private:
  const CsvField& field(const std::vector<CsvField>& f, Column k) const {
    return f[static_cast<size_t>(h_.col[static_cast<size_t>(k)])];
  }

  void problem(int column, std::string message, std::string hint = {}) {
    bad_ = true;
    problems_.add(line_, column, std::move(message), std::move(hint));
  }

  /// A count of units: a whole number in [0, kMaxUnits].
  std::optional<int> units(const CsvField& f, const char* name) {
    const auto v = whole_number(f.text);
    if (!v) {
      problem(f.column,
              fmt::format("{} must be a whole number (got '{}')", name, printable(f.text)));
      return std::nullopt;
    }
    if (*v < 0) {
      problem(f.column, fmt::format("{} must be >= 0 (got {})", name, *v));
      return std::nullopt;
    }
    if (*v > kMaxUnits) {
      problem(f.column, fmt::format("{} must be at most {} (got {})", name, kMaxUnits, *v));
      return std::nullopt;
    }
    return static_cast<int>(*v);
  }

  /// Dates increase per store-item; sales fit the stock available (delivered + the previous
  /// row's leftover). Remembers this row for the next one of the store-item.
  void check_sequence(long day, const std::string& store, const std::string& item,
                      const CsvField& date_f, const CsvField& sold_f, std::optional<int> delivered,
                      std::optional<int> sold, std::optional<int> leftover) {
    key_.assign(store);
    key_ += '\x1f';
    key_ += item;
    auto [it, fresh] = last_.try_emplace(key_);
    LastRow& last = it->second;
    if (!fresh && day <= last.day) {
      if (day == last.day) {
        problem(date_f.column,
                fmt::format("a second row for store '{}', item '{}' on {} (the first is line {})",
                            printable(store), printable(item), date_f.text, last.line),
                "each store-item has at most one row per day");
      } else {
        problem(date_f.column,
                fmt::format("date {} comes before the date of the previous row of store '{}', "
                            "item '{}' (line {})",
                            date_f.text, printable(store), printable(item), last.line),
                "the rows of each store-item must be in date order (store-items may be "
                "interleaved)");
      }
      return;
    }
    if (!fresh && last.leftover >= 0 && delivered && sold &&
        *sold > static_cast<long long>(*delivered) + last.leftover) {
      problem(sold_f.column,
              fmt::format("sold {} is more than the stock available: delivered {} plus leftover {} "
                          "of the previous row (line {})",
                          *sold, *delivered, last.leftover, last.line),
              "a day's stock is that morning's delivery plus what was left at the previous "
              "close (units that expire overnight only make it less)");
    }
    last.day = day;
    last.line = line_;
    last.leftover = leftover ? *leftover : -1;
  }

  const Header& h_;
  Problems& problems_;
  const std::function<void(const HistoryRow&)>& sink_;
  HistoryRow row_;
  int line_ = 0;
  bool bad_ = false;
  std::string key_;
  std::unordered_map<std::string, LastRow> last_;
};

bool is_blank(const std::string& line) {
  return line.find_first_not_of(" \t") == std::string::npos;
}

}  // namespace

HistoryColumns read_history(std::istream& in, const std::string& file,
                            const std::function<void(const HistoryRow&)>& sink,
                            const HistoryReadOptions& options) {
  Problems problems(file, std::max(options.max_reported, 0));
  LineReader lines(in);
  std::string line;
  bool too_long = false;
  std::vector<CsvField> fields;
  // The header: the first line that is not blank.
  bool have_header = false;
  while (lines.next(line, too_long)) {
    if (!is_blank(line)) {
      have_header = true;
      break;
    }
  }
  if (!have_header) {
    problems.add(1, 1, "the history is empty: expected a header line", kColumnsHint);
    problems.raise();
  }
  if (too_long) {
    problems.add(lines.line_number(), 1,
                 fmt::format("the header is longer than {} bytes; is this a CSV file?",
                             LineReader::kMaxLine),
                 kColumnsHint);
    problems.raise();
  }
  split_fields(line, fields);
  const std::optional<Header> header = read_header(fields, problems);
  if (!header) problems.raise();
  RowReader rows(*header, problems, sink);
  while (lines.next(line, too_long)) {
    if (problems.count() >= options.stop_after) {
      problems.stop(lines.line_number() - 1);
      break;
    }
    if (too_long) {
      problems.add(
          lines.line_number(), 1,
          lines.stopped_early()
              ? fmt::format("line is longer than {} bytes and goes on past {} without an end; "
                            "larder read no further. Is this a CSV file?",
                            LineReader::kMaxLine, size_in_words(LineReader::kMaxSkip))
              : fmt::format("line is longer than {} bytes; is this a CSV file?",
                            LineReader::kMaxLine));
      continue;
    }
    if (is_blank(line)) continue;
    split_fields(line, fields);
    if (fields.size() != header->fields) {
      if (const auto quote = unclosed_quote(line)) {
        problems.add(lines.line_number(), *quote,
                     "the quote opening this field is never closed (a quoted field ends with \" "
                     "on the same line)");
        continue;
      }
    }
    rows.read(fields, lines.line_number());
  }
  if (problems.any()) problems.raise();
  return header->columns;
}

HistoryColumns read_history_file(const std::string& path,
                                 const std::function<void(const HistoryRow&)>& sink,
                                 const HistoryReadOptions& options) {
  std::error_code ec;
  std::ifstream in;
  if (!std::filesystem::is_directory(path, ec)) in.open(path, std::ios::binary);
  if (!in) {
    Diagnostics d;
    d.error(
        {path, 0, 0},
        std::filesystem::exists(path, ec) ? "cannot read the history file" : "no such history file",
        "a CSV with columns date,store,item,delivered,sold,leftover,sold_out; "
        "`larder history` writes one");
    throw InputError(std::move(d));
  }
  return read_history(in, path, sink, options);
}

}  // namespace larder
