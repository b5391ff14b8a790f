#include "sim/drill/decision_reader.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <string_view>

#include "sim/scenario/bounded_read.hpp"
#include "sim/scenario/csv_fields.hpp"
#include "sim/scenario/diagnostics.hpp"
#include "sim/scenario/scenario.hpp"

namespace larder {

DrillDecisions parse_decisions(const DecisionFrame& frame, const std::string& text,
                               const std::string& file) {
  const Scenario& s = frame.scenario;
  const DrillSpec& sp = *s.drill;
  const auto turns = frame.turns;
  const int first_day = s.horizon.warmup_days;
  Diagnostics diag;
  const auto at = [&](int line, int column) { return Location{file, line, column}; };
  // Lines are read one at a time as views into the text (never all kept: a file of a million
  // empty lines costs no more than its text).
  std::size_t from = 0;
  int line_count = 0;
  const auto next_line = [&](std::string_view& l) {
    if (from >= text.size()) return false;
    std::size_t end = text.find('\n', from);
    if (end == std::string::npos) end = text.size();
    l = std::string_view(text).substr(from, end - from);
    if (!l.empty() && l.back() == '\r') l.remove_suffix(1);
    from = end + 1;
    ++line_count;
    return true;
  };
  std::string_view first;
  const bool have_first = next_line(first);
  if (first.starts_with("\xEF\xBB\xBF")) first.remove_prefix(3);
  if (!have_first || first.find_first_not_of(" \t") == std::string_view::npos) {
    diag.error(at(1, 1), "expected the header day,store,item,quantity",
               "the replay format of policies.md; larder drill writes it as decisions.csv");
    throw InputError(diag);
  }
  constexpr std::array<const char*, 4> kNames = {"day", "store", "item", "quantity"};
  std::array<int, 4> col{-1, -1, -1, -1};
  const std::vector<CsvField> header = split_fields(first);
  // A first line naming none of the columns is another file (a wrong path, or not larder's):
  // nothing of it is repeated in the message.
  if (std::none_of(header.begin(), header.end(), [&](const CsvField& f) {
        return std::find(kNames.begin(), kNames.end(), f.text) != kNames.end();
      })) {
    diag.error(at(1, 1),
               "not a decision file: the first line names none of the columns day, store, item, "
               "quantity",
               "is the path right? larder drill writes decisions.csv with the header "
               "day,store,item,quantity");
    throw InputError(diag);
  }
  for (size_t c = 0; c < header.size(); ++c) {
    const auto it = std::find(kNames.begin(), kNames.end(), header[c].text);
    if (it == kNames.end()) {
      diag.error(at(1, header[c].column), fmt::format("unknown column '{}'", header[c].text),
                 header[c].text == "date" ? "a drill reads the column day (the scenario day on "
                                            "which the order is placed), not date"
                                          : "columns: day, store, item, quantity");
      continue;
    }
    col[static_cast<size_t>(it - kNames.begin())] = static_cast<int>(c);
  }
  for (size_t k = 0; k < kNames.size(); ++k) {
    if (col[k] < 0 && diag.ok()) {
      diag.error(at(1, 1), fmt::format("the header has no column '{}'", kNames[k]),
                 "columns: day, store, item, quantity");
    }
  }
  if (!diag.ok()) throw InputError(diag);

  const std::string& store = s.stores[static_cast<size_t>(sp.store)].id;
  DrillDecisions decided(turns.size(), std::vector<int>(sp.items.size(), -1));
  std::vector<std::vector<int>> line_of(turns.size(), std::vector<int>(sp.items.size(), 0));
  for (std::string_view text_line; next_line(text_line);) {
    const int line = line_count;
    if (text_line.find_first_not_of(" \t") == std::string_view::npos) continue;
    const std::vector<CsvField> f = split_fields(text_line);
    if (f.size() != header.size()) {
      if (const auto quote = unclosed_quote(text_line)) {
        diag.error(at(line, *quote),
                   "the quote opening this field is never closed (a quoted field ends with \" "
                   "on the same line)");
      } else {
        diag.error(at(line, 1), fmt::format("expected {} fields, got {}", header.size(), f.size()));
      }
      continue;
    }
    const CsvField& day_f = f[static_cast<size_t>(col[0])];
    const CsvField& store_f = f[static_cast<size_t>(col[1])];
    const CsvField& item_f = f[static_cast<size_t>(col[2])];
    const CsvField& q_f = f[static_cast<size_t>(col[3])];
    const auto day = whole_number(day_f.text);
    if (!day) {
      diag.error(at(line, day_f.column),
                 fmt::format("day must be a whole number (got '{}')", day_f.text));
      continue;
    }
    if (store_f.text != store) {
      diag.error(at(line, store_f.column),
                 fmt::format("store '{}' is not the drill's store '{}'", store_f.text, store));
      continue;
    }
    size_t k = 0;
    while (k < sp.items.size() && s.items[static_cast<size_t>(sp.items[k])].id != item_f.text) {
      ++k;
    }
    if (k == sp.items.size()) {
      std::string ids;
      for (const int i : sp.items) {
        if (!ids.empty()) ids += ", ";
        ids += s.items[static_cast<size_t>(i)].id;
      }
      diag.error(at(line, item_f.column),
                 fmt::format("item '{}' is not one of the drill's items", item_f.text),
                 fmt::format("drill items: {}", ids));
      continue;
    }
    const auto q = whole_number(q_f.text);
    if (!q || *q < 0 || *q > 1000000) {
      diag.error(
          at(line, q_f.column),
          fmt::format("quantity must be a whole number in [0, 1000000] (got '{}')", q_f.text));
      continue;
    }
    const int lead = s.logistics.lead_time_days;
    if (*day + lead < first_day && *day >= -lead) continue;  // the warm-up: the house's
    const auto turn = std::find_if(turns.begin(), turns.end(),
                                   [&](const DrillTurn& t) { return t.order_day == *day; });
    if (turn == turns.end()) {
      diag.error(at(line, day_f.column),
                 fmt::format("no order is placed on day {}: the drill's orders are placed on "
                             "days {} to {} for a delivery {} day(s) later, on open delivery "
                             "days",
                             *day, turns.empty() ? 0 : turns.front().order_day,
                             turns.empty() ? 0 : turns.back().order_day, lead));
      continue;
    }
    const size_t j = static_cast<size_t>(turn - turns.begin());
    if (line_of[j][k] != 0) {
      diag.error(at(line, 1), fmt::format("a second order of item '{}' placed on day {} (the "
                                          "first is on line {})",
                                          item_f.text, *day, line_of[j][k]));
      continue;
    }
    line_of[j][k] = line;
    decided[j][k] = static_cast<int>(*q);
  }
  int missing = 0;
  for (size_t j = 0; j < turns.size(); ++j) {
    for (size_t k = 0; k < sp.items.size(); ++k) {
      if (decided[j][k] >= 0) continue;
      if (++missing <= 5) {
        diag.error(at(line_count, 1),
                   fmt::format("no order of item '{}' placed on day {} (drill day {})",
                               s.items[static_cast<size_t>(sp.items[k])].id, turns[j].order_day,
                               turns[j].drill_day),
                   "every drill day with a delivery needs one row per drill item (0 to order "
                   "nothing)");
      }
    }
  }
  if (missing > 5) {
    diag.error(at(line_count, 1), fmt::format("{} more orders are missing", missing - 5));
  }
  if (!diag.ok()) throw InputError(diag);
  return decided;
}

DrillDecisions read_decisions(const DecisionFrame& frame, const std::string& path) {
  const BoundedText in = read_bounded(path, kMaxDecisionFileBytes);
  if (!in.ok()) {
    Diagnostics diag;
    diag.error({path, 0, 0},
               in.too_large ? fmt::format("the decision file is larger than the limit of {} "
                                          "(larder read no further)",
                                          size_in_words(kMaxDecisionFileBytes))
                            : fmt::format("cannot read '{}': {}", path, in.problem),
               "a decision file has one row per drill day and item (day,store,item,quantity)");
    throw InputError(diag);
  }
  return parse_decisions(frame, in.text, path);
}

}  // namespace larder
