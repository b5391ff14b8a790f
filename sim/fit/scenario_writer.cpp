#include "sim/fit/scenario_writer.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "sim/scenario/csv_fields.hpp"
#include "sim/scenario/diagnostics.hpp"
#include "sim/scenario/ids.hpp"

namespace larder {

namespace {

/// A number with 5 significant digits, never in exponent form for ordinary values.
std::string num(double v) {
  return fmt::format("{:.5g}", v);
}

/// Text for a YAML double-quoted scalar: backslashes and quotes escaped, control characters as
/// \xNN (check_fit_writable refuses them in values; this keeps a comment or path harmless).
std::string quoted(const std::string& text) {
  std::string out;
  for (const char ch : text) {
    const auto byte = static_cast<unsigned char>(ch);
    if (byte < 0x20 || byte == 0x7f) {
      out += fmt::format("\\x{:02x}", byte);
      continue;
    }
    if (ch == '\\' || ch == '"') out += '\\';
    out += ch;
  }
  return out;
}

/// Text for the inside of a YAML comment: one line, control characters shown as \xNN.
std::string comment_text(const std::string& text) {
  return printable(text, 200);
}

// The loader's limits (load_scenario.cpp; README, "Limits") that the item file can break.
constexpr double kMaxMoney = 1e9;
constexpr int kMaxShelfLife = 365;

/// Whether `text` is valid UTF-8 without control characters (what YAML text may hold).
bool yaml_safe_text(const std::string& text) {
  size_t k = 0;
  while (k < text.size()) {
    const auto c = static_cast<unsigned char>(text[k]);
    if (c < 0x20 || c == 0x7f) return false;
    size_t more = 0;
    if (c >= 0x80) {
      if (c >= 0xc2 && c <= 0xdf) {
        more = 1;
      } else if (c >= 0xe0 && c <= 0xef) {
        more = 2;
      } else if (c >= 0xf0 && c <= 0xf4) {
        more = 3;
      } else {
        return false;
      }
      if (k + more >= text.size()) return false;
      for (size_t m = 1; m <= more; ++m) {
        if ((static_cast<unsigned char>(text[k + m]) >> 6) != 0x2) return false;
      }
    }
    k += more + 1;
  }
  return true;
}

const ItemRecord* find_item(const WriteOptions& o, const std::string& id) {
  for (const ItemRecord& r : o.items)
    if (r.id == id) return &r;
  return nullptr;
}

std::string weekdays_list(const std::array<bool, 7>& days) {
  std::string s;
  for (int w = 0; w < 7; ++w) {
    if (!days[w]) continue;
    if (!s.empty()) s += ", ";
    s += kWeekdayNames[w];
  }
  return s;
}

std::string se_text(double se) {
  return std::isfinite(se) ? num(se) : std::string("not determined");
}

}  // namespace

std::string cv_interval_text(const ItemEstimate& e) {
  if (std::isnan(e.cv_low)) return fmt::format("se {}", se_text(e.cv_se));
  const std::string hi = std::isfinite(e.cv_high) ? num(e.cv_high) : std::string("unbounded");
  if (e.cv_low_at_poisson)
    return fmt::format("95% profile interval 0 (the Poisson limit) to {}; no se at the limit", hi);
  return fmt::format("se {}; 95% profile interval {} to {}", se_text(e.cv_se), num(e.cv_low), hi);
}

namespace {

void write_item(std::string& y, const FitResult& r, const WriteOptions& o, int i) {
  const ItemEstimate& e = r.fit.items[i];
  const IntradayFit& in = r.intraday[i];
  const PersistenceFit& p = r.persistence[i];
  const double censored = e.days > 0 ? 100.0 * e.censored_days / e.days : 0.0;
  y += fmt::format("  # {}: {} store-days, {:.1f}% sold out; {} by AIC (", e.id, e.days, censored,
                   to_string(e.family));
  bool first = true;
  for (int f = 0; f < 3; ++f) {
    if (std::isnan(e.aic[f])) continue;
    y += fmt::format("{}{} {:.1f}", first ? "" : ", ", to_string(static_cast<DemandFamily>(f)),
                     e.aic[f]);
    first = false;
  }
  y += ")\n";
  y += fmt::format("  #   base {} (se {}); sales taken as demand would give {}\n", num(e.base),
                   se_text(e.base_se), num(e.naive_base));
  std::string wse;
  for (int w = 0; w < 7; ++w) {
    if (!e.weekday_seen[w]) continue;
    wse +=
        fmt::format("{}{} {}", wse.empty() ? "" : ", ", kWeekdayNames[w], se_text(e.weekday_se[w]));
  }
  y += fmt::format("  #   weekday se: {}\n", wse);
  if (e.family != DemandFamily::poisson) {
    y += fmt::format("  #   cv {} ({})\n", num(e.cv), cv_interval_text(e));
  } else if (!std::isnan(e.cv_low)) {
    y += fmt::format("  #   cv allowed by the {} fit: {}\n", to_string(e.cv_interval_family),
                     cv_interval_text(e));
  }
  if (in.exposure_base)
    y += fmt::format(
        "  #   base from sell-out times (exposure MLE, {} arrivals within the day, {} timed "
        "sell-outs): {} (se {})\n",
        e.family == DemandFamily::poisson ? "Poisson" : "gamma-mixed Poisson", in.timed_sellouts,
        num(*in.exposure_base), se_text(in.exposure_se));
  for (const PersistenceFit* q : {&p, &r.persistence_lag1[static_cast<size_t>(i)]}) {
    if (std::isnan(q->correlation)) continue;
    y += fmt::format(
        "  #   lag-{} correlation {:.3f} (95% interval {:.3f} to {:.3f}, {} pairs, censored "
        "pairwise likelihood): {}\n",
        q->lag, q->correlation, q->low, q->high, q->pairs,
        q->distinguishable() ? "told from 0" : "not told from 0");
  }
  if (!e.converged) y += "  #   warning: the likelihood search did not converge\n";
  y += fmt::format("  - id: {}\n", e.id);
  if (const ItemRecord* rec = find_item(o, e.id)) {
    std::string attributes;  // blank cells: the item has no such attribute
    for (const auto& [key, value] : rec->attributes) {
      if (value.empty()) continue;
      attributes += fmt::format("{} {}: \"{}\"", attributes.empty() ? "" : ",", key, quoted(value));
    }
    if (!attributes.empty()) y += fmt::format("    attributes: {{{} }}\n", attributes);
    y += fmt::format("    price: {}\n    unit_cost: {}\n    shelf_life_days: {}\n", rec->price,
                     rec->unit_cost, rec->shelf_life_days);
  } else {
    y += "    price: 1        # PLACEHOLDER: not in the history; set the real price\n";
    y += "    unit_cost: 0.5  # PLACEHOLDER: set the real unit cost\n";
  }
  y += "    demand:\n";
  y += fmt::format("      base: {}\n", num(e.base));
  std::string wd;
  for (int w = 0; w < 7; ++w) {
    if (!e.weekday_seen[w]) continue;
    wd += fmt::format("{}{}: {}", wd.empty() ? "" : ", ", kWeekdayNames[w], num(e.weekday[w]));
  }
  y += fmt::format("      weekday: {{ {} }}\n", wd);
  y += fmt::format("      distribution: {}\n", to_string(e.family));
  if (e.family != DemandFamily::poisson) y += fmt::format("      cv: {}\n", num(e.cv));
  if (!in.shares.empty()) {
    std::string w;
    for (const double s : in.shares) w += fmt::format("{}{}", w.empty() ? "" : ", ", num(s));
    y += fmt::format("      intraday: [{}]  # from {} days that did not sell out\n", w,
                     in.profile_days);
  }
  if (r.substitution_asked) {
    std::string all, written;
    double sum = 0;
    for (const SubstituteShare& x : r.substitution) {
      if (x.out_item != i) continue;
      all += fmt::format("{}{} {:.3f} (se {:.3f}, {} store-days)", all.empty() ? "" : ", ",
                         r.data.items[x.substitute], x.share, x.se, x.store_days);
      if (x.share > 2 * x.se) sum += std::min(x.share, 1.0);
    }
    const double scale = sum > 1.0 ? 1.0 / sum : 1.0;
    for (const SubstituteShare& x : r.substitution) {
      if (x.out_item != i || !(x.share > 2 * x.se)) continue;
      written += fmt::format("{}{}: {}", written.empty() ? "" : ", ", r.data.items[x.substitute],
                             num(std::min(x.share, 1.0) * scale));
    }
    y += fmt::format(
        "    # substitution when out (joint censored likelihood): {}\n",
        all.empty() ? std::string("too few days on which this item sold out first") : all);
    if (!written.empty()) y += fmt::format("    substitutes: {{ {} }}\n", written);
  }
}

}  // namespace

FitResult fit_history(FitData data, const FitOptions& options) {
  FitResult r;
  r.data = std::move(data);
  FitOptions first = options;
  first.intervals = options.intervals && !options.substitution;  // refitted with the shares
  r.fit = fit_decomposition(r.data, first);
  const int n = static_cast<int>(r.data.items.size());
  for (int i = 0; i < n; ++i) r.intraday.push_back(fit_intraday(r.data, r.fit, i));
  r.substitution_asked = options.substitution;
  if (options.substitution) {
    SubstitutionFit s = fit_substitution(r.data, options, r.fit, r.intraday);
    r.substitution = std::move(s.shares);
    r.extra = std::move(s.extra);
    r.substitutes_from = std::move(s.substitutes_from);
    r.substitution_rounds = s.rounds;
    r.substitution_converged = s.converged || s.rounds == 0;
    for (int i = 0; i < n; ++i)
      r.intraday[static_cast<size_t>(i)] = fit_intraday(r.data, r.fit, i, r.substitutes_from);
  }
  for (int i = 0; i < n; ++i) {
    r.persistence.push_back(fit_persistence(r.data, r.fit, i, 7, r.extra));
    r.persistence_lag1.push_back(fit_persistence(r.data, r.fit, i, 1, r.extra));
  }
  return r;
}

std::string replay_orders_csv(const FitResult& r) {
  std::string out = "store,item,day,quantity\n";
  for (const FitDay& d : r.data.rows) {
    if (d.delivered <= 0 || !r.fit.items[d.item].fitted || !r.fit.stores[d.store].fitted) continue;
    out += fmt::format("{},{},{},{}\n", r.data.stores[d.store], r.data.items[d.item], d.day - 1,
                       d.delivered);
  }
  return out;
}

std::vector<std::string> items_without_prices(const FitResult& r, const WriteOptions& o) {
  std::vector<std::string> out;
  for (const ItemEstimate& e : r.fit.items)
    if (e.fitted && !find_item(o, e.id)) out.push_back(e.id);
  return out;
}

void check_fit_writable(const FitData& d, const WriteOptions& o) {
  Diagnostics diag;
  const std::string hint = fmt::format(
      "a fitted scenario names stores and items by these ids, which may hold only {}; rename "
      "them in the history (and the item file) first",
      kIdCharacters);
  for (const auto& [what, ids] : {std::pair{"store", &d.stores}, std::pair{"item", &d.items}}) {
    for (const std::string& id : *ids) {
      if (const std::string problem = id_problem(id); !problem.empty()) {
        diag.error(
            {o.history_file, 0, 0},
            fmt::format("{} id '{}' {}: a scenario cannot hold it", what, printable(id), problem),
            hint);
      }
    }
  }
  for (const ItemRecord& rec : o.items) {
    if (std::find(d.items.begin(), d.items.end(), rec.id) == d.items.end()) continue;
    const auto where = Location{o.items_file, 0, 0};
    for (const auto& [name, v] :
         {std::pair{"price", rec.price}, std::pair{"unit_cost", rec.unit_cost}}) {
      if (v > kMaxMoney) {
        diag.error(where,
                   fmt::format("item '{}': {} {} is above the scenario limit of {}", rec.id, name,
                               v, kMaxMoney),
                   "README, Limits: prices and costs per unit are at most 1e9");
      }
    }
    if (rec.shelf_life_days > kMaxShelfLife) {
      diag.error(where,
                 fmt::format("item '{}': shelf_life_days {} is above the scenario limit of {}",
                             rec.id, rec.shelf_life_days, kMaxShelfLife));
    }
    for (const auto& [key, value] : rec.attributes) {
      if (const std::string problem = id_problem(key); !problem.empty()) {
        diag.error(where,
                   fmt::format("attribute name '{}' {}: a scenario cannot hold it", printable(key),
                               problem),
                   fmt::format("attribute names may hold only {}", kIdCharacters));
      } else if (!value.empty() && !yaml_safe_text(value)) {
        diag.error(where,
                   fmt::format("item '{}': attribute {} '{}' holds control characters or bytes "
                               "that are not UTF-8 text",
                               rec.id, key, printable(value)));
      }
    }
  }
  if (!diag.ok()) throw InputError(std::move(diag));
}

std::string fitted_scenario_yaml(const FitResult& r, const WriteOptions& o) {
  const FitData& d = r.data;
  check_fit_writable(d, o);
  bool any_item = false, any_store = false;
  for (const auto& e : r.fit.items) any_item = any_item || e.fitted;
  for (const auto& s : r.fit.stores) any_store = any_store || s.fitted;
  if (!any_item || !any_store) {
    Diagnostics diag;
    diag.error({o.history_file, 0, 0},
               any_store ? "no item has enough data to fit" : "no store has enough data to fit",
               "an item needs at least 28 days that did not sell out, 3 on each weekday it sells");
    throw InputError(std::move(diag));
  }
  const CivilDate last = add_days(d.first_date, d.days - 1);
  std::string y;
  y += fmt::format("# Fitted by `larder fit` from {}: {} rows, {} to {}, {} stores, {} items.\n",
                   comment_text(o.history_file), d.rows.size(), to_iso(d.first_date), to_iso(last),
                   d.stores.size(), d.items.size());
  y += "# Demand is corrected for sell-outs: a sold-out day counts as demand >= sales in a\n"
       "# censored likelihood (README, \"Fitting a history\"). Standard errors (se) hold the\n"
       "# store sizes at their estimates. Results are model estimates.\n";
  if (o.items_file.empty()) {
    y += "# PLACEHOLDERS: no --items file was given, so every price and unit_cost below is a\n"
         "# marked placeholder (price 1, unit_cost 0.5): set them before comparing profits.\n";
  } else {
    y += fmt::format("# Prices, costs and shelf lives from {}.\n", comment_text(o.items_file));
  }
  y += "format: 1\n";
  y += fmt::format("name: {}\n", o.name);
  y += "seed: 1\n";
  if (!o.replay_orders.empty()) {
    y += fmt::format(
        "horizon: {{ days: {}, warmup_days: 0, start_date: {} }}  # the history's own dates\n",
        d.days, to_iso(d.first_date));
    y += fmt::format("replications: {}\n", o.replications);
  } else if (add_days(last, 1 + 364).year <= 9999) {
    // The year after the history, dated when its last day is a date the loader reads
    // (up to 9999-12-31); else only its weekday.
    y += fmt::format(
        "horizon: {{ days: 364, warmup_days: 28, start_date: {} }}  # the year after "
        "the history\n",
        to_iso(add_days(last, 1)));
    y += "replications: 100\n";
  } else {
    y += fmt::format(
        "horizon: {{ days: 364, warmup_days: 28, start_weekday: {} }}  # the history ends "
        "too close to 9999-12-31 for dates\n",
        kWeekdayNames[static_cast<size_t>(weekday_of_date(add_days(last, 1)))]);
    y += "replications: 100\n";
  }
  if (d.columns.hours > 0) {
    y += fmt::format(
        "calendar:\n  hours: {{ open: {}, close: {} }}  # the history's hourly columns\n",
        d.columns.first_hour, d.columns.first_hour + d.columns.hours);
  }
  y += "stores:\n";
  for (const StoreEstimate& s : r.fit.stores) {
    if (!s.fitted) {
      y += fmt::format("  # left out: {} ({})\n", s.id, s.problem);
      continue;
    }
    y += fmt::format("  - {{ id: {}, size: {}", s.id, num(s.size));
    if (weekdays_list(s.open_weekdays) != weekdays_list({true, true, true, true, true, true, true}))
      y += fmt::format(", open_weekdays: [{}]", weekdays_list(s.open_weekdays));
    y += fmt::format(" }}  # se {}, {} store-item-days\n", se_text(s.size_se), s.days);
  }
  y += "items:\n";
  for (int i = 0; i < static_cast<int>(r.fit.items.size()); ++i) {
    const ItemEstimate& e = r.fit.items[i];
    if (!e.fitted) {
      y += fmt::format("  # left out: {} ({})\n", e.id, e.problem);
      continue;
    }
    write_item(y, r, o, i);
  }
  if (!o.replay_orders.empty()) {
    y += fmt::format(
        "policies:\n"
        "  - name: history-deliveries\n"
        "    forecast: {{ method: ses_weekday }}\n"
        "    quantity: {{ rule: replay, file: \"{}\" }}\n",
        quoted(o.replay_orders));
    return y;
  }
  y += "# Starting policies: the same forecast and rule, with and without the censoring "
       "correction.\n";
  y += "policies:\n"
       "  - name: newsvendor-on-sales\n"
       "    forecast: { method: ses_weekday, alpha: 0.3 }\n"
       "    censoring: ignore\n"
       "    quantity: { rule: critical_fractile }\n"
       "  - name: newsvendor-corrected\n"
       "    forecast: { method: ses_weekday, alpha: 0.3 }\n"
       "    censoring: normal_tail\n"
       "    quantity: { rule: critical_fractile }\n";
  return y;
}

}  // namespace larder
