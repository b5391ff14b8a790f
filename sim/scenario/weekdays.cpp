#include "sim/scenario/weekdays.hpp"

#include <fmt/format.h>

#include <cctype>

namespace larder {

std::optional<int> weekday_index(std::string_view name) {
  for (int d = 0; d < kDaysPerWeek; ++d) {
    if (name == kWeekdayNames[static_cast<size_t>(d)]) return d;
  }
  return std::nullopt;
}

std::string weekday_names_text() {
  std::string out;
  for (const char* n : kWeekdayNames) out += (out.empty() ? "" : ", ") + std::string(n);
  return out;
}

std::string weekday_hint(std::string_view word) {
  std::string lower(word);
  for (char& c : lower) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  for (const char* n : kWeekdayNames) {
    // "Monday", "MON" and "monday" all start with the three-letter name.
    if (lower.size() >= 3 && lower.compare(0, 3, n) == 0) {
      return fmt::format("did you mean '{}'? weekdays are {}", n, weekday_names_text());
    }
  }
  return fmt::format("weekdays are {}", weekday_names_text());
}

std::optional<WeekdaySet> read_weekday_set(const YAML::Node& node, const std::string& what,
                                           const std::string& file, Diagnostics& diag) {
  if (!node.IsSequence()) {
    diag.error(location_of(node, file),
               fmt::format("{} must be a list of weekdays such as [mon, tue] (got {})", what,
                           describe_value(node)));
    return std::nullopt;
  }
  if (node.size() == 0) {
    diag.error(location_of(node, file), fmt::format("{} must list at least one weekday", what));
    return std::nullopt;
  }
  WeekdaySet set{};
  bool ok = true;
  for (size_t i = 0; i < node.size(); ++i) {
    const YAML::Node e = node[i];
    const auto d = e.IsScalar() ? weekday_index(e.Scalar()) : std::nullopt;
    if (!d) {
      diag.error(location_of(e, file),
                 fmt::format("{}[{}] must be a weekday name (got {})", what, i, describe_value(e)),
                 weekday_hint(e.IsScalar() ? e.Scalar() : std::string{}));
      ok = false;
      continue;
    }
    if (set[static_cast<size_t>(*d)]) {
      diag.error(location_of(e, file), fmt::format("{} lists '{}' twice", what, e.Scalar()));
      ok = false;
    }
    set[static_cast<size_t>(*d)] = true;
  }
  if (!ok) return std::nullopt;
  return set;
}

std::optional<WeekdayValues> read_weekday_values(const YAML::Node& node, const std::string& what,
                                                 Range range, const std::string& file,
                                                 Diagnostics& diag) {
  if (!node.IsMap()) {
    diag.error(location_of(node, file),
               fmt::format("{} must be a mapping from weekday to number such as {{ mon: 0.9 }} "
                           "(got {})",
                           what, describe_value(node)));
    return std::nullopt;
  }
  WeekdayValues values = {1, 1, 1, 1, 1, 1, 1};
  bool ok = true;
  for (const auto& kv : node) {
    const std::string key = kv.first.IsScalar() ? kv.first.Scalar() : std::string{};
    const auto d = weekday_index(key);
    if (!d) {
      diag.error(location_of(kv.first, file),
                 fmt::format("{} has a key that is not a weekday (got {})", what,
                             describe_value(kv.first)),
                 weekday_hint(key));
      ok = false;
      continue;
    }
    const auto v = read_number(kv.second, fmt::format("{}.{}", what, key), range, file, diag);
    if (!v) {
      ok = false;
      continue;
    }
    values[static_cast<size_t>(*d)] = *v;
  }
  if (!ok) return std::nullopt;
  return values;
}

}  // namespace larder
