#pragma once
// The typed scenario: what `load_scenario` builds from a YAML file once, after validation.
// Everything downstream (engine, policies, reports) reads these structs, never YAML, except
// policy parts, which validate their own parameters from `PartSpec::params` (see policies/).

#include <yaml-cpp/yaml.h>

#include <array>
#include <cstdint>
#include <map>
#include <optional>
#include <string>
#include <vector>

#include "sim/drill/drill_spec.hpp"
#include "sim/scenario/diagnostics.hpp"

namespace larder {

inline constexpr int kDaysPerWeek = 7;
/// Weekday names as used in scenario files, Monday first (index 0).
inline constexpr std::array<const char*, kDaysPerWeek> kWeekdayNames = {"mon", "tue", "wed", "thu",
                                                                        "fri", "sat", "sun"};
using WeekdaySet = std::array<bool, kDaysPerWeek>;
inline constexpr WeekdaySet kAllWeekdays = {true, true, true, true, true, true, true};

/// Family of the daily demand count given its mean (model.md, Demand).
enum class DemandFamily : std::uint8_t { poisson, negative_binomial, normal };
const char* to_string(DemandFamily f);

/// What happens to units at the close of their last sellable day (model.md, step 5).
enum class Leftovers : std::uint8_t { discard, salvage, donate, discount_next_day };
const char* to_string(Leftovers l);

/// The demand of one item at a size-1 store.
struct DemandSpec {
  double base = 0.0;  ///< mean per open day at a size-1 store
  std::array<double, kDaysPerWeek> weekday = {1, 1, 1, 1, 1, 1, 1};  ///< multipliers
  DemandFamily family = DemandFamily::poisson;
  /// Spread for negative_binomial and normal: exactly one of cv or dispersion.
  std::optional<double> cv;          ///< variance = (cv * mean)^2
  std::optional<double> dispersion;  ///< k: variance = mean + mean^2 / k
  /// How the day's customers spread over the opening hours: a named profile (intraday_profile.hpp)
  /// or, when `intraday_weights` is not empty, one weight per opening hour.
  std::string intraday = "flat";
  std::vector<double> intraday_weights;
};

/// One level of substitution (model.md, step 3): a customer who finds the item out tries
/// `item` with probability `share`.
struct Substitute {
  int item = 0;  ///< index into Scenario::items
  double share = 0.0;
};

/// `leftovers: discount_next_day`: units kept one extra day as a discounted tier, then disposed
/// of with the fallback disposition.
struct NextDayDiscount {
  double price = 0.0;                       ///< [half the item price]
  Leftovers fallback = Leftovers::discard;  ///< discard, salvage or donate
  double bargain_demand = 0.0;  ///< bargain-only customers, as a share of the item's demand
};

/// Evening markdown: from `from_hour`, units on their last sellable day sell at `price`; with
/// `surplus_only`, only as many of them as the store expects to be left at close (its forecast
/// of the rest of the day, the intraday profile and its stock), the others stay at full price.
struct Markdown {
  int from_hour = 0;    ///< clock hour, after opening and before closing
  double price = 0.0;   ///< [half the item price]
  double uplift = 0.0;  ///< bargain-only customers in markdown hours, as a share of the item's
                        ///< customers in those hours
  bool surplus_only = false;  ///< mark down only the expected surplus of last-day units
};

struct Item {
  std::string id;
  Location where;  ///< the item's mapping in the scenario file (empty for items made in code)
  std::map<std::string, std::string> attributes;
  double price = 0.0;
  double unit_cost = 0.0;
  int shelf_life_days = 1;
  int pack_size = 1;
  std::optional<int> shelf_capacity;  ///< most units on the shelf after a delivery
  Leftovers leftovers = Leftovers::discard;
  std::optional<NextDayDiscount> next_day;  ///< set exactly when leftovers is discount_next_day
  std::optional<Markdown> markdown;
  std::vector<Substitute> substitutes;  ///< shares sum to <= 1
  double salvage_value = 0.0;           ///< per unit leaving by salvage
  double disposal_cost = 0.0;           ///< per wasted unit
  double stockout_penalty = 0.0;        ///< per customer who leaves without buying (g)
  std::optional<double> weight_kg;
  std::optional<double> co2e_kg;  ///< CO2e per unit
  DemandSpec demand;
};

struct Store {
  std::string id;
  Location where;     ///< the store's mapping in the scenario file (empty when generated)
  double size = 1.0;  ///< multiplies every item's base demand
  WeekdaySet open_weekdays = kAllWeekdays;
  std::map<std::string, std::string> attributes;
};

/// A dated demand multiplier or closure (day index from the start of the horizon).
struct CalendarEvent {
  int day = 0;
  double demand = 1.0;
  bool closed = false;
  std::vector<std::string> stores;  ///< empty = every store
};

struct Calendar {
  WeekdaySet open_weekdays = kAllWeekdays;  ///< default for stores that list none
  int open_hour = 8;
  int close_hour = 20;
  std::vector<CalendarEvent> events;
};

struct Horizon {
  int days = 364;
  int warmup_days = 28;
  int start_weekday = 0;                  ///< 0 = Monday
  std::optional<std::string> start_date;  ///< ISO date, sets start_weekday
};

struct Logistics {
  int lead_time_days = 1;
  WeekdaySet delivery_weekdays = kAllWeekdays;
};

/// Random demand multipliers (model.md, Demand): a store-day traffic shock shared by the
/// store's items, and a lognormal AR(1) persistence per store-item. Both have mean 1.
struct DemandShocks {
  double store_traffic_cv = 0.0;  ///< 0 = off
  int persistence_lag = 0;        ///< 1 or 7 days; 0 = off
  double persistence_coefficient = 0.0;
  double persistence_cv = 0.0;  ///< stationary cv of the persistence multiplier

  bool any() const {
    return store_traffic_cv > 0.0 || (persistence_lag > 0 && persistence_cv > 0.0);
  }
};

/// Goodwill erosion after stockouts (model.md): off when sensitivity is 0 (the default).
struct Goodwill {
  double sensitivity = 0.0;
  double half_life_days = 14.0;
};

/// A policy part as written in the scenario: a method name plus its own parameters, which the
/// part validates when it is created from the registry.
struct PartSpec {
  std::string method;
  YAML::Node params;  ///< the mapping (or scalar shorthand) as written
  Location where;
  std::string path;  ///< e.g. "policies[1].quantity", for messages
};

struct PolicySpec {
  std::string name;
  Location where;
  PartSpec forecast;
  PartSpec censoring;
  PartSpec quantity;
  std::vector<PartSpec> adjustments;
  bool observe_intraday = false;  ///< `observe: intraday`: sales by hour and sell-out times
  /// The items as this policy handles their leftovers (`leftovers:` on the policy: disposition,
  /// next-day discount, markdown, salvage value); empty when the policy keeps the items' own.
  std::vector<Item> items;
};

/// A validated scenario (scenario.md).
struct Scenario {
  int format = 1;
  std::string name;
  std::string file;  ///< where it was read from ("<demo>" for the built-in demo)
  std::uint64_t seed = 0;
  bool seed_given = false;  ///< false: seed was drawn at load time and must be printed
  Horizon horizon;
  int replications = 100;
  Calendar calendar;
  std::string currency = "EUR";
  std::vector<Store> stores;
  std::vector<Item> items;
  double fifo_share = 0.5;
  double discount_take_rate = 0.5;  ///< share of customers taking a discounted unit when shown
  Goodwill goodwill;
  DemandShocks shocks;
  Logistics logistics;
  std::vector<PolicySpec> policies;
  int baseline = 0;                ///< index into policies
  std::optional<DrillSpec> drill;  ///< `drill:`: a training exercise (larder drill)

  /// The items as policy `policy` handles their leftovers (its `leftovers:`, else the items).
  const std::vector<Item>& items_of(int policy) const;
  int scored_days() const { return horizon.days - horizon.warmup_days; }
  /// Weekday (0 = Monday) of day index `day`.
  int weekday_of(int day) const { return (horizon.start_weekday + day) % kDaysPerWeek; }
  /// Whether store `s` is open on day `day` (its weekdays and closure events).
  bool is_open(int store, int day) const;
  /// Opening hours per day: the number of hourly time buckets.
  int hours() const { return calendar.close_hour - calendar.open_hour; }
  /// Product of the demand multipliers of events on `day` for store `s` (1 when none).
  double event_multiplier(int store, int day) const;
};

}  // namespace larder
