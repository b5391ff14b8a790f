#pragma once
// How an item's customers spread over the opening hours (model.md, step 2): a named profile of
// our own or a list of hourly weights, turned into one share per opening hour. Customers arrive
// at a constant rate within an hour, so the share of the day elapsed at any time is linear
// within each hour.

#include <array>
#include <span>
#include <string_view>
#include <vector>

#include "sim/scenario/scenario.hpp"

namespace larder {

/// Names accepted by `demand.intraday`.
inline constexpr std::array<std::string_view, 4> kIntradayProfiles = {
    "flat", "morning_peak", "midday_peak", "evening_peak"};

bool is_intraday_profile(std::string_view name);

/// One share per opening hour (open_hour .. close_hour - 1), summing to 1. Named profiles are
/// a constant base plus a bell around a clock hour (8:30, 12:30 or 17:30); `weights`, when not
/// empty, are used as given (one per opening hour, not all zero).
std::vector<double> intraday_shares(std::string_view profile, std::span<const double> weights,
                                    int open_hour, int close_hour);

/// The item's shares for the scenario's opening hours.
std::vector<double> intraday_shares(const Item& item, const Calendar& calendar);

/// Share of the day's customers who have arrived `hours` after opening (0 .. shares.size()).
double elapsed_share(std::span<const double> shares, double hours);

}  // namespace larder
