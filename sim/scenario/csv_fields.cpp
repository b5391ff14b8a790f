#include "sim/scenario/csv_fields.hpp"

#include <fmt/format.h>

#include <charconv>

namespace larder {

namespace {

bool blank(char c) {
  return c == ' ' || c == '\t';
}

}  // namespace

void split_fields(std::string_view line, std::vector<CsvField>& out) {
  out.clear();
  size_t pos = 0;
  const size_t n = line.size();
  while (true) {
    CsvField f;
    f.column = static_cast<int>(pos) + 1;
    size_t a = pos;
    while (a < n && blank(line[a])) ++a;
    size_t end = a;  // the comma (or line end) after the field
    if (a < n && line[a] == '"') {
      // Quoted: up to the closing quote, "" standing for one quote; anything after the closing
      // quote up to the comma is kept, so a stray character never vanishes silently.
      size_t i = a + 1;
      while (i < n) {
        if (line[i] == '"') {
          if (i + 1 < n && line[i + 1] == '"') {
            f.text += '"';
            i += 2;
            continue;
          }
          ++i;
          break;
        }
        f.text += line[i++];
      }
      end = i;
      while (end < n && line[end] != ',') ++end;
      size_t b = end;
      while (b > i && blank(line[b - 1])) --b;
      f.text.append(line.substr(i, b - i));
    } else {
      while (end < n && line[end] != ',') ++end;
      size_t b = end;
      while (b > a && blank(line[b - 1])) --b;
      f.text.assign(line.substr(a, b - a));
    }
    out.push_back(std::move(f));
    if (end >= n) break;
    pos = end + 1;
  }
}

std::optional<int> unclosed_quote(std::string_view line) {
  size_t pos = 0;
  const size_t n = line.size();
  while (pos <= n) {
    size_t a = pos;
    while (a < n && blank(line[a])) ++a;
    size_t end = a;
    if (a < n && line[a] == '"') {
      size_t i = a + 1;
      bool closed = false;
      while (i < n) {
        if (line[i] == '"') {
          if (i + 1 < n && line[i + 1] == '"') {
            i += 2;
            continue;
          }
          closed = true;
          ++i;
          break;
        }
        ++i;
      }
      if (!closed) return static_cast<int>(a) + 1;
      end = i;
    }
    while (end < n && line[end] != ',') ++end;
    if (end >= n) break;
    pos = end + 1;
  }
  return std::nullopt;
}

std::vector<CsvField> split_fields(std::string_view line) {
  std::vector<CsvField> out;
  split_fields(line, out);
  return out;
}

std::optional<long long> whole_number(std::string_view text) {
  long long v = 0;
  const char* first = text.data() + (!text.empty() && text[0] == '+' ? 1 : 0);
  const char* last = text.data() + text.size();
  if (first == last || (*first == '-' && first + 1 == last)) return std::nullopt;
  if (*first == '+' || (text[0] == '+' && *first == '-')) return std::nullopt;
  const auto [ptr, ec] = std::from_chars(first, last, v);
  if (ec != std::errc() || ptr != last) return std::nullopt;
  return v;
}

std::string printable(std::string_view text, std::size_t max) {
  std::string out;
  std::size_t shown = 0;
  for (const char c : text) {
    if (shown == max) {
      out += "...";
      break;
    }
    const auto u = static_cast<unsigned char>(c);
    if (u >= 0x20 && u < 0x7f) {
      out += c;
    } else {
      out += fmt::format("\\x{:02x}", u);
    }
    ++shown;
  }
  return out;
}

}  // namespace larder
