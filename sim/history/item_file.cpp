#include "sim/history/item_file.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <charconv>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <optional>
#include <tuple>
#include <unordered_map>

#include "sim/scenario/bounded_read.hpp"
#include "sim/scenario/csv_fields.hpp"
#include "sim/scenario/diagnostics.hpp"
#include "sim/scenario/line_reader.hpp"

namespace larder {

namespace {

enum Column { item_col, price_col, cost_col, life_col, column_kinds };
constexpr std::array<std::string_view, column_kinds> kNames = {"item", "price", "unit_cost",
                                                               "shelf_life_days"};
const char* kHint =
    "columns: item,price,unit_cost,shelf_life_days (any order); every other column is an "
    "attribute of the item (e.g. category)";

/// A finite decimal number.
std::optional<double> decimal(std::string_view text) {
  double v = 0;
  const char* first = text.data();
  const char* last = text.data() + text.size();
  if (first != last && *first == '+') ++first;
  if (first == last) return std::nullopt;
  const auto [ptr, ec] = std::from_chars(first, last, v);
  if (ec != std::errc() || ptr != last || !std::isfinite(v)) return std::nullopt;
  return v;
}

}  // namespace

std::vector<ItemRecord> read_item_file(const std::string& path) {
  std::error_code ec;
  std::ifstream in;
  if (!std::filesystem::is_directory(path, ec)) in.open(path, std::ios::binary);
  if (!in) {
    Diagnostics diag;
    diag.error(
        {path, 0, 0},
        std::filesystem::exists(path, ec) ? "cannot read the item file" : "no such item file",
        "`larder history --items-out ITEMS.csv` writes one");
    throw InputError(std::move(diag));
  }
  return read_item_file(in, path);
}

std::vector<ItemRecord> read_item_file(std::istream& in, const std::string& path) {
  Diagnostics diag;
  const auto at = [&](int line, int column) { return Location{path, line, column}; };
  LineReader lines(in, kMaxItemFileBytes);
  std::string line;
  bool too_long = false;
  std::vector<CsvField> f;
  bool have_header = false;
  while (lines.next(line, too_long)) {
    if (line.find_first_not_of(" \t") != std::string::npos) {
      have_header = true;
      break;
    }
  }
  if (!have_header || too_long) {
    diag.error(at(have_header ? lines.line_number() : 1, 1),
               have_header ? "the header is too long; is this a CSV file?"
                           : "the item file is empty: expected a header line",
               kHint);
    throw InputError(std::move(diag));
  }
  split_fields(line, f);
  const std::vector<CsvField> header = f;
  std::array<int, column_kinds> col;
  col.fill(-1);
  std::vector<size_t> attribute_cols;
  std::unordered_map<std::string, int> seen;  // column name -> its field index
  for (size_t c = 0; c < header.size(); ++c) {
    const std::string& name = header[c].text;
    if (name.empty()) {
      diag.error(at(1, header[c].column), "column name is empty", kHint);
      continue;
    }
    if (const auto [it, fresh] = seen.try_emplace(name, static_cast<int>(c)); !fresh) {
      diag.error(
          at(1, header[c].column),
          fmt::format("column '{}' is given twice (first as field {}, at 1:{})", printable(name),
                      it->second + 1, header[static_cast<size_t>(it->second)].column));
      continue;
    }
    const auto known = std::find(kNames.begin(), kNames.end(), name);
    if (known != kNames.end()) {
      col[static_cast<size_t>(known - kNames.begin())] = static_cast<int>(c);
    } else {
      attribute_cols.push_back(c);
    }
  }
  std::string missing;
  for (size_t k = 0; k < column_kinds; ++k) {
    if (col[k] >= 0) continue;
    missing += missing.empty() ? "'" : ", '";
    missing += kNames[k];
    missing += "'";
  }
  if (!missing.empty())
    diag.error(at(1, 1), fmt::format("the header has no column {}", missing), kHint);
  if (!diag.ok()) throw InputError(std::move(diag));

  std::vector<ItemRecord> items;
  std::unordered_map<std::string, int> first_line;
  std::size_t rows = 0;
  while (lines.next(line, too_long)) {
    const int l = lines.line_number();
    if (too_long) {
      diag.error(at(l, 1), "line is too long; is this a CSV file?");
      continue;
    }
    if (line.find_first_not_of(" \t") == std::string::npos) continue;
    if (++rows > kMaxItemFileItems) {
      diag.final_error(
          at(l, 1),
          fmt::format("more than {} item rows (larder read no further)", kMaxItemFileItems),
          "an item file has one row per item of the history");
      break;
    }
    split_fields(line, f);
    if (f.size() != header.size()) {
      if (const auto quote = unclosed_quote(line)) {
        diag.error(at(l, *quote),
                   "the quote opening this field is never closed (a quoted field ends with \" "
                   "on the same line)");
      } else {
        diag.error(at(l, 1), fmt::format("expected {} fields, got {}", header.size(), f.size()));
      }
      continue;
    }
    const auto cell = [&](Column k) -> const CsvField& { return f[static_cast<size_t>(col[k])]; };
    bool ok = true;
    ItemRecord r;
    r.id = cell(item_col).text;
    if (r.id.empty()) {
      diag.error(at(l, cell(item_col).column), "item is empty");
      ok = false;
    } else if (const auto [it, fresh] = first_line.try_emplace(r.id, l); !fresh) {
      diag.error(
          at(l, cell(item_col).column),
          fmt::format("item '{}' is given twice (first on line {})", printable(r.id), it->second));
      ok = false;
    }
    for (const auto& [k, name, out] : {std::tuple{price_col, "price", &r.price},
                                       std::tuple{cost_col, "unit_cost", &r.unit_cost}}) {
      const auto v = decimal(cell(k).text);
      if (!v || *v < 0) {
        diag.error(at(l, cell(k).column), fmt::format("{} must be a number >= 0 (got '{}')", name,
                                                      printable(cell(k).text)));
        ok = false;
      } else {
        *out = *v;
      }
    }
    const auto life = whole_number(cell(life_col).text);
    if (!life || *life < 1 || *life > 3650) {
      diag.error(at(l, cell(life_col).column),
                 fmt::format("shelf_life_days must be a whole number from 1 to 3650 (got '{}')",
                             printable(cell(life_col).text)));
      ok = false;
    } else {
      r.shelf_life_days = static_cast<int>(*life);
    }
    for (size_t c : attribute_cols) r.attributes.emplace_back(header[c].text, f[c].text);
    if (ok) items.push_back(std::move(r));
  }
  if (lines.over_size()) {
    diag.final_error(
        at(lines.line_number() + 1, 1),
        fmt::format("the item file is larger than the limit of {} (larder read no further)",
                    size_in_words(kMaxItemFileBytes)),
        kHint);
  } else if (lines.stopped_early()) {
    diag.final_error(
        at(lines.line_number(), 1),
        fmt::format("the line goes on past {} without an end (larder read no further); is "
                    "this a CSV file?",
                    size_in_words(LineReader::kMaxSkip)));
  }
  if (diag.ok() && items.empty()) diag.error(at(1, 1), "the item file has no items", kHint);
  if (!diag.ok()) throw InputError(std::move(diag));
  return items;
}

}  // namespace larder
