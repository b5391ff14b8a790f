#include "reports/decision.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <limits>

#include "reports/comparison.hpp"
#include "reports/number_format.hpp"

namespace larder {

namespace {

constexpr double kDaysPerYear = 365.0;
constexpr double kKgPerTonne = 1000.0;
constexpr int kSignificant = 3;

bool reports(const RunResult& r, Metric m) {
  return std::find(r.metrics.begin(), r.metrics.end(), m) != r.metrics.end();
}

AnnualChange change(const RunResult& r, int policy, Metric m, double factor) {
  if (!reports(r, m)) return {};
  return {scaled(baseline_difference(r, policy, m), factor), true};
}

/// The power of a thousand money is shown in: 1, 1e3 ("k") or 1e6 ("M").
double money_scale(double magnitude) {
  if (magnitude >= 1e7) return 1e6;
  if (magnitude >= 1e4) return 1e3;
  return 1.0;
}

std::string_view scale_suffix(double scale) {
  if (scale == 1e6) return " M";
  if (scale == 1e3) return " k";
  return "";
}

/// Amounts of an interval with one scale and one number of decimals.
struct Amounts {
  std::string mean;
  std::string low;
  std::string high;
};

Amounts amounts(const Estimate& e, bool money, bool sign, bool magnitude) {
  const double hw = half_width(e);
  const double top = std::max({std::fabs(e.mean), std::fabs(e.ci_low), std::fabs(e.ci_high)});
  const double scale = money ? money_scale(top) : 1.0;
  // What the interval supports (two digits of the half-width), but no more than three
  // significant digits of the largest amount: a sentence, not a table.
  int decimals = display_decimals(hw / scale);
  if (std::isfinite(top) && top > 0.0) {
    decimals = std::min(decimals,
                        kSignificant - 1 - static_cast<int>(std::floor(std::log10(top / scale))));
  }
  const double step = decimals < 0 ? std::pow(10.0, -decimals) : 1.0;
  const auto one = [&](double v) {
    if (!std::isfinite(v)) return std::string("n/a");
    const double shown = magnitude ? std::fabs(v) : v;
    const double rounded = decimals < 0 ? std::round(shown / scale / step) * step : shown / scale;
    std::string s = format_number(rounded, std::max(decimals, 0));
    if (sign && !magnitude && s.front() != '-' && s.find_first_not_of("0.,") != std::string::npos) {
      s.insert(s.begin(), '+');
    }
    s += scale_suffix(scale);
    return s;
  };
  // A magnitude's interval reads from the smaller to the larger amount.
  const bool flip = magnitude && e.mean < 0.0;
  return {one(e.mean), one(flip ? e.ci_high : e.ci_low), one(flip ? e.ci_low : e.ci_high)};
}

enum class Direction { lower, higher, unclear, missing };

Direction direction(const AnnualChange& c) {
  if (!c.available || c.difference.n < 2 || !std::isfinite(c.difference.mean) ||
      !std::isfinite(c.difference.ci_low) || !std::isfinite(c.difference.ci_high)) {
    return Direction::missing;
  }
  if (!is_significant(c.difference)) return Direction::unclear;
  return c.difference.mean < 0.0 ? Direction::lower : Direction::higher;
}

/// A clause's words: for a significant fall, a significant rise, no clear difference ("{}"
/// placeholders: the mean, then the interval's ends).
struct ClauseWords {
  std::string_view lower;
  std::string_view higher;
  std::string_view unclear;
  std::string_view missing;
};

std::string clause(const AnnualChange& c, const ClauseWords& w, bool money = false) {
  const Direction d = direction(c);
  if (d == Direction::missing) return std::string(w.missing);
  if (d == Direction::unclear) {
    const Amounts a = amounts(c.difference, money, true, false);
    return fmt::format(fmt::runtime(w.unclear), a.mean, a.low, a.high);
  }
  const Amounts a = amounts(c.difference, money, false, true);
  return fmt::format(fmt::runtime(d == Direction::lower ? w.lower : w.higher), a.mean, a.low,
                     a.high);
}

}  // namespace

int scored_days(const RunInfo& info) {
  return info.horizon_days - info.warmup_days;
}

double annual_factor(const RunInfo& info) {
  const int days = scored_days(info);
  return days > 0 ? kDaysPerYear / days : std::numeric_limits<double>::quiet_NaN();
}

Estimate scaled(Estimate e, double factor) {
  e.mean *= factor;
  e.stderr_ *= factor;
  e.ci_low *= factor;
  e.ci_high *= factor;
  return e;
}

std::vector<DecisionRow> decision_rows(const RunResult& result) {
  const double year = annual_factor(result.info);
  std::vector<DecisionRow> rows;
  for (int p = 0; p < static_cast<int>(result.policies.size()); ++p) {
    if (p == result.baseline) continue;
    DecisionRow row;
    row.policy = result.policies[static_cast<std::size_t>(p)];
    row.waste_in_tonnes = reports(result, Metric::waste_kg);
    row.waste = row.waste_in_tonnes ? change(result, p, Metric::waste_kg, year / kKgPerTonne)
                                    : change(result, p, Metric::waste_units, year);
    row.co2e = change(result, p, Metric::co2e_kg, year / kKgPerTonne);
    row.lost = change(result, p, Metric::lost_units, year);
    row.profit = change(result, p, Metric::profit, year);
    rows.push_back(std::move(row));
  }
  return rows;
}

std::string decision_amount(double value, double half_width_, bool money, bool sign) {
  const Estimate e{value, 0.0, value - half_width_, value + half_width_, 2};
  return amounts(e, money, sign, false).mean;
}

std::string decision_change(const Estimate& e, bool money) {
  const Amounts a = amounts(e, money, true, false);
  if (!std::isfinite(e.ci_low) || !std::isfinite(e.ci_high)) return a.mean;
  return fmt::format("{} ({} to {})", a.mean, a.low, a.high);
}

std::string decision_sentence(const DecisionRow& row, std::string_view currency) {
  std::string money;
  if (!currency.empty()) money = fmt::format(" {}", currency);
  std::vector<std::string> effects;
  if (row.waste_in_tonnes) {
    effects.push_back(clause(
        row.waste,
        {"cuts waste by {} t a year ({} to {})", "adds {} t of waste a year ({} to {})",
         "makes no clear difference to waste ({1} to {2} t a year)", "waste is not available"}));
  } else {
    effects.push_back(clause(
        row.waste,
        {"cuts waste by {} units a year ({} to {})", "adds {} wasted units a year ({} to {})",
         "makes no clear difference to waste ({1} to {2} units a year)",
         "waste is not available"}));
  }
  if (row.co2e.available) {
    effects.push_back(clause(
        row.co2e, {"{} t CO2e less a year ({} to {})", "{} t CO2e more a year ({} to {})",
                   "no clear difference in CO2e ({1} to {2} t a year)", "CO2e is not available"}));
  }
  effects.push_back(clause(row.lost, {"loses {} fewer customers a year ({} to {})",
                                      "costs {} more lost customers a year ({} to {})",
                                      "no clear difference in lost customers ({1} to {2} a year)",
                                      "lost customers are not available"}));
  const std::string profit_higher = "profit +{}" + money + " a year (+{} to +{})";
  const std::string profit_lower = "profit -{0}" + money + " a year (-{2} to -{1})";
  const std::string profit_unclear =
      "no clear difference in profit ({1} to {2}" + money + " a year)";
  const std::string profit = clause(
      row.profit, {profit_lower, profit_higher, profit_unclear, "profit is not available"}, true);
  std::string joined;
  for (std::size_t k = 0; k < effects.size(); ++k) {
    if (k > 0) joined += k + 1 == effects.size() ? " and " : ", ";
    joined += effects[k];
  }
  return fmt::format("{} {}; {}.", row.policy, joined, profit);
}

}  // namespace larder
