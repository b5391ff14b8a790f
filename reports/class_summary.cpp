#include "reports/class_summary.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <filesystem>
#include <fstream>
#include <limits>
#include <nlohmann/json.hpp>
#include <sstream>

#include "reports/csv.hpp"
#include "reports/json_integer.hpp"
#include "reports/number_format.hpp"
#include "sim/scenario/bounded_read.hpp"
#include "sim/scenario/diagnostics.hpp"

namespace larder {

namespace {
/// The largest scorecard.json read (one is a few kilobytes).
constexpr std::size_t kMaxScorecardBytes = std::size_t{16} << 20;
}  // namespace

namespace {

using nlohmann::json;

double num(const json& j) {
  return j.is_number() ? j.get<double>() : std::numeric_limits<double>::quiet_NaN();
}

ClassRow row_of(const json& policy, const json& card, const std::string& source, double house) {
  ClassRow r;
  r.name = policy.at("name").get<std::string>();
  r.role = policy.at("role").get<std::string>();
  r.source = source;
  const json& m = policy.at("metrics");
  r.waste_units = num(m.at("waste_units"));
  r.in_stock_at_close = num(m.at("in_stock_at_close"));
  r.fill_rate = num(m.at("fill_rate"));
  r.profit = num(m.at("profit"));
  r.profit_vs_house = r.profit - house;
  const double nan = std::numeric_limits<double>::quiet_NaN();
  r.chasing_weight = r.pull_to_center = r.implied_service = r.justified_service = nan;
  if (r.role == "trainee") {
    const json& h = card.at("habits").at(0);
    r.chasing_weight = num(h.at("chasing_weight").at("value"));
    r.pull_to_center = num(h.at("pull_to_center").at("value"));
    r.implied_service = num(h.at("implied_service"));
    r.justified_service = num(h.at("justified_service"));
  }
  return r;
}

std::string cell(double v, int decimals) {
  return format_number(v, decimals);
}

}  // namespace

ClassSummary parse_class(const std::vector<ScorecardSource>& cards, Diagnostics& diag) {
  ClassSummary s;
  std::vector<ClassRow> references;
  std::uint64_t first_seed = 0;
  bool have_first = false;
  for (const ScorecardSource& source : cards) {
    const std::string& file = source.file;
    try {
      json card;
      try {
        card = json::parse(source.text);
      } catch (const json::parse_error& e) {
        // Not nlohmann's text: it quotes what it read last, and the file may be anyone's.
        diag.error({file, 1, 1},
                   fmt::format("not a scorecard: not JSON, or cut short (at byte {})", e.byte),
                   "give folders written by larder drill, or their scorecard.json files");
        continue;
      }
      if (!card.is_object() || card.value("format", "") != "larder-drill-scorecard") {
        diag.error({file, 1, 1}, "not a drill scorecard (scorecard.json of larder drill)");
        continue;
      }
      const std::string scenario = card.at("scenario").get<std::string>();
      const std::string store = card.at("store").get<std::string>();
      const int days = json_int(card.at("days"), "days", 0, 1'000'000'000);
      const json& policies = card.at("policies");
      const std::string house = policies.at(1).at("name").get<std::string>();
      const std::uint64_t seed = json_uint64(card.at("seed"), "seed");
      const bool first = !have_first;
      if (first) {
        s.scenario = scenario;
        s.store = store;
        s.days = days;
        s.currency = card.value("currency", "");
        s.house = house;
        first_seed = seed;
      } else if (scenario != s.scenario || store != s.store || days != s.days || house != s.house) {
        diag.error({file, 1, 1},
                   fmt::format("another exercise: scenario {}, store {}, {} days, house rule {} "
                               "(the first file: {}, {}, {} days, {})",
                               scenario, store, days, house, s.scenario, s.store, s.days, s.house),
                   "a class view compares the scorecards of one exercise");
        continue;
      }
      const double house_profit = num(policies.at(1).at("metrics").at("profit"));
      ClassRow trainee = row_of(policies.at(0), card, file, house_profit);
      std::vector<ClassRow> refs;
      if (first) {
        for (size_t p = 1; p < policies.size(); ++p) {
          refs.push_back(row_of(policies.at(p), card, file, house_profit));
        }
      }
      // Nothing of a card is kept until all of it was read.
      have_first = true;
      if (seed != first_seed) s.same_seed = false;
      s.rows.push_back(std::move(trainee));
      references.insert(references.end(), refs.begin(), refs.end());
    } catch (const std::exception& e) {
      // nlohmann's messages start with "[json.exception.type_error.306] "; say it plainly.
      std::string why = e.what();
      if (why.starts_with("[json.exception.")) {
        const size_t close = why.find("] ");
        if (close != std::string::npos) why = why.substr(close + 2);
      }
      diag.error({file, 1, 1},
                 fmt::format("not a scorecard larder can read (damaged or edited?): {}", why),
                 "give folders written by larder drill, or their scorecard.json files");
    }
  }
  s.rows.insert(s.rows.end(), references.begin(), references.end());
  return s;
}

ClassSummary read_class(const std::vector<std::string>& inputs) {
  Diagnostics diag;
  std::vector<ScorecardSource> cards;
  std::vector<std::filesystem::path> seen;  // per input, its scorecard's canonical path
  for (size_t k = 0; k < inputs.size(); ++k) {
    std::filesystem::path file(inputs[k]);
    if (std::filesystem::is_directory(file)) file /= "scorecard.json";
    // The same scorecard twice (a folder and its file, or a repeated argument) would count a
    // trainee twice.
    std::error_code ec;
    std::filesystem::path canonical = std::filesystem::weakly_canonical(file, ec);
    if (ec) canonical = file;
    if (const auto twice = std::find(seen.begin(), seen.end(), canonical); twice != seen.end()) {
      diag.error({file.string(), 0, 0},
                 fmt::format("this scorecard is given more than once (first as {})",
                             inputs[static_cast<size_t>(twice - seen.begin())]),
                 "give each trainee's folder once");
      seen.push_back({});
      continue;
    }
    seen.push_back(canonical);
    BoundedText in = read_bounded(file.string(), kMaxScorecardBytes);
    if (!in.ok()) {
      diag.error({file.string(), 0, 0},
                 in.too_large ? fmt::format("larger than the limit of {} for a scorecard",
                                            size_in_words(kMaxScorecardBytes))
                              : fmt::format("cannot read the scorecard: {}", in.problem),
                 "give folders written by larder drill, or their scorecard.json files");
      continue;
    }
    cards.push_back({file.string(), std::move(in.text)});
  }
  ClassSummary s = parse_class(cards, diag);
  if (!diag.ok()) throw InputError(diag);
  return s;
}

std::string class_text(const ClassSummary& s) {
  std::string out = fmt::format("Class view: scenario {}, store {}, {} drill days{}\n\n",
                                s.scenario, s.store, s.days,
                                s.same_seed ? ""
                                            : " (trainees played different seeds: compare "
                                              "each with the house on their own demand)");
  size_t w = 12;
  for (const auto& r : s.rows) w = std::max(w, r.name.size() + 2);
  out += fmt::format("{:<{}}{:<12}{:>8}{:>10}{:>8}{:>12}{:>13}{:>8}{:>8}{:>9}{:>11}\n", "name", w,
                     "role", "waste", "in stock", "fill", "profit", "vs " + s.house, "chase",
                     "pull", "service", "justified");
  for (const auto& r : s.rows) {
    const auto pct = [](double v) {
      return std::isfinite(v) ? fmt::format("{:.1f}%", 100.0 * v) : std::string("");
    };
    const auto two = [](double v) {
      return std::isfinite(v) ? fmt::format("{:.2f}", v) : std::string("");
    };
    out += fmt::format("{:<{}}{:<12}{:>8}{:>10}{:>8}{:>12}{:>13}{:>8}{:>8}{:>9}{:>11}\n", r.name, w,
                       r.role, cell(r.waste_units, 0), pct(r.in_stock_at_close), pct(r.fill_rate),
                       cell(r.profit, 2), cell(r.profit_vs_house, 2), two(r.chasing_weight),
                       two(r.pull_to_center), pct(r.implied_service), pct(r.justified_service));
  }
  return out;
}

std::string class_csv(const ClassSummary& s) {
  std::string out =
      "name,role,source,waste_units,in_stock_at_close,fill_rate,profit,profit_vs_house,"
      "chasing_weight,pull_to_center,implied_service,justified_service\n";
  for (const auto& r : s.rows) {
    out +=
        fmt::format("{},{},{},{},{},{},{},{},{},{},{},{}\n", csv_field(r.name), csv_field(r.role),
                    csv_field(r.source), csv_number(r.waste_units), csv_number(r.in_stock_at_close),
                    csv_number(r.fill_rate), csv_number(r.profit), csv_number(r.profit_vs_house),
                    csv_number(r.chasing_weight), csv_number(r.pull_to_center),
                    csv_number(r.implied_service), csv_number(r.justified_service));
  }
  return out;
}

}  // namespace larder
