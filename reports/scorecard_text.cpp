#include "reports/scorecard_text.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "reports/number_format.hpp"

namespace larder {

namespace {

std::string value_text(double v, Metric m, bool difference = false) {
  const MetricInfo& info = metric_info(m);
  if (info.unit == "share") {
    return format_number(display_value(v, info.unit), 1) + (difference ? " pts" : "%");
  }
  return format_number(v, info.unit == "money" ? 2 : 0);
}

std::string pad_left(const std::string& s, size_t w) {
  return s.size() >= w ? s : std::string(w - s.size(), ' ') + s;
}
std::string pad_right(const std::string& s, size_t w) {
  return s.size() >= w ? s : s + std::string(w - s.size(), ' ');
}

std::string fit_text(const SlopeFit& f) {
  if (!std::isfinite(f.value)) return "n/a (too few orders, or too little to tell apart)";
  return fmt::format("{:.2f} ± {:.2f} (standard error, {} orders)", f.value, f.std_error, f.n);
}

}  // namespace

std::vector<std::string> habit_sentences(const HabitReading& h) {
  std::vector<std::string> out;
  if (std::isfinite(h.chasing.value)) {
    const double t = h.chasing.value;
    out.push_back(
        t > 0.5 ? fmt::format("Your orders chase the last sales strongly (weight {:.2f}): one "
                              "busy or quiet day moves the next order a lot, though single days "
                              "are mostly noise.",
                              t)
        : t > 0.2
            ? fmt::format("Your orders follow the last sales moderately (weight {:.2f}).", t)
            : fmt::format("Your orders hardly react to the last day's sales (weight {:.2f}).", t));
  }
  if (std::isfinite(h.pull_to_center.value)) {
    const double w = h.pull_to_center.value;
    out.push_back(w > 0.25 ? fmt::format("Your stock sits {:.0f}% of the way from the "
                                         "profit-maximising quantity toward the mean demand (pull "
                                         "to centre).",
                                         100.0 * w)
                  : w < -0.25
                      ? fmt::format("Your stock goes beyond the profit-maximising quantity, away "
                                    "from the mean (w = {:.2f}).",
                                    w)
                      : "Your stock is close to the profit-maximising quantity on average.");
  }
  if (std::isfinite(h.implied_service) && std::isfinite(h.justified_service)) {
    const double gap = h.implied_service - h.justified_service;
    out.push_back(fmt::format(
        "Your stock covered demand with probability {:.0f}% on average; the margins justify "
        "{:.0f}%{}",
        100.0 * h.implied_service, 100.0 * h.justified_service,
        gap < -0.05  ? ": you stock less than they are worth."
        : gap > 0.05 ? ": you stock more than they are worth."
                     : ": about right."));
  }
  return out;
}

std::string scorecard_text(const Scorecard& c) {
  std::string out;
  out += fmt::format("Drill scorecard: {} at store {}, {} drill days (scenario {}, seed {})\n",
                     c.trainee, c.store, c.days, c.scenario, c.seed);
  std::string items;
  for (const auto& i : c.items) {
    if (!items.empty()) items += ", ";
    items += i;
  }
  out +=
      fmt::format("Items: {}. Everyone met the same customers (common random numbers).\n\n", items);
  const std::vector<Metric> ms = scorecard_metrics();
  size_t w = 10;
  for (const auto& p : c.policies) w = std::max(w, p.size() + 2);
  out += pad_right("metric", 19);
  for (const auto& p : c.policies) out += pad_left(p, w);
  out += "\n";
  for (const Metric m : ms) {
    out += pad_right(std::string(metric_name(m)), 19);
    for (size_t p = 0; p < c.policies.size(); ++p)
      out += pad_left(value_text(at(c.totals[p], m), m), w);
    out += "\n";
  }
  out += fmt::format("\n{} minus each policy (profit in {}):\n", c.trainee, c.currency);
  out += pad_right("metric", 19);
  for (size_t p = 1; p < c.policies.size(); ++p) out += pad_left("vs " + c.policies[p], w + 3);
  out += "\n";
  for (const Metric m : ms) {
    out += pad_right(std::string(metric_name(m)), 19);
    for (size_t p = 1; p < c.policies.size(); ++p) {
      out += pad_left(value_text(at(c.totals[0], m) - at(c.totals[p], m), m, true), w + 3);
    }
    out += "\n";
  }

  out += fmt::format(
      "\nDay by day: {}'s profit and waste, and the profit difference against each "
      "policy\n",
      c.trainee);
  out += pad_right("day", 8) + pad_left("profit", 10) + pad_left("waste", 7);
  for (size_t p = 1; p < c.policies.size(); ++p) out += pad_left("vs " + c.policies[p], w + 3);
  out += "\n";
  for (int d = 0; d < c.days; ++d) {
    const size_t k = static_cast<size_t>(d);
    out += pad_right(fmt::format("{:>3} {}", d + 1, c.weekday[k]), 8);
    out += pad_left(value_text(at(c.daily[0][k], Metric::profit), Metric::profit), 10);
    out += pad_left(value_text(at(c.daily[0][k], Metric::waste_units), Metric::waste_units), 7);
    for (size_t p = 1; p < c.policies.size(); ++p) {
      out +=
          pad_left(value_text(at(c.daily[0][k], Metric::profit) - at(c.daily[p][k], Metric::profit),
                              Metric::profit),
                   w + 3);
    }
    out += "\n";
  }

  out +=
      "\nHabits (read from your stock at opening against the true demand, Schweitzer and "
      "Cachon 2000):\n";
  for (const HabitReading& h : c.habits) {
    out += fmt::format("  {}:\n", h.item == "all" ? "all items" : h.item);
    out += fmt::format("    chasing the last sales (theta, 0 ignores them, 1 repeats them): {}\n",
                       fit_text(h.chasing));
    out += fmt::format("    pull to centre (w, 0 = profit-maximising Q*, 1 = mean demand):  {}\n",
                       fit_text(h.pull_to_center));
    out += fmt::format(
        "    service level implied: {}, justified by the margins: {}\n",
        std::isfinite(h.implied_service) ? fmt::format("{:.0f}%", 100.0 * h.implied_service)
                                         : std::string("n/a"),
        std::isfinite(h.justified_service) ? fmt::format("{:.0f}%", 100.0 * h.justified_service)
                                           : std::string("n/a"));
    if (h.item == "all") {
      for (const auto& s : habit_sentences(h)) out += fmt::format("    {}\n", s);
    }
  }
  out +=
      "\nOne simulated run of model demand, not a verdict on a person: read it with the "
      "trainer.\n";
  return out;
}

}  // namespace larder
