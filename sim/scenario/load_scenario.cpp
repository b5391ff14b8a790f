#include "sim/scenario/load_scenario.hpp"

#include <fmt/format.h>

#include <algorithm>
#include <cerrno>
#include <charconv>
#include <filesystem>
#include <fstream>
#include <limits>
#include <map>
#include <new>
#include <random>
#include <sstream>
#include <system_error>
#include <utility>

#include "sim/scenario/bounded_read.hpp"
#include "sim/scenario/duplicate_keys.hpp"
#include "sim/scenario/generated_stores.hpp"
#include "sim/scenario/ids.hpp"
#include "sim/scenario/intraday_profile.hpp"
#include "sim/scenario/iso_date.hpp"
#include "sim/scenario/params.hpp"
#include "sim/scenario/seed_text.hpp"
#include "sim/scenario/weekdays.hpp"
#include "sim/scenario/yaml_guard.hpp"
#include "sim/scenario/yaml_stall.hpp"

namespace larder {

namespace {

constexpr int kMaxGeneratedStores = 1000000;
// Upper bounds that keep counts within `int`, arrays small and sums finite (README, "Limits").
constexpr int kMaxDays = 100000;  ///< horizon.days: about 270 years
constexpr int kMaxShelfLife = 365;
constexpr int kMaxLeadTime = 365;
constexpr int kMaxPackSize = 1000000;
constexpr int kMaxShelfCapacity = 1000000000;
constexpr double kMaxDailyMean = 1e8;  ///< demand per store-item-day, after every factor
constexpr double kMaxFactor = 1000;    ///< weekday, event, store-size and uplift factors
constexpr double kMaxMoney = 1e9;      ///< any price, cost or value per unit (and kg per unit)
/// Slack for sums of shares written in decimal (0.34 + 0.56 + 0.1 is a little above 1 in binary).
constexpr double kShareSumSlack = 1e-9;

// ---------------------------------------------------------------------------------------------
// Small helpers shared by the sections.

/// Whether `key` is written in `p`'s mapping (even with an empty value); marks it as known.
bool written(Params& p, std::string_view key) {
  return p.raw(key).IsDefined();
}

/// Reports that a required key is missing (at the key when written empty, else at the mapping).
void report_required(Params& p, std::string_view key, std::string hint = {}) {
  p.diagnostics().error(p.key_location(key), fmt::format("{} is required", p.path_of(key)),
                        std::move(hint));
}

/// "a, b, c".
std::string join(const std::vector<std::string>& names) {
  std::string out;
  for (const auto& n : names) out += (out.empty() ? "" : ", ") + n;
  return out;
}

/// The name in `names` closest to `word` when it is close enough to be a likely typo.
std::string closest_name(const std::string& word, const std::vector<std::string>& names) {
  std::string best;
  int best_d = 3;
  for (const auto& n : names) {
    const int d = edit_distance(word, n);
    if (d < best_d) best_d = d, best = n;
  }
  return best;
}

/// Reads a required id or name; reports it missing or malformed.
std::optional<std::string> read_id(Params& p, std::string_view key) {
  if (!p.has(key)) {
    report_required(p, key);
    return std::nullopt;
  }
  auto v = p.optional_text(key);
  if (!v) return std::nullopt;
  const std::string problem = id_problem(*v);
  if (!problem.empty()) {
    p.error(key, fmt::format("{} {}", p.path_of(key), problem));
    return std::nullopt;
  }
  return v;
}

/// Where an id was first used, for the "already used" hint.
struct FirstUse {
  std::string owner;  ///< e.g. "stores[0]"
  int line = 0;
};
using IdRegistry = std::map<std::string, FirstUse>;

/// Records id `id` of `owner` (read from `key` of `p`); reports it when already taken.
bool claim_id(IdRegistry& ids, const std::string& id, const std::string& owner, Params& p,
              std::string_view key) {
  const auto [it, inserted] = ids.emplace(id, FirstUse{owner, p.location(key).line});
  if (inserted) return true;
  p.error(key, fmt::format("{} '{}' is already used by {}", p.path_of(key), id, it->second.owner),
          fmt::format("{}.{} is at line {}", it->second.owner, key, it->second.line));
  return false;
}

/// Reads `attributes: { name: value, ... }` into `out` (existing entries are overwritten, so
/// item_defaults' attributes merge key by key).
void read_attributes(Params& p, std::map<std::string, std::string>& out) {
  if (!p.has("attributes")) return;
  const YAML::Node node = p.raw("attributes");
  const std::string path = p.path_of("attributes");
  Diagnostics& diag = p.diagnostics();
  if (!node.IsMap()) {
    diag.error(location_of(node, p.file()),
               fmt::format("{} must be a mapping from name to value such as {{ type: bread }} "
                           "(got {})",
                           path, describe_value(node)));
    return;
  }
  for (const auto& kv : node) {
    if (!kv.first.IsScalar()) {
      diag.error(location_of(kv.first, p.file()), fmt::format("{} must have names as keys (got {})",
                                                              path, describe_value(kv.first)));
      continue;
    }
    const std::string& name = kv.first.Scalar();
    const std::string problem = id_problem(name);
    if (!problem.empty()) {
      diag.error(location_of(kv.first, p.file()),
                 fmt::format("attribute name in {} {}", path, problem));
      continue;
    }
    if (!kv.second.IsScalar() || kv.second.Scalar().empty()) {
      diag.error(location_of(kv.second, p.file()),
                 fmt::format("{}.{} must be a single non-empty value (got {})", path, name,
                             describe_value(kv.second)));
      continue;
    }
    out.insert_or_assign(name, kv.second.Scalar());
  }
}

/// Reads a policy part: a mapping naming its method under `name_key` (or, when `scalar_ok`,
/// just the method name). The part's other keys are validated by the part itself later.
std::optional<PartSpec> read_part(const YAML::Node& node, const std::string& path,
                                  const char* name_key, bool scalar_ok, const std::string& file,
                                  Diagnostics& diag) {
  const Location where = location_of(node, file);
  if (node.IsScalar() && scalar_ok) {
    if (node.Scalar().empty()) {
      diag.error(where, fmt::format("{} must name a {}", path, name_key));
      return std::nullopt;
    }
    return PartSpec{node.Scalar(), node, where, path};
  }
  if (!node.IsMap()) {
    diag.error(where,
               fmt::format("{} must be {}a mapping with a {} (got {})", path,
                           scalar_ok ? fmt::format("a {} name or ", name_key) : "", name_key,
                           describe_value(node)),
               node.IsScalar() ? fmt::format("write {{ {}: {} }}", name_key, node.Scalar())
                               : std::string{});
    return std::nullopt;
  }
  const YAML::Node name = node[name_key];
  if (!name.IsDefined() || name.IsNull()) {
    diag.error(where, fmt::format("{}.{} is required", path, name_key));
    return std::nullopt;
  }
  if (!name.IsScalar() || name.Scalar().empty()) {
    diag.error(location_of(name, file),
               fmt::format("{}.{} must be a name (got {})", path, name_key, describe_value(name)));
    return std::nullopt;
  }
  return PartSpec{name.Scalar(), node, where, path};
}

// ---------------------------------------------------------------------------------------------
// Items are read in two steps: every written field of item_defaults and of each item is
// validated where it is written, then the two are merged key by key (the item's keys win) and
// the rules that need the merged item (required keys, spread parameters, salvage) are checked.

/// One field as written: `given` even when its value was rejected (so that it is not reported
/// again as missing, nor replaced by the default).
template <class T>
struct Field {
  bool given = false;
  std::optional<T> value;
  Location where;  ///< of the value
};

template <class T>
const Field<T>& pick(const Field<T>& item, const Field<T>& defaults) {
  return item.given ? item : defaults;
}

/// `demand.intraday` as written: a profile name, or one weight per opening hour.
struct IntradayDraft {
  std::string profile = "flat";
  std::vector<double> weights;
};

struct DemandDraft {
  bool given = false;
  bool broken = false;  ///< written but not a mapping: its fields are unknown
  Location where;
  Field<double> base;
  Field<WeekdayValues> weekday;
  Field<DemandFamily> family;
  Field<double> cv;
  Field<double> dispersion;
  Field<IntradayDraft> intraday;
};

/// `next_day` as written (merged from item_defaults as a whole mapping).
struct NextDayDraft {
  Field<double> price;
  Field<Leftovers> fallback;
  Field<double> bargain_demand;
};

/// `markdown` as written (merged from item_defaults as a whole mapping).
struct MarkdownDraft {
  Field<int> from_hour;
  Field<double> price;
  Field<double> uplift;
  bool surplus_only = false;
};

/// One `substitutes` entry as written; the id is resolved once every item has been read.
struct SubstituteRef {
  std::string id;
  double share = 0.0;
  Location where;  ///< of the id
};

struct ItemDraft {
  Field<double> price, unit_cost, salvage_value, disposal_cost, stockout_penalty, weight_kg,
      co2e_kg;
  Field<int> shelf_life_days, pack_size, shelf_capacity;
  Field<Leftovers> leftovers;
  Field<NextDayDraft> next_day;   ///< value empty when written but not a mapping
  Field<MarkdownDraft> markdown;  ///< value empty when written but not a mapping
  std::vector<SubstituteRef> substitutes;
  std::map<std::string, std::string> attributes;
  DemandDraft demand;
};

/// What the item fields need from the sections read before the items.
struct ItemContext {
  int open_hour = 8;
  int close_hour = 20;
  bool hours_ok = true;   ///< calendar.hours is valid, so hour rules can be checked against it
  bool defaults = false;  ///< reading item_defaults rather than an item
};

Field<double> number_field(Params& p, std::string_view key, Range range) {
  Field<double> f;
  f.given = p.has(key);
  if (f.given) {
    f.where = p.location(key);
    f.value = p.optional_number(key, range);
  }
  return f;
}

Field<int> integer_field(Params& p, std::string_view key, Range range) {
  Field<int> f;
  f.given = p.has(key);
  if (f.given) {
    f.where = p.location(key);
    f.value = p.optional_integer(key, range);
  }
  return f;
}

/// "1 weight", "3 weights".
std::string count_of(size_t n, std::string_view noun) {
  return fmt::format("{} {}{}", n, noun, n == 1 ? "" : "s");
}

/// Reads `demand.intraday`: a profile name or a list of non-negative weights, one per opening
/// hour, not all zero.
std::optional<IntradayDraft> read_intraday(const YAML::Node& node, const std::string& path,
                                           const ItemContext& ctx, const std::string& file,
                                           Diagnostics& diag) {
  const std::vector<std::string> names(kIntradayProfiles.begin(), kIntradayProfiles.end());
  const Location where = location_of(node, file);
  if (node.IsScalar()) {
    const std::string& name = node.Scalar();
    if (is_intraday_profile(name)) return IntradayDraft{name, {}};
    const std::string near = closest_name(name, names);
    diag.error(where,
               fmt::format("{} must be a profile name ({}) or a list of hourly weights (got {})",
                           path, join(names), name),
               near.empty() ? std::string{} : fmt::format("did you mean '{}'?", near));
    return std::nullopt;
  }
  if (!node.IsSequence()) {
    diag.error(where,
               fmt::format("{} must be a profile name ({}) or a list of hourly weights such as "
                           "[1, 2, 1] (got {})",
                           path, join(names), describe_value(node)));
    return std::nullopt;
  }
  IntradayDraft d;
  bool ok = true;
  for (size_t i = 0; i < node.size(); ++i) {
    const auto w =
        read_number(node[i], fmt::format("{}[{}]", path, i), Range::at_least(0), file, diag);
    if (w) d.weights.push_back(*w);
    ok = ok && w.has_value();
  }
  const int hours = ctx.close_hour - ctx.open_hour;
  if (ctx.hours_ok && static_cast<int>(node.size()) != hours) {
    diag.error(
        where,
        fmt::format("{} gives {} but the calendar has {} opening hours ({}:00 to {}:00)", path,
                    count_of(node.size(), "weight"), hours, ctx.open_hour, ctx.close_hour),
        "give one weight per opening hour, from calendar.hours.open to "
        "calendar.hours.close");
    return std::nullopt;
  }
  if (!ok) return std::nullopt;
  if (std::all_of(d.weights.begin(), d.weights.end(), [](double w) { return w == 0.0; })) {
    diag.error(where, fmt::format("{} weights are all zero", path),
               "at least one opening hour must have customers");
    return std::nullopt;
  }
  return d;
}

void read_demand_fields(Params& p, DemandDraft& d, const ItemContext& ctx) {
  d.base = number_field(p, "base", Range::between(0, kMaxDailyMean));
  if (p.has("weekday")) {
    d.weekday.given = true;
    d.weekday.where = p.location("weekday");
    d.weekday.value = read_weekday_values(p.raw("weekday"), p.path_of("weekday"),
                                          Range::between(0, kMaxFactor), p.file(), p.diagnostics());
  }
  if (p.has("distribution")) {
    d.family.given = true;
    d.family.where = p.location("distribution");
    const std::string f = p.choice("distribution", "", {"poisson", "negative_binomial", "normal"});
    if (f == "poisson") d.family.value = DemandFamily::poisson;
    if (f == "negative_binomial") d.family.value = DemandFamily::negative_binomial;
    if (f == "normal") d.family.value = DemandFamily::normal;
  }
  d.cv = number_field(p, "cv", Range::between(0, 100));
  d.dispersion = number_field(p, "dispersion", Range::at_least(0.001));
  if (p.has("intraday")) {
    d.intraday.given = true;
    d.intraday.where = p.location("intraday");
    d.intraday.value =
        read_intraday(p.raw("intraday"), p.path_of("intraday"), ctx, p.file(), p.diagnostics());
  }
}

/// Reads a disposition choice among `options` into `f`.
void read_leftovers(Params& p, std::string_view key,
                    std::initializer_list<std::string_view> options, Field<Leftovers>& f) {
  if (!p.has(key)) return;
  f.given = true;
  f.where = p.location(key);
  const std::string l = p.choice(key, "", options);
  for (const Leftovers v :
       {Leftovers::discard, Leftovers::salvage, Leftovers::donate, Leftovers::discount_next_day}) {
    if (l == to_string(v)) f.value = v;
  }
}

void read_next_day(Params& p, Field<NextDayDraft>& f) {
  f.given = p.has("next_day");
  if (!f.given) return;
  f.where = p.location("next_day");
  auto np = p.mapping("next_day");
  if (!np) return;
  NextDayDraft d;
  d.price = number_field(*np, "price", Range::between(0, kMaxMoney));
  read_leftovers(*np, "fallback", {"discard", "salvage", "donate"}, d.fallback);
  d.bargain_demand = number_field(*np, "bargain_demand", Range::between(0, kMaxDailyMean));
  np->finish();
  f.value = d;
}

void read_markdown(Params& p, Field<MarkdownDraft>& f, const ItemContext& ctx) {
  f.given = p.has("markdown");
  if (!f.given) return;
  f.where = p.location("markdown");
  auto mp = p.mapping("markdown");
  if (!mp) return;
  MarkdownDraft d;
  if (!mp->has("from_hour")) {
    report_required(*mp, "from_hour",
                    "the clock hour from which units on their last day sell at the markdown "
                    "price, e.g. from_hour: 17");
  } else {
    d.from_hour = integer_field(*mp, "from_hour", Range{});
    const auto h = d.from_hour.value;
    if (h && ctx.hours_ok && !(ctx.open_hour < *h && *h < ctx.close_hour)) {
      mp->error("from_hour",
                fmt::format("{} must be after calendar.hours.open ({}) and before "
                            "calendar.hours.close ({}) (got {})",
                            mp->path_of("from_hour"), ctx.open_hour, ctx.close_hour, *h),
                "the markdown price applies from that clock hour until closing");
      d.from_hour.value.reset();
    }
  }
  d.price = number_field(*mp, "price", Range::between(0, kMaxMoney));
  d.uplift = number_field(*mp, "uplift", Range::between(0, kMaxFactor));
  d.surplus_only = mp->boolean("surplus_only", false);
  mp->finish();
  f.value = d;
}

/// Reads `substitutes: { id: share, ... }` (ids are resolved once every item is read).
void read_substitutes(Params& p, std::vector<SubstituteRef>& out) {
  if (!p.has("substitutes")) return;
  const YAML::Node node = p.raw("substitutes");
  const std::string path = p.path_of("substitutes");
  Diagnostics& diag = p.diagnostics();
  if (!node.IsMap()) {
    diag.error(location_of(node, p.file()),
               fmt::format("{} must be a mapping from item id to share such as {{ rye: 0.25 }} "
                           "(got {})",
                           path, describe_value(node)));
    return;
  }
  bool ok = true;
  double sum = 0.0;
  for (const auto& kv : node) {
    if (!kv.first.IsScalar() || kv.first.Scalar().empty()) {
      diag.error(
          location_of(kv.first, p.file()),
          fmt::format("{} must have item ids as keys (got {})", path, describe_value(kv.first)));
      ok = false;
      continue;
    }
    const std::string& id = kv.first.Scalar();
    const auto share = read_number(kv.second, fmt::format("{}.{}", path, id), Range::probability(),
                                   p.file(), diag);
    if (!share) {
      ok = false;
      continue;
    }
    sum += *share;
    out.push_back({id, *share, location_of(kv.first, p.file())});
  }
  if (ok && sum > 1.0 + kShareSumSlack) {
    diag.error(p.key_location("substitutes"),
               fmt::format("{} shares sum to {:.6g}; they must sum to at most 1", path, sum),
               "a share is the probability that a customer who finds this item out tries that "
               "item; the rest leave");
  }
}

/// Reads every item key but `id` that is written in `p` (an item or item_defaults).
void read_item_fields(Params& p, ItemDraft& d, const ItemContext& ctx) {
  d.price = number_field(p, "price", Range::between(0, kMaxMoney));
  d.unit_cost = number_field(p, "unit_cost", Range::between(0, kMaxMoney));
  d.shelf_life_days = integer_field(p, "shelf_life_days", Range::between(1, kMaxShelfLife));
  d.pack_size = integer_field(p, "pack_size", Range::between(1, kMaxPackSize));
  d.shelf_capacity = integer_field(p, "shelf_capacity", Range::between(1, kMaxShelfCapacity));
  read_leftovers(p, "leftovers", {"discard", "salvage", "donate", "discount_next_day"},
                 d.leftovers);
  read_next_day(p, d.next_day);
  read_markdown(p, d.markdown, ctx);
  d.salvage_value = number_field(p, "salvage_value", Range::between(0, kMaxMoney));
  d.disposal_cost = number_field(p, "disposal_cost", Range::between(0, kMaxMoney));
  d.stockout_penalty = number_field(p, "stockout_penalty", Range::between(0, kMaxMoney));
  d.weight_kg = number_field(p, "weight_kg", Range::between(0, kMaxMoney));
  d.co2e_kg = number_field(p, "co2e_kg", Range::between(0, kMaxMoney));
  read_attributes(p, d.attributes);
  if (p.has("demand")) {
    d.demand.given = true;
    d.demand.where = p.location("demand");
    if (auto dp = p.mapping("demand")) {
      read_demand_fields(*dp, d.demand, ctx);
      dp->finish();
    } else {
      d.demand.broken = true;
    }
  }
  if (ctx.defaults) {
    if (written(p, "substitutes")) {
      p.diagnostics().error(p.key_location("substitutes"), "item_defaults cannot set substitutes",
                            "give substitutes per item: they name other items");
    }
  } else {
    read_substitutes(p, d.substitutes);
  }
}

/// Merges an item with item_defaults and checks the rules of the whole item. Problems go to
/// `p`'s diagnostics; the returned item is complete only when none were found.
Item build_item(const ItemDraft& it, const ItemDraft& def, Params& p) {
  Item item;
  item.attributes = it.attributes;  // already merged over the defaults' attributes
  const auto required_number = [&](const Field<double>& a, const Field<double>& b,
                                   std::string_view key) {
    const Field<double>& f = pick(a, b);
    if (!f.given) report_required(p, key);
    return f.value;
  };
  const auto price = required_number(it.price, def.price, "price");
  const auto unit_cost = required_number(it.unit_cost, def.unit_cost, "unit_cost");
  item.price = price.value_or(0.0);
  item.unit_cost = unit_cost.value_or(0.0);
  item.shelf_life_days = pick(it.shelf_life_days, def.shelf_life_days).value.value_or(1);
  item.pack_size = pick(it.pack_size, def.pack_size).value.value_or(1);
  item.shelf_capacity = pick(it.shelf_capacity, def.shelf_capacity).value;
  const Field<Leftovers>& leftovers = pick(it.leftovers, def.leftovers);
  item.leftovers = leftovers.value.value_or(Leftovers::discard);
  const Field<double>& salvage = pick(it.salvage_value, def.salvage_value);
  item.salvage_value = salvage.value.value_or(0.0);
  item.disposal_cost = pick(it.disposal_cost, def.disposal_cost).value.value_or(0.0);
  item.stockout_penalty = pick(it.stockout_penalty, def.stockout_penalty).value.value_or(0.0);
  item.weight_kg = pick(it.weight_kg, def.weight_kg).value;
  item.co2e_kg = pick(it.co2e_kg, def.co2e_kg).value;

  // A discounted price is at most the item's price [half of it]; `f` is the price as written,
  // in the item or in item_defaults.
  const auto discounted_price = [&](const Field<double>& f, std::string_view key,
                                    bool from_defaults) {
    if (!f.value) return item.price / 2.0;
    if (price && *f.value > item.price) {
      p.diagnostics().error(
          f.where,
          fmt::format("{}.price ({}) must be at most {} ({})", p.path_of(key), *f.value,
                      p.path_of("price"), item.price),
          from_defaults ? fmt::format("{} comes from item_defaults (line {}); a discounted unit "
                                      "sells at most at the full price",
                                      key, f.where.line)
                        : std::string("a discounted unit sells at most at the full price"));
    }
    return *f.value;
  };

  // Next-day discount: set, with its defaults, exactly when leftovers is discount_next_day.
  const bool leftovers_known = !leftovers.given || leftovers.value;
  if (it.next_day.given && leftovers_known && item.leftovers != Leftovers::discount_next_day) {
    p.diagnostics().error(it.next_day.where,
                          fmt::format("{} is given but {} is {}", p.path_of("next_day"),
                                      p.path_of("leftovers"), to_string(item.leftovers)),
                          "set leftovers: discount_next_day to sell leftovers one more day at "
                          "next_day.price, or remove next_day");
  }
  const Field<NextDayDraft>& next_day = pick(it.next_day, def.next_day);
  Field<Leftovers> fallback;
  if (item.leftovers == Leftovers::discount_next_day) {
    NextDayDiscount nd;
    nd.price = item.price / 2.0;
    if (next_day.value) {
      nd.price = discounted_price(next_day.value->price, "next_day", !it.next_day.given);
      fallback = next_day.value->fallback;
      nd.fallback = fallback.value.value_or(Leftovers::discard);
      nd.bargain_demand = next_day.value->bargain_demand.value.value_or(0.0);
    }
    item.next_day = nd;
  }

  // Units leaving by salvage (directly, or after their discounted day) must not pay to order.
  const Field<Leftovers>* salvaged_by = nullptr;
  if (leftovers.value == Leftovers::salvage) salvaged_by = &leftovers;
  if (item.next_day && fallback.value == Leftovers::salvage) salvaged_by = &fallback;
  if (salvaged_by && unit_cost && (!salvage.given || salvage.value) &&
      item.salvage_value >= item.unit_cost) {
    p.diagnostics().error(
        salvage.given ? salvage.where : salvaged_by->where,
        fmt::format("{} ({}) must be less than {} ({}) when {} is salvage",
                    p.path_of("salvage_value"), item.salvage_value, p.path_of("unit_cost"),
                    item.unit_cost, salvaged_by == &fallback ? "next_day.fallback" : "leftovers"),
        "otherwise every extra unit ordered would pay");
  }

  // Evening markdown, merged as a whole mapping.
  if (const Field<MarkdownDraft>& markdown = pick(it.markdown, def.markdown); markdown.value) {
    Markdown m;
    m.from_hour = markdown.value->from_hour.value.value_or(0);
    m.price = discounted_price(markdown.value->price, "markdown", !it.markdown.given);
    m.uplift = markdown.value->uplift.value.value_or(0.0);
    m.surplus_only = markdown.value->surplus_only;
    item.markdown = m;
  }

  // Demand: merged key by key; nothing more can be said when either side is not a mapping.
  if (!it.demand.given && !def.demand.given) {
    report_required(p, "demand", "e.g. demand: { base: 20 }");
    return item;
  }
  if (it.demand.broken || def.demand.broken) return item;
  const std::string demand_path = p.path_of("demand");
  const Location demand_where = it.demand.given ? it.demand.where : p.location();
  const Field<double>& base = pick(it.demand.base, def.demand.base);
  if (!base.given) {
    p.diagnostics().error(demand_where, fmt::format("{}.base is required", demand_path),
                          "base is the mean demand per open day at a size-1 store");
  }
  item.demand.base = base.value.value_or(0.0);
  if (const auto& w = pick(it.demand.weekday, def.demand.weekday); w.value) {
    item.demand.weekday = *w.value;
  }
  if (const auto& intraday = pick(it.demand.intraday, def.demand.intraday); intraday.value) {
    if (intraday.value->weights.empty()) {
      item.demand.intraday = intraday.value->profile;
    } else {
      item.demand.intraday_weights = intraday.value->weights;
    }
  }
  const Field<DemandFamily>& family = pick(it.demand.family, def.demand.family);
  if (family.given && !family.value) return item;  // already reported
  item.demand.family = family.value.value_or(DemandFamily::poisson);
  const Field<double>& cv = pick(it.demand.cv, def.demand.cv);
  const Field<double>& dispersion = pick(it.demand.dispersion, def.demand.dispersion);
  item.demand.cv = cv.value;
  item.demand.dispersion = dispersion.value;
  const char* family_name = to_string(item.demand.family);
  if (item.demand.family == DemandFamily::poisson) {
    for (const auto& [f, key] : {std::pair{&cv, "cv"}, std::pair{&dispersion, "dispersion"}}) {
      if (!f->given) continue;
      p.diagnostics().error(
          f->where,
          fmt::format("{}.{} is given but poisson has no spread parameter", demand_path, key),
          fmt::format("remove {}, or set distribution: negative_binomial or normal", key));
    }
  } else if (!cv.given && !dispersion.given) {
    p.diagnostics().error(
        family.given ? family.where : demand_where,
        fmt::format("{}.distribution {} needs cv or dispersion", demand_path, family_name),
        "add cv (variance = (cv * mean)^2) or dispersion (variance = mean + mean^2 / dispersion)");
  } else if (cv.given && dispersion.given) {
    const bool cv_from_defaults = !it.demand.cv.given;
    const bool dispersion_from_defaults = !it.demand.dispersion.given;
    std::string hint = "remove one of them";
    if (cv_from_defaults != dispersion_from_defaults) {
      hint = fmt::format("{} comes from item_defaults (line {}); remove one of them",
                         cv_from_defaults ? "cv" : "dispersion",
                         (cv_from_defaults ? cv : dispersion).where.line);
    }
    p.diagnostics().error(dispersion_from_defaults ? cv.where : dispersion.where,
                          fmt::format("{} gives both cv and dispersion; {} takes exactly one",
                                      demand_path, family_name),
                          std::move(hint));
  }
  return item;
}

/// `leftovers:` on a policy as written: a disposition for every item, or a mapping with the
/// item keys that say how leftovers are handled and, optionally, which items it applies to.
struct PolicyLeftoversDraft {
  Location where;  ///< of the value
  std::string path;
  Field<Leftovers> rule;
  Field<NextDayDraft> next_day;
  Field<MarkdownDraft> markdown;
  bool no_markdown = false;  ///< `markdown: none`: the policy removes the items' markdown
  Field<double> salvage_value;
  bool items_given = false;
  std::vector<std::pair<std::string, Location>> items;           ///< ids as written
  std::optional<std::pair<std::string, std::string>> attribute;  ///< `where: { key: value }`
  Location attribute_where;
};

std::optional<PolicyLeftoversDraft> read_policy_leftovers(Params& pp, const ItemContext& ctx) {
  if (!pp.has("leftovers")) return std::nullopt;
  const std::initializer_list<std::string_view> rules = {"discard", "salvage", "donate",
                                                         "discount_next_day"};
  PolicyLeftoversDraft d;
  d.where = pp.location("leftovers");
  d.path = pp.path_of("leftovers");
  const YAML::Node node = pp.raw("leftovers");
  Diagnostics& diag = pp.diagnostics();
  if (!node.IsMap()) {
    read_leftovers(pp, "leftovers", rules, d.rule);
    if (!d.rule.value) return std::nullopt;  // reported
    return d;
  }
  auto lp = pp.mapping("leftovers");
  if (!lp) return std::nullopt;
  read_leftovers(*lp, "rule", rules, d.rule);
  read_next_day(*lp, d.next_day);
  if (lp->has("markdown") && lp->raw("markdown").IsScalar() &&
      lp->raw("markdown").Scalar() == "none") {
    d.no_markdown = true;
  } else {
    read_markdown(*lp, d.markdown, ctx);
  }
  d.salvage_value = number_field(*lp, "salvage_value", Range::between(0, kMaxMoney));
  if (lp->has("items")) {
    d.items_given = true;
    const YAML::Node list = lp->raw("items");
    const std::string list_path = lp->path_of("items");
    if (!list.IsSequence() || list.size() == 0) {
      diag.error(location_of(list, pp.file()),
                 fmt::format("{} must be a list of item ids such as [bread, salad] (got {})",
                             list_path, describe_value(list)),
                 "leave items out to apply the rule to every item");
    }
    for (size_t j = 0; list.IsSequence() && j < list.size(); ++j) {
      if (!list[j].IsScalar()) {
        diag.error(location_of(list[j], pp.file()),
                   fmt::format("{}[{}] must be an item id (got {})", list_path, j,
                               describe_value(list[j])));
        continue;
      }
      d.items.emplace_back(list[j].Scalar(), location_of(list[j], pp.file()));
    }
  }
  if (lp->has("where")) {
    const YAML::Node w = lp->raw("where");
    d.attribute_where = location_of(w, pp.file());
    if (!w.IsMap() || w.size() != 1 || !w.begin()->first.IsScalar() ||
        !w.begin()->second.IsScalar()) {
      diag.error(d.attribute_where,
                 fmt::format("{} must be one item attribute and its value such as "
                             "{{ category: bakery }} (got {})",
                             lp->path_of("where"), describe_value(w)));
    } else {
      d.attribute = std::pair{w.begin()->first.Scalar(), w.begin()->second.Scalar()};
    }
    if (d.items_given) {
      diag.error(d.attribute_where, fmt::format("{} gives both items and where", d.path),
                 "choose the items by their ids or by one attribute, not both");
    }
  }
  const bool says_something =
      d.rule.given || d.next_day.given || lp->has("markdown") || d.salvage_value.given;
  if (!says_something) {
    diag.error(d.where, fmt::format("{} says nothing about leftovers", d.path),
               "give rule (discard, salvage, donate or discount_next_day), next_day, markdown "
               "or salvage_value");
  }
  lp->finish();
  return d;
}

/// The items as a policy with `leftovers:` handles them: the policy's settings replace the
/// item's own for the items it selects (all of them unless `items` or `where` says otherwise).
/// Problems are reported once per policy, naming the first item concerned.
std::vector<Item> apply_policy_leftovers(const PolicyLeftoversDraft& d,
                                         const std::vector<Item>& items, Diagnostics& diag) {
  std::vector<char> chosen(items.size(), d.items_given || d.attribute ? 0 : 1);
  for (const auto& written_id : d.items) {
    const std::string& id = written_id.first;
    const Location& where = written_id.second;
    const auto found =
        std::find_if(items.begin(), items.end(), [&](const Item& it) { return it.id == id; });
    if (found == items.end()) {
      std::vector<std::string> ids;
      for (const Item& it : items) ids.push_back(it.id);
      const std::string near = closest_name(id, ids);
      diag.error(where, fmt::format("{}.items: '{}' is not an item id", d.path, id),
                 near.empty() ? std::string() : fmt::format("did you mean '{}'?", near));
      continue;
    }
    chosen[static_cast<size_t>(found - items.begin())] = 1;
  }
  if (d.attribute) {
    bool any = false;
    for (size_t i = 0; i < items.size(); ++i) {
      const auto a = items[i].attributes.find(d.attribute->first);
      if (a == items[i].attributes.end() || a->second != d.attribute->second) continue;
      chosen[i] = 1;
      any = true;
    }
    if (!any) {
      diag.error(d.attribute_where,
                 fmt::format("{}.where: no item has {}: {}", d.path, d.attribute->first,
                             d.attribute->second),
                 "check the attribute name and value against the items' attributes");
    }
  }
  std::vector<Item> out = items;
  bool next_day_reported = false;
  bool price_reported = false;
  bool salvage_reported = false;
  for (size_t i = 0; i < items.size(); ++i) {
    if (chosen[i] == 0) continue;
    Item& it = out[i];
    if (d.rule.value) it.leftovers = *d.rule.value;
    if (d.salvage_value.value) it.salvage_value = *d.salvage_value.value;
    const auto price_ok = [&](double price, std::string_view key, Location where) {
      if (price <= it.price || price_reported) return;
      price_reported = true;
      diag.error(where,
                 fmt::format("{}.{}.price ({}) must be at most the price of item '{}' ({})", d.path,
                             key, price, it.id, it.price),
                 "a discounted unit sells at most at the full price");
    };
    if (it.leftovers == Leftovers::discount_next_day) {
      if (d.next_day.value) {
        NextDayDiscount nd;
        const NextDayDraft& nx = *d.next_day.value;
        nd.price = nx.price.value.value_or(it.price / 2.0);
        if (nx.price.value) price_ok(*nx.price.value, "next_day", nx.price.where);
        nd.fallback = nx.fallback.value.value_or(Leftovers::discard);
        nd.bargain_demand = nx.bargain_demand.value.value_or(0.0);
        it.next_day = nd;
      } else if (!it.next_day) {
        it.next_day = NextDayDiscount{it.price / 2.0, Leftovers::discard, 0.0};
      }
    } else {
      it.next_day.reset();
      if (d.next_day.given && !next_day_reported) {
        next_day_reported = true;
        diag.error(d.next_day.where,
                   fmt::format("{}.next_day is given but item '{}' has leftovers {}", d.path, it.id,
                               to_string(it.leftovers)),
                   "set rule: discount_next_day to sell leftovers one more day at "
                   "next_day.price, or remove next_day");
      }
    }
    if (d.no_markdown) {
      it.markdown.reset();
    } else if (d.markdown.value) {
      const MarkdownDraft& md = *d.markdown.value;
      Markdown m;
      m.from_hour = md.from_hour.value.value_or(0);
      m.price = md.price.value.value_or(it.price / 2.0);
      if (md.price.value) price_ok(*md.price.value, "markdown", md.price.where);
      m.uplift = md.uplift.value.value_or(0.0);
      m.surplus_only = md.surplus_only;
      it.markdown = m;
    }
    const bool salvaged = it.leftovers == Leftovers::salvage ||
                          (it.next_day && it.next_day->fallback == Leftovers::salvage);
    if (salvaged && it.salvage_value >= it.unit_cost && !salvage_reported) {
      salvage_reported = true;
      diag.error(d.salvage_value.given ? d.salvage_value.where : d.where,
                 fmt::format("{}: item '{}' would be salvaged at {} but costs {}; the salvage "
                             "value must be less than unit_cost",
                             d.path, it.id, it.salvage_value, it.unit_cost),
                 "otherwise every extra unit ordered would pay");
    }
  }
  return out;
}

// ---------------------------------------------------------------------------------------------

/// Reads one scenario document into a Scenario, section by section, reporting every problem.
class ScenarioReader {
 public:
  ScenarioReader(const std::string& file, Diagnostics& diag) : file_(file), diag_(diag) {}

  Scenario read(const YAML::Node& root) {
    scenario_.file = file_;
    Params top(root, "", file_, diag_);
    read_format(top);
    if (auto name = read_id(top, "name")) scenario_.name = *name;
    read_seed(top);
    read_horizon(top);
    scenario_.replications =
        top.integer("replications", scenario_.replications, Range::between(1, kMaxReplications));
    read_calendar(top);
    scenario_.currency = top.text("currency", scenario_.currency);
    read_stores(top);
    check_event_stores();
    read_items(top);
    read_customers(top);
    read_logistics(top);
    read_demand_shocks(top);
    read_policies(top);
    read_baseline(top);
    if (auto dp = top.mapping("drill")) scenario_.drill = read_drill(*dp, scenario_);
    top.finish();
    return scenario_;
  }

 private:
  void error(const YAML::Node& node, std::string message, std::string hint = {}) {
    diag_.error(location_of(node, file_), std::move(message), std::move(hint));
  }

  void read_format(Params& top) {
    if (!top.has("format")) {
      report_required(top, "format", "add `format: 1` at the top of the file");
      return;
    }
    if (const auto f = top.optional_integer("format"); f && *f != 1) {
      top.error("format", fmt::format("format must be 1 (got {})", *f),
                "this version of larder reads format 1");
    }
  }

  void read_seed(Params& top) {
    const YAML::Node n = top.raw("seed");
    if (n.IsDefined() && !n.IsNull()) {
      const std::optional<std::uint64_t> v =
          parse_seed_text(n.IsScalar() ? n.Scalar() : std::string{});
      if (!v) error(n, fmt::format("{} (got {})", seed_rule("seed"), describe_value(n)));
      scenario_.seed = v.value_or(0);
      scenario_.seed_given = true;
      return;
    }
    std::random_device device;
    scenario_.seed = std::uint64_t{device()} << 32 | device();
    scenario_.seed_given = false;
  }

  void read_horizon(Params& top) {
    Horizon& h = scenario_.horizon;
    auto hp = top.mapping("horizon");
    if (!hp) return;
    if (hp->has("days")) {
      const auto days = hp->optional_integer("days", Range::between(1, kMaxDays));
      days_ok_ = days.has_value();
      h.days = days.value_or(h.days);
    }
    if (hp->has("warmup_days")) {
      const Range range = days_ok_ ? Range::between(0, h.days - 1) : Range::at_least(0);
      h.warmup_days = hp->optional_integer("warmup_days", range).value_or(h.warmup_days);
    } else if (days_ok_ && h.warmup_days > h.days - 1) {
      hp->error("days",
                fmt::format("horizon.warmup_days defaults to {}, which needs horizon.days >= {} "
                            "(got {})",
                            h.warmup_days, h.warmup_days + 1, h.days),
                "set horizon.warmup_days below horizon.days");
    }
    const bool has_weekday = hp->has("start_weekday");
    const bool has_date = hp->has("start_date");
    if (has_weekday && has_date) {
      hp->error("start_date", "horizon.start_weekday and horizon.start_date are both given",
                "start_date sets the weekday: give only one of them");
    }
    if (has_weekday) {
      if (const auto wd = hp->optional_text("start_weekday")) {
        if (const auto d = weekday_index(*wd)) {
          h.start_weekday = *d;
        } else {
          hp->error("start_weekday",
                    fmt::format("horizon.start_weekday must be a weekday name (got {})", *wd),
                    weekday_hint(*wd));
        }
      }
    }
    if (has_date) {
      if (const auto text = hp->optional_text("start_date")) {
        const auto date = parse_iso_date(*text);
        if (!date) {
          hp->error(
              "start_date",
              fmt::format("horizon.start_date must be an ISO date YYYY-MM-DD (got {})", *text));
        } else if (!is_real_date(*date)) {
          hp->error(
              "start_date",
              fmt::format("horizon.start_date is not a date in the calendar (got {})", *text));
        } else {
          h.start_date = to_iso(*date);
          h.start_weekday = weekday_of_date(*date);
        }
      }
    }
    hp->finish();
  }

  void read_calendar(Params& top) {
    hours_ok_ = !top.has("calendar");
    auto cp = top.mapping("calendar");
    if (!cp) return;
    hours_ok_ = !cp->has("hours");
    Calendar& cal = scenario_.calendar;
    if (cp->has("open_weekdays")) {
      const auto set =
          read_weekday_set(cp->raw("open_weekdays"), cp->path_of("open_weekdays"), file_, diag_);
      if (set) cal.open_weekdays = *set;
    }
    if (auto hours = cp->mapping("hours")) {
      const bool open_given = hours->has("open");
      const bool close_given = hours->has("close");
      const auto open = hours->optional_integer("open", Range::between(0, 24));
      const auto close = hours->optional_integer("close", Range::between(0, 24));
      if ((open || !open_given) && (close || !close_given)) {
        cal.open_hour = open.value_or(cal.open_hour);
        cal.close_hour = close.value_or(cal.close_hour);
        hours_ok_ = cal.open_hour < cal.close_hour;
        if (!hours_ok_) {
          hours->error(close_given ? "close" : "open",
                       fmt::format("calendar.hours.open ({}) must be before calendar.hours.close "
                                   "({})",
                                   cal.open_hour, cal.close_hour));
        }
      }
      hours->finish();
    }
    read_events(*cp);
    cp->finish();
  }

  void read_events(Params& cp) {
    const YAML::Node events = cp.raw("events");
    if (!events.IsDefined() || events.IsNull()) return;
    if (!events.IsSequence()) {
      error(events, fmt::format("calendar.events must be a list of events such as "
                                "[{{ day: 120, demand: 1.6 }}] (got {})",
                                describe_value(events)));
      return;
    }
    const int days = scenario_.horizon.days;
    for (size_t i = 0; i < events.size(); ++i) {
      const YAML::Node node = events[i];
      const std::string path = fmt::format("calendar.events[{}]", i);
      if (!node.IsMap()) {
        error(node, fmt::format("{} must be a mapping such as {{ day: 120, demand: 1.6 }} (got {})",
                                path, describe_value(node)));
        continue;
      }
      Params ep(node, path, file_, diag_);
      CalendarEvent e;
      if (!ep.has("day")) {
        report_required(ep, "day", "day is the day index from the start of the horizon");
      } else {
        const Range range = days_ok_ ? Range::between(0, days - 1) : Range::at_least(0);
        e.day = ep.optional_integer("day", range).value_or(0);
      }
      e.demand = ep.number("demand", 1.0, Range::between(0, kMaxFactor));
      e.closed = ep.boolean("closed", false);
      if (ep.has("stores")) {
        const YAML::Node stores = ep.raw("stores");
        const std::string stores_path = ep.path_of("stores");
        if (!stores.IsSequence()) {
          error(stores, fmt::format("{} must be a list of store ids (got {})", stores_path,
                                    describe_value(stores)));
        } else if (stores.size() == 0) {
          error(stores, fmt::format("{} must list at least one store id", stores_path),
                "leave stores out to apply the event to every store");
        }
        for (size_t j = 0; stores.IsSequence() && j < stores.size(); ++j) {
          const YAML::Node s = stores[j];
          const std::string s_path = fmt::format("{}[{}]", stores_path, j);
          if (!s.IsScalar()) {
            error(s, fmt::format("{} must be a store id (got {})", s_path, describe_value(s)));
            continue;
          }
          e.stores.push_back(s.Scalar());
          event_store_refs_.push_back({s.Scalar(), location_of(s, file_), s_path});
        }
      }
      ep.finish();
      scenario_.calendar.events.push_back(std::move(e));
    }
  }

  void read_stores(Params& top) {
    const YAML::Node n = top.raw("stores");
    if (!n.IsDefined() || n.IsNull()) {
      report_required(top, "stores",
                      "list them, e.g. stores: [{ id: quay }], or generate them: "
                      "stores: { count: 10 }");
    } else if (n.IsSequence()) {
      read_store_list(n);
    } else if (n.IsMap()) {
      read_generated_stores(n);
    } else {
      error(n, fmt::format("stores must be a list of stores or a mapping such as "
                           "{{ count: 40, size: {{ lognormal_cv: 0.3 }} }} (got {})",
                           describe_value(n)));
    }
  }

  void read_store_list(const YAML::Node& list) {
    if (list.size() == 0) {
      error(list, "stores must list at least one store");
      return;
    }
    IdRegistry ids;
    for (size_t i = 0; i < list.size(); ++i) {
      const YAML::Node node = list[i];
      const std::string path = fmt::format("stores[{}]", i);
      if (!node.IsMap()) {
        error(node, fmt::format("{} must be a mapping such as {{ id: quay, size: 1.3 }} (got {})",
                                path, describe_value(node)));
        continue;
      }
      Params sp(node, path, file_, diag_);
      Store store;
      store.where = sp.location();
      store.open_weekdays = scenario_.calendar.open_weekdays;
      if (const auto id = read_id(sp, "id")) {
        claim_id(ids, *id, path, sp, "id");
        store.id = *id;
      }
      store.size = sp.number("size", store.size, Range{0.0, kMaxFactor, true});
      if (sp.has("open_weekdays")) {
        const auto set =
            read_weekday_set(sp.raw("open_weekdays"), sp.path_of("open_weekdays"), file_, diag_);
        if (set) store.open_weekdays = *set;
      }
      read_attributes(sp, store.attributes);
      sp.finish();
      scenario_.stores.push_back(std::move(store));
    }
  }

  void read_generated_stores(const YAML::Node& node) {
    Params gp(node, "stores", file_, diag_);
    std::optional<int> count;
    if (!gp.has("count")) {
      report_required(gp, "count", "generated stores need a count, e.g. stores: { count: 40 }");
    } else {
      count = gp.optional_integer("count", Range::between(1, kMaxGeneratedStores));
    }
    double cv = 0.0;
    if (auto size = gp.mapping("size")) {
      cv = size->number("lognormal_cv", 0.0, Range::between(0, 10));
      size->finish();
    }
    gp.finish();
    if (!count) return;
    const std::vector<double> sizes = generated_store_sizes(scenario_.seed, *count, cv);
    for (int i = 0; i < *count; ++i) {
      Store store;
      store.id = generated_store_id(i, *count);
      store.size = sizes[static_cast<size_t>(i)];
      store.open_weekdays = scenario_.calendar.open_weekdays;
      scenario_.stores.push_back(std::move(store));
    }
  }

  void check_event_stores() {
    std::vector<std::string> ids;
    for (const auto& s : scenario_.stores) ids.push_back(s.id);
    for (const auto& ref : event_store_refs_) {
      if (std::find(ids.begin(), ids.end(), ref.id) != ids.end()) continue;
      const std::string near = closest_name(ref.id, ids);
      std::string hint;
      if (!near.empty()) {
        hint = fmt::format("did you mean '{}'?", near);
      } else if (ids.size() <= 10) {
        hint = fmt::format("the stores are {}", join(ids));
      }
      diag_.error(ref.where, fmt::format("{} '{}' is not a store id", ref.path, ref.id), hint);
    }
  }

  void read_items(Params& top) {
    ItemContext ctx{scenario_.calendar.open_hour, scenario_.calendar.close_hour, hours_ok_, true};
    ItemDraft defaults;
    if (auto dp = top.mapping("item_defaults")) {
      if (written(*dp, "id")) {
        diag_.error(dp->key_location("id"), "item_defaults cannot set id",
                    "every item gives its own id");
      }
      read_item_fields(*dp, defaults, ctx);
      dp->finish();
    }
    ctx.defaults = false;
    const YAML::Node list = top.raw("items");
    if (!list.IsDefined() || list.IsNull()) {
      report_required(top, "items",
                      "e.g. items: [{ id: bread, price: 2, unit_cost: 0.8, "
                      "demand: { base: 20 } }]");
      return;
    }
    if (!list.IsSequence()) {
      error(list, fmt::format("items must be a list of items (got {})", describe_value(list)));
      return;
    }
    if (list.size() == 0) {
      error(list, "items must list at least one item");
      return;
    }
    IdRegistry ids;
    std::vector<PendingSubstitutes> pending;
    bool next_day_default_used = false;  // some item takes item_defaults.next_day
    for (size_t i = 0; i < list.size(); ++i) {
      const YAML::Node node = list[i];
      const std::string path = fmt::format("items[{}]", i);
      if (!node.IsMap()) {
        error(node, fmt::format("{} must be a mapping such as {{ id: bread, price: 2, ... }} "
                                "(got {})",
                                path, describe_value(node)));
        continue;
      }
      Params ip(node, path, file_, diag_);
      const auto id = read_id(ip, "id");
      if (id) claim_id(ids, *id, path, ip, "id");
      ItemDraft draft;
      draft.attributes = defaults.attributes;
      read_item_fields(ip, draft, ctx);
      ip.finish();
      Item item = build_item(draft, defaults, ip);
      item.id = id.value_or("");
      item.where = ip.location();
      const Field<Leftovers>& leftovers = pick(draft.leftovers, defaults.leftovers);
      const bool keeps_a_day = leftovers.value == Leftovers::discount_next_day ||
                               (leftovers.given && !leftovers.value);  // unknown: do not guess
      next_day_default_used = next_day_default_used || (keeps_a_day && !draft.next_day.given);
      if (!draft.substitutes.empty()) {
        pending.push_back(
            {scenario_.items.size(), ip.path_of("substitutes"), std::move(draft.substitutes)});
      }
      check_demand_scale(item, ip);
      scenario_.items.push_back(std::move(item));
    }
    if (defaults.next_day.given && !next_day_default_used && !scenario_.items.empty()) {
      diag_.error(defaults.next_day.where,
                  "item_defaults.next_day is used by no item (it applies to items with "
                  "leftovers: discount_next_day that give no next_day of their own)",
                  "set leftovers: discount_next_day, in item_defaults or on the items, or remove "
                  "next_day");
    }
    resolve_substitutes(pending);
  }

  /// An item's substitutes as written, resolved once every item (and id) is known.
  struct PendingSubstitutes {
    size_t item = 0;
    std::string path;  ///< e.g. "items[0].substitutes"
    std::vector<SubstituteRef> refs;
  };

  /// Turns substitute ids into item indices (forward references allowed); reports unknown ids
  /// and items naming themselves.
  void resolve_substitutes(const std::vector<PendingSubstitutes>& pending) {
    std::map<std::string, int> index;
    std::vector<std::string> ids;
    for (size_t i = 0; i < scenario_.items.size(); ++i) {
      const std::string& id = scenario_.items[i].id;
      if (id.empty()) continue;
      if (index.emplace(id, static_cast<int>(i)).second) ids.push_back(id);
    }
    for (const PendingSubstitutes& p : pending) {
      Item& item = scenario_.items[p.item];
      for (const SubstituteRef& ref : p.refs) {
        const auto it = index.find(ref.id);
        if (it == index.end()) {
          const std::string near = closest_name(ref.id, ids);
          std::string hint;
          if (!near.empty()) {
            hint = fmt::format("did you mean '{}'?", near);
          } else if (ids.size() <= 10) {
            hint = fmt::format("the items are {}", join(ids));
          }
          diag_.error(ref.where,
                      fmt::format("{} names '{}', which is not an item id", p.path, ref.id),
                      std::move(hint));
        } else if (ref.id == item.id) {
          diag_.error(ref.where, fmt::format("{} names the item itself ('{}')", p.path, ref.id),
                      "a substitute is another item that customers take when this one is out");
        } else {
          item.substitutes.push_back(Substitute{it->second, ref.share});
        }
      }
    }
  }

  void read_customers(Params& top) {
    auto cp = top.mapping("customers");
    if (!cp) return;
    scenario_.fifo_share = cp->number("fifo_share", scenario_.fifo_share, Range::probability());
    scenario_.discount_take_rate =
        cp->number("discount_take_rate", scenario_.discount_take_rate, Range::probability());
    if (auto gp = cp->mapping("goodwill")) {
      Goodwill& g = scenario_.goodwill;
      g.sensitivity = gp->number("sensitivity", g.sensitivity, Range::probability());
      g.half_life_days = gp->number("half_life_days", g.half_life_days, Range::above(0));
      gp->finish();
    }
    cp->finish();
  }

  void read_demand_shocks(Params& top) {
    auto sp = top.mapping("demand_shocks");
    if (!sp) return;
    DemandShocks& d = scenario_.shocks;
    d.store_traffic_cv = sp->number("store_traffic_cv", d.store_traffic_cv, Range::at_least(0));
    if (auto pp = sp->mapping("persistence")) {
      d.persistence_lag = pp->integer("lag", 1, Range::between(1, 7));
      if (d.persistence_lag != 1 && d.persistence_lag != 7) {
        pp->error("lag",
                  fmt::format("{} must be 1 or 7 (got {})", pp->path_of("lag"), d.persistence_lag),
                  "1: yesterday carries over; 7: the same weekday last week carries over");
      }
      d.persistence_coefficient = pp->number("coefficient", 0.0, Range{0.0, 1.0, false, true});
      d.persistence_cv = pp->number("cv", 0.0, Range::at_least(0));
      pp->finish();
    }
    sp->finish();
  }

  void read_logistics(Params& top) {
    auto lp = top.mapping("logistics");
    if (!lp) return;
    Logistics& l = scenario_.logistics;
    l.lead_time_days =
        lp->integer("lead_time_days", l.lead_time_days, Range::between(1, kMaxLeadTime));
    if (lp->has("delivery_weekdays")) {
      const auto set = read_weekday_set(lp->raw("delivery_weekdays"),
                                        lp->path_of("delivery_weekdays"), file_, diag_);
      if (set) l.delivery_weekdays = *set;
    }
    lp->finish();
  }

  void read_policies(Params& top) {
    const YAML::Node list = top.raw("policies");
    if (!list.IsDefined() || list.IsNull()) {
      report_required(top, "policies",
                      "e.g. policies: [{ name: current, forecast: { method: ses_weekday }, "
                      "quantity: { rule: in_stock_target, level: 0.7 } }]");
      return;
    }
    if (!list.IsSequence()) {
      error(list,
            fmt::format("policies must be a list of policies (got {})", describe_value(list)));
      return;
    }
    if (list.size() == 0) {
      error(list, "policies must list at least one policy");
      return;
    }
    IdRegistry names;
    for (size_t i = 0; i < list.size(); ++i) {
      const YAML::Node node = list[i];
      const std::string path = fmt::format("policies[{}]", i);
      if (!node.IsMap()) {
        error(node, fmt::format("{} must be a mapping with a name, a forecast and a quantity "
                                "(got {})",
                                path, describe_value(node)));
        continue;
      }
      Params pp(node, path, file_, diag_);
      const auto name = read_id(pp, "name");
      if (name) claim_id(names, *name, path, pp, "name");
      const auto forecast = read_required_part(pp, "forecast", "method", "ses_weekday");
      std::optional<PartSpec> censoring;
      if (pp.has("censoring")) {
        censoring =
            read_part(pp.raw("censoring"), pp.path_of("censoring"), "method", true, file_, diag_);
      } else {
        censoring =
            PartSpec{"ignore", YAML::Node(), location_of(node, file_), pp.path_of("censoring")};
      }
      const auto quantity = read_required_part(pp, "quantity", "rule", "in_stock_target");
      std::vector<PartSpec> adjustments;
      if (pp.has("adjustments")) {
        const YAML::Node adj = pp.raw("adjustments");
        if (!adj.IsSequence()) {
          error(adj, fmt::format("{} must be a list such as [pack_round] (got {})",
                                 pp.path_of("adjustments"), describe_value(adj)));
        }
        for (size_t j = 0; adj.IsSequence() && j < adj.size(); ++j) {
          auto part = read_part(adj[j], fmt::format("{}[{}]", pp.path_of("adjustments"), j),
                                "method", true, file_, diag_);
          if (part) adjustments.push_back(std::move(*part));
        }
      }
      const bool observe_intraday =
          pp.choice("observe", "daily", {"daily", "intraday"}) == "intraday";
      const ItemContext ctx{scenario_.calendar.open_hour, scenario_.calendar.close_hour, hours_ok_,
                            false};
      const auto leftovers = read_policy_leftovers(pp, ctx);
      pp.finish();
      // Built once: assigning over an existing YAML::Node would rewrite the node it refers to.
      scenario_.policies.push_back(PolicySpec{name.value_or(""),
                                              location_of(node, file_),
                                              forecast.value_or(PartSpec{}),
                                              censoring.value_or(PartSpec{}),
                                              quantity.value_or(PartSpec{}),
                                              adjustments,
                                              observe_intraday,
                                              {}});
      if (leftovers) {
        scenario_.policies.back().items =
            apply_policy_leftovers(*leftovers, scenario_.items, diag_);
      }
    }
  }

  /// The largest daily mean of `item` at any store (base x weekday x store size x the event
  /// multipliers of one day: an upper bound) must stay within kMaxDailyMean, so that counts fit
  /// in `int` and every sum stays finite.
  void check_demand_scale(const Item& item, Params& ip) {
    double size = scenario_.stores.empty() ? 1.0 : 0.0;
    for (const Store& st : scenario_.stores) size = std::max(size, st.size);
    std::map<int, double> per_day;
    for (const CalendarEvent& e : scenario_.calendar.events) {
      per_day.emplace(e.day, 1.0).first->second *= e.demand;
    }
    double event = 1.0;
    for (const auto& [day, factor] : per_day) event = std::max(event, factor);
    double weekday = 0.0;
    for (double w : item.demand.weekday) weekday = std::max(weekday, w);
    const double peak = item.demand.base * weekday * size * event;
    if (peak > kMaxDailyMean) {
      ip.error("demand",
               fmt::format("{}'s demand reaches a mean of {:.3g} units a day (base x weekday x "
                           "store size x event); the limit is {:.0f} per store-item-day",
                           ip.path(), peak, kMaxDailyMean),
               "lower demand.base, or split the item or the store");
    }
  }

  std::optional<PartSpec> read_required_part(Params& pp, std::string_view key, const char* name_key,
                                             const char* example) {
    if (!pp.has(key)) {
      report_required(pp, key, fmt::format("e.g. {}: {{ {}: {} }}", key, name_key, example));
      return std::nullopt;
    }
    return read_part(pp.raw(key), pp.path_of(key), name_key, false, file_, diag_);
  }

  void read_baseline(Params& top) {
    const auto baseline = top.optional_text("baseline");
    if (!baseline || scenario_.policies.empty()) return;
    std::vector<std::string> names;
    for (const auto& p : scenario_.policies) names.push_back(p.name);
    const auto it = std::find(names.begin(), names.end(), *baseline);
    if (it != names.end()) {
      scenario_.baseline = static_cast<int>(it - names.begin());
      return;
    }
    const std::string near = closest_name(*baseline, names);
    top.error("baseline",
              fmt::format("baseline '{}' is not one of the policies ({})", *baseline, join(names)),
              near.empty() ? std::string{} : fmt::format("did you mean '{}'?", near));
  }

  struct EventStoreRef {
    std::string id;
    Location where;
    std::string path;
  };

  const std::string& file_;
  Diagnostics& diag_;
  Scenario scenario_;
  bool days_ok_ = true;   ///< horizon.days is valid, so day ranges can be checked against it
  bool hours_ok_ = true;  ///< calendar.hours is valid, so hour rules can be checked against it
  std::vector<EventStoreRef> event_store_refs_;
};

/// A hint when the line of a YAML error (0-based `line`) or the one before it is indented with
/// a tab: yaml-cpp's message does not name it as the cause.
std::string tab_hint(const std::string& text, int line) {
  if (line < 0) return {};
  std::vector<std::string_view> lines;
  std::string_view rest = text;
  for (int k = 0; k <= line && !rest.empty(); ++k) {
    const size_t nl = rest.find('\n');
    lines.push_back(rest.substr(0, nl));
    rest = nl == std::string_view::npos ? std::string_view{} : rest.substr(nl + 1);
  }
  for (int k = std::max(0, line - 1); k <= line && k < static_cast<int>(lines.size()); ++k) {
    const std::string_view l = lines[static_cast<size_t>(k)];
    const size_t first = l.find_first_not_of(" \t");
    if (l.substr(0, first).find('\t') != std::string_view::npos) {
      return fmt::format("line {} is indented with a tab; YAML indents with spaces only", k + 1);
    }
  }
  return {};
}

std::optional<Scenario> parse_document(const std::string& text, const std::string& file,
                                       Diagnostics& diag) {
  if (!check_yaml_text(text, file, diag)) return std::nullopt;  // size, bytes, depth
  std::vector<YAML::Node> docs;
  try {
    if (const auto stall = find_yaml_stall(text)) {  // LoadAll would never return
      diag.error({file, stall->line + 1, stall->column + 1},
                 fmt::format("invalid YAML: {}", stall->what));
      return std::nullopt;
    }
    docs = YAML::LoadAll(text);
  } catch (const YAML::ParserException& e) {
    const Location where =
        e.mark.line < 0 ? Location{file, 0, 0} : Location{file, e.mark.line + 1, e.mark.column + 1};
    diag.error(where, fmt::format("invalid YAML: {}", e.msg), tab_hint(text, e.mark.line));
    return std::nullopt;
  }
  if (docs.empty() || docs[0].IsNull()) {
    diag.error({file, 0, 0}, "the scenario is empty", "a scenario starts with `format: 1`");
    return std::nullopt;
  }
  if (docs.size() > 1) {
    diag.error(location_of(docs[1], file),
               fmt::format("a scenario file holds one YAML document (found {})", docs.size()),
               "remove the `---` separator");
    return std::nullopt;
  }
  const YAML::Node& root = docs[0];
  // A file that is plainly not a scenario (a wrong path, or someone else's file read by
  // mistake or on purpose) is refused without repeating any of it: messages may be shown to
  // people who cannot read the file. A scenario has format, name, stores, items and policies;
  // one with none of them is no scenario with typos.
  if (!root.IsMap()) {
    diag.error(location_of(root, file),
               fmt::format("a scenario must be a mapping of keys to values such as `format: 1` "
                           "(got {})",
                           root.IsScalar() ? std::string("a single value") : describe_value(root)));
    return std::nullopt;
  }
  if (std::none_of(root.begin(), root.end(), [](const auto& kv) {
        if (!kv.first.IsScalar()) return false;
        const std::string& key = kv.first.Scalar();
        return key == "format" || key == "name" || key == "stores" || key == "items" ||
               key == "policies";
      })) {
    diag.error({file, 1, 1},
               "not a larder scenario: it has none of the keys format, name, stores, items, "
               "policies",
               "is the path right? A scenario starts with `format: 1` (see scenarios/)");
    return std::nullopt;
  }
  if (!check_yaml_expansion(root, file, diag)) return std::nullopt;  // an alias bomb
  report_duplicate_keys(root, file, diag);
  return ScenarioReader(file, diag).read(root);
}

}  // namespace

std::optional<Scenario> parse_scenario(const std::string& yaml_text, const std::string& file_label,
                                       Diagnostics& diag) {
  Diagnostics found;
  std::optional<Scenario> scenario;
  try {
    scenario = parse_document(yaml_text, file_label, found);
  } catch (const std::bad_alloc&) {
    throw;
  } catch (const std::exception& e) {
    // Not expected: every problem should have its own message. Reported rather than thrown.
    found.error({file_label, 0, 0}, fmt::format("could not read the scenario: {}", e.what()));
  }
  // Report in file order (problems without a line first), each once.
  std::vector<Diagnostic> items = found.items();
  std::stable_sort(items.begin(), items.end(), [](const Diagnostic& a, const Diagnostic& b) {
    return std::pair{a.where.line, a.where.column} < std::pair{b.where.line, b.where.column};
  });
  for (size_t i = 0; i < items.size(); ++i) {
    const bool repeat = i > 0 && items[i].where.line == items[i - 1].where.line &&
                        items[i].where.column == items[i - 1].where.column &&
                        items[i].message == items[i - 1].message;
    if (!repeat) diag.error(items[i].where, items[i].message, items[i].hint);
  }
  diag.count_dropped(found);
  if (!diag.ok()) return std::nullopt;
  return scenario;
}

std::string read_scenario_text(const std::string& path) {
  Diagnostics diag;
  // Read with the size cap first (a pipe or /dev/zero never gets read whole), then parsed.
  const std::size_t cap = YamlLimits{}.max_bytes;
  BoundedText in = read_bounded(path, cap);
  if (in.too_large) {
    diag.error({path, 0, 0},
               fmt::format("the file is too large for a scenario: more than the limit of {} "
                           "(larder read no further)",
                           size_in_words(cap)),
               "a scenario is a short YAML file (see scenarios/); is this the right file?");
    throw InputError(std::move(diag));
  }
  if (!in.ok()) {
    diag.error({path, 0, 0}, fmt::format("cannot read the scenario: {}", in.problem));
    throw InputError(std::move(diag));
  }
  return std::move(in.text);
}

Scenario load_scenario_file(const std::string& path) {
  Diagnostics diag;
  auto scenario = parse_scenario(read_scenario_text(path), path, diag);
  if (!scenario) throw InputError(std::move(diag));
  return std::move(*scenario);
}

}  // namespace larder
