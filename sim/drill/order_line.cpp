#include "sim/drill/order_line.hpp"

#include <fmt/format.h>

#include <cctype>

namespace larder {

namespace {

std::string names(std::span<const std::string> items) {
  std::string out;
  for (const auto& i : items) {
    if (!out.empty()) out += ' ';
    out += i;
  }
  return out;
}

std::vector<std::string> tokens(std::string_view line) {
  std::vector<std::string> out;
  std::string cur;
  for (const char c : line) {
    if (c == ' ' || c == '\t' || c == ',' || c == ';') {
      if (!cur.empty()) out.push_back(std::move(cur)), cur.clear();
    } else {
      cur += c;
    }
  }
  if (!cur.empty()) out.push_back(std::move(cur));
  return out;
}

OrderLine error(std::string message) {
  return {OrderLine::Kind::error, {}, std::move(message)};
}

}  // namespace

OrderLine parse_order_line(std::string_view line, std::span<const std::string> items,
                           std::span<const std::optional<int>> previous) {
  const std::vector<std::string> t = tokens(line);
  const size_t n = items.size();
  const std::string what = fmt::format("type {} number{} ({}), r to repeat, ? for help", n,
                                       n == 1 ? "" : "s", names(items));
  if (t.empty()) return error(fmt::format("nothing typed: {}", what));
  if (t.size() == 1) {
    std::string w = t[0];
    for (char& c : w) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
    if (w == "?" || w == "h" || w == "help") return {OrderLine::Kind::help, {}, {}};
    if (w == "q" || w == "quit") return {OrderLine::Kind::quit, {}, {}};
    if ((w == "r" || w == "=") && n > 1) {
      OrderLine o{OrderLine::Kind::orders, {}, {}};
      for (size_t k = 0; k < n; ++k) {
        if (!previous[k])
          return error(fmt::format("no earlier order of {} to repeat: {}", items[k], what));
        o.quantities.push_back(*previous[k]);
      }
      return o;
    }
    if (w == "r" && n == 1) {
      if (!previous[0])
        return error(fmt::format("no earlier order of {} to repeat: {}", items[0], what));
      return {OrderLine::Kind::orders, {*previous[0]}, {}};
    }
  }
  for (size_t k = 0; k < t.size(); ++k) {  // what is wrong with a value comes first
    const std::string& w = t[k];
    if (w == "=") continue;
    bool digits = !w.empty();
    for (const char c : w) digits = digits && c >= '0' && c <= '9';
    if (digits) continue;
    if (w.size() > 1 && w[0] == '-' && k < n) {
      return error(fmt::format("{}: {} cannot order fewer than 0 units", w, items[k]));
    }
    if (w.size() > 1 && w[0] == '-') return error(fmt::format("{}: orders cannot be negative", w));
    return error(fmt::format("'{}' is not a whole number of units: {}", w, what));
  }
  if (t.size() != n) {
    return error(fmt::format("{} value{} for {} item{}: {}", t.size(), t.size() == 1 ? "" : "s", n,
                             n == 1 ? "" : "s", what));
  }
  OrderLine o{OrderLine::Kind::orders, {}, {}};
  for (size_t k = 0; k < n; ++k) {
    const std::string& w = t[k];
    if (w == "=") {
      if (!previous[k])
        return error(fmt::format("no earlier order of {} to repeat: {}", items[k], what));
      o.quantities.push_back(*previous[k]);
      continue;
    }
    bool digits = !w.empty();
    for (const char c : w) digits = digits && c >= '0' && c <= '9';
    if (!digits) {
      const bool negative = w.size() > 1 && w[0] == '-';
      if (negative)
        return error(fmt::format("{}: {} cannot order fewer than 0 units", w, items[k]));
      return error(fmt::format("'{}' is not a whole number of units: {}", w, what));
    }
    if (w.size() > 6 || std::stoi(w) > kMaxOrderUnits) {
      return error(fmt::format("{}: at most {} units of {}", w, kMaxOrderUnits, items[k]));
    }
    o.quantities.push_back(std::stoi(w));
  }
  return o;
}

}  // namespace larder
