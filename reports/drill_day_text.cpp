#include "reports/drill_day_text.hpp"

#include <fmt/format.h>

#include <cmath>

namespace larder {

namespace {

std::string weekday(const Scenario& s, int day) {
  return kWeekdayNames[static_cast<size_t>(s.weekday_of(day))];
}

std::string clock(const Scenario& s, float hours_after_open) {
  const double h = s.calendar.open_hour + static_cast<double>(hours_after_open);
  const int minutes = static_cast<int>(std::lround(h * 60.0));
  return fmt::format("{:02}:{:02}", minutes / 60, minutes % 60);
}

}  // namespace

std::string drill_day_text(const Scenario& s, const DrillView& v) {
  const DrillSpec& sp = *s.drill;
  const int d = v.turn.order_day;
  const int a = v.turn.arrival_day;
  std::string out;
  out += fmt::format("\n=== Drill day {} of {} (order {} of {}) ===\n", v.turn.drill_day, sp.days,
                     v.turn_index + 1, v.turns);
  if (d >= 0) {
    out += fmt::format("After the close of {} (day {}): order for delivery on {} (day {}).\n",
                       weekday(s, d), d, weekday(s, a), a);
  } else {
    out +=
        fmt::format("Before the first day: order for delivery on {} (day {}).\n", weekday(s, a), a);
  }
  if (std::abs(v.announced - 1.0) > 1e-12) {
    out += fmt::format("Announced for {}: demand about x{:.2g} of a usual {}.\n", weekday(s, a),
                       v.announced, weekday(s, a));
  }
  for (size_t k = 0; k < sp.items.size(); ++k) {
    const Item& it = s.items[static_cast<size_t>(sp.items[k])];
    const ItemView& iv = v.items[k];
    out += fmt::format("\n{}: price {:.2f}, cost {:.2f} {}; sells for {} day{}; packs of {}\n",
                       it.id, it.price, it.unit_cost, s.currency, it.shelf_life_days,
                       it.shelf_life_days == 1 ? "" : "s", it.pack_size);
    if (!iv.recent.empty()) {
      std::string head = fmt::format("  {:<10}", "day");
      std::string del = fmt::format("  {:<10}", "delivered");
      std::string sold = fmt::format("  {:<10}", "sold");
      std::string out_at = fmt::format("  {:<10}", "sold out");
      std::string left = fmt::format("  {:<10}", "thrown out");
      for (const SeenDay& day : iv.recent) {
        head += fmt::format(" {:>6}", weekday(s, day.day));
        if (!day.open) {
          del += fmt::format(" {:>6}", day.delivered);
          sold += fmt::format(" {:>6}", "closed");
          out_at += fmt::format(" {:>6}", "");
          left += fmt::format(" {:>6}", day.unsold_out);
          continue;
        }
        del += fmt::format(" {:>6}", day.delivered);
        sold += fmt::format(" {:>6}", fmt::format("{}{}", day.sold, day.sold_out ? "*" : ""));
        const std::string when = !day.sold_out                  ? std::string("-")
                                 : day.sold == 0                ? std::string("empty")
                                 : std::isnan(day.sellout_hour) ? std::string("yes")
                                                                : clock(s, day.sellout_hour);
        out_at += fmt::format(" {:>6}", when);
        left += fmt::format(" {:>6}", day.unsold_out);
      }
      out += head + "\n" + del + "\n" + sold + "   (* sold out)\n" + out_at + "\n" + left + "\n";
    }
    int on_hand = 0;
    std::string ages;
    for (size_t slot = 0; slot < iv.stock_by_age.size(); ++slot) on_hand += iv.stock_by_age[slot];
    if (it.shelf_life_days > 1 && on_hand > 0) {
      for (size_t slot = 0; slot + 1 < iv.stock_by_age.size(); ++slot) {
        if (iv.stock_by_age[slot] == 0) continue;
        if (!ages.empty()) ages += ", ";
        ages += fmt::format("{} for {} more day{}", iv.stock_by_age[slot], slot + 1,
                            slot == 0 ? "" : "s");
      }
      ages = fmt::format(" ({})", ages);
    }
    out += fmt::format("  on hand after close: {}{}; on order before {}: {}; your last order: {}\n",
                       on_hand, ages, weekday(s, a), iv.on_order,
                       iv.last_order ? fmt::format("{}", *iv.last_order) : std::string("none"));
  }
  return out;
}

std::string drill_prompt_text(const Scenario& s, const DrillView& v) {
  const DrillSpec& sp = *s.drill;
  std::string names;
  for (const int i : sp.items) {
    if (!names.empty()) names += ' ';
    names += s.items[static_cast<size_t>(i)].id;
  }
  return fmt::format("Order for {} ({}) [r repeat, ? help, q quit]: ",
                     kWeekdayNames[static_cast<size_t>(s.weekday_of(v.turn.arrival_day))], names);
}

std::string drill_help_text(const Scenario& s) {
  const DrillSpec& sp = *s.drill;
  std::string names;
  for (const int i : sp.items) {
    if (!names.empty()) names += ' ';
    names += s.items[static_cast<size_t>(i)].id;
  }
  return fmt::format(
      "Type one whole number per item, in this order: {}\n"
      "  e.g. '12 8 0'. Blanks or commas separate them. Packs round the order up.\n"
      "  =   in place of a number repeats that item's last order ('12 = 0')\n"
      "  r   repeats every item's last order\n"
      "  ?   this help\n"
      "  q   stop here: the orders so far are saved (decisions.csv); an unfinished drill\n"
      "      gets no scorecard\n"
      "The orders arrive {} day(s) later. You see sales, not demand: a '*' marks a day the\n"
      "item sold out, so customers may have left without buying.\n",
      names, s.logistics.lead_time_days);
}

}  // namespace larder
