#include "reports/report_context.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <array>

namespace larder {

namespace {

constexpr std::size_t kListed = 12;
constexpr std::array<const char*, kDaysPerWeek> kDayNames = {
    "Monday", "Tuesday", "Wednesday", "Thursday", "Friday", "Saturday", "Sunday"};

/// "a, b, c" or "a, b, ... and 7 more" past kListed names.
template <typename T, typename Name>
std::string name_list(const std::vector<T>& things, Name name) {
  std::string out;
  for (std::size_t i = 0; i < things.size() && i < kListed; ++i) {
    if (i > 0) out += ", ";
    out += name(things[i]);
  }
  if (things.size() > kListed) out += fmt::format(" and {} more", things.size() - kListed);
  return out;
}

/// "Mon, Tue, Thu" for a set of weekdays, "every day" when all are in it.
std::string weekday_list(const WeekdaySet& days) {
  if (std::all_of(days.begin(), days.end(), [](bool b) { return b; })) return "every day";
  std::string out;
  for (int d = 0; d < kDaysPerWeek; ++d) {
    if (!days[static_cast<size_t>(d)]) continue;
    if (!out.empty()) out += ", ";
    out += std::string(kDayNames[static_cast<size_t>(d)]).substr(0, 3);
  }
  return out;
}

std::string stores_line(const Scenario& s) {
  auto [lo, hi] =
      std::minmax_element(s.stores.begin(), s.stores.end(),
                          [](const Store& a, const Store& b) { return a.size < b.size; });
  std::string sizes;
  if (lo != s.stores.end() && lo->size != hi->size) {
    sizes = fmt::format(" (sizes {:.2f} to {:.2f})", lo->size, hi->size);
  }
  return fmt::format("{} store{}{}: {}", s.stores.size(), s.stores.size() == 1 ? "" : "s", sizes,
                     name_list(s.stores, [](const Store& st) { return st.id; }));
}

std::string items_line(const Scenario& s) {
  int shortest = 0;
  int longest = 0;
  for (const Item& it : s.items) {
    shortest = shortest == 0 ? it.shelf_life_days : std::min(shortest, it.shelf_life_days);
    longest = std::max(longest, it.shelf_life_days);
  }
  const std::string lives =
      shortest == longest ? fmt::format("shelf life {} day{}", longest, longest == 1 ? "" : "s")
                          : fmt::format("shelf lives {} to {} days", shortest, longest);
  return fmt::format("{} item{} ({}): {}", s.items.size(), s.items.size() == 1 ? "" : "s", lives,
                     name_list(s.items, [](const Item& it) { return it.id; }));
}

/// "every day", "Mon, Tue, Wed" when every store opens on the same days, else a note.
std::string opening_days(const Scenario& s) {
  const bool same = std::all_of(s.stores.begin(), s.stores.end(), [&](const Store& st) {
    return st.open_weekdays == s.stores.front().open_weekdays;
  });
  if (s.stores.empty() || !same) return "on days that differ by store";
  return weekday_list(s.stores.front().open_weekdays);
}

std::string horizon_line(const Scenario& s) {
  const Horizon& h = s.horizon;
  const std::string start =
      h.start_date
          ? fmt::format("from {} ({})", *h.start_date,
                        kDayNames[static_cast<size_t>(h.start_weekday)])
          : fmt::format("starting on a {}", kDayNames[static_cast<size_t>(h.start_weekday)]);
  return fmt::format(
      "{} days {}; the first {} are a warm-up that is simulated but not scored, so {} days are "
      "scored; stores open {}",
      h.days, start, h.warmup_days, s.scored_days(), opening_days(s));
}

std::string deliveries_line(const Scenario& s) {
  const int lead = s.logistics.lead_time_days;
  return fmt::format("orders arrive {} day{} after they are placed; deliveries {}", lead,
                     lead == 1 ? "" : "s", weekday_list(s.logistics.delivery_weekdays));
}

}  // namespace

std::vector<std::string> report_cautions() {
  return {
      "Shelf lives, next-day sale and donation must follow local food-safety law and the "
      "producer's use-by dates.",
      "Results are model estimates under the scenario's assumptions, not guarantees.",
  };
}

std::vector<std::string> scenario_lines(const Scenario& scenario) {
  return {stores_line(scenario), items_line(scenario), horizon_line(scenario),
          deliveries_line(scenario)};
}

ReportContext report_context(const Scenario& scenario, std::optional<DailyTrace> trace) {
  return {scenario_lines(scenario), report_cautions(), std::move(trace)};
}

}  // namespace larder
