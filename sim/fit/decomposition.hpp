#pragma once
// The multiplicative demand decomposition fitted by censored likelihood:
//   mean(store s, item i, day t) = base_i x size_s x weekday_{i, weekday(t)},
// each day's sales scored by `count_log_likelihood` (sold-out days as demand >= sales) under
// the item's family and cv. Fitted by block coordinate ascent: per item, the seven weekday
// means and the cv by Newton's method (sizes held fixed); per store, the size (items held
// fixed); repeated until the sizes move by less than 1e-7 in log. Normalisations: store sizes
// average 1 (arithmetic mean over the stores fitted); weekday multipliers average 1 over the
// weekdays on which the item has days, so base is the mean demand per open day at a size-1
// store. The family of each item is the one with the smallest AIC (Akaike 1974) among
// poisson, negative_binomial and normal, unless fixed. Standard errors come from the observed
// information of the item's own parameters with the store sizes held at their estimates.

#include <array>
#include <limits>
#include <optional>
#include <span>
#include <string>
#include <vector>

#include "sim/fit/series.hpp"
#include "sim/fit/total_demand.hpp"
#include "sim/scenario/scenario.hpp"

namespace larder {

struct FitOptions {
  std::optional<DemandFamily> family;  ///< fixed family; empty = chosen by AIC
  int min_uncensored_days = 28;        ///< fewer: the item (or store) is flagged, not fitted
  int min_uncensored_per_weekday = 3;  ///< per weekday with days, for the weekday multiplier
  bool substitution = false;           ///< also estimate substitute shares (`fit_history` only)
  bool intervals = true;               ///< compute the cv's profile-likelihood intervals
  /// Per item (by index; empty = none): a family to keep instead of choosing one, so a refit
  /// fits one family (used between the rounds of `fit_substitution`).
  std::vector<std::optional<DemandFamily>> item_family;
};

struct ItemEstimate {
  std::string id;
  bool fitted = false;
  std::string problem;  ///< why not fitted
  DemandFamily family = DemandFamily::poisson;
  double base = 0.0, base_se = 0.0;
  std::array<double, 7> weekday{1, 1, 1, 1, 1, 1, 1}, weekday_se{};
  std::array<bool, 7> weekday_seen{};
  double cv = 0.0, cv_se = 0.0;  ///< 0 for poisson
  /// The 95% profile-likelihood interval of the cv (the weekday means refitted at each cv;
  /// Cox and Hinkley 1974, ch. 9): of the chosen family, or of the negative binomial fit when
  /// poisson was chosen (how much spread the data allow). cv_low is 0 when the interval reaches
  /// the Poisson limit (cv_low_at_poisson; a negative binomial with cv^2 mean <= 1 is Poisson);
  /// cv_high is +inf when no upper end was found. NaN when not computed.
  double cv_low = std::numeric_limits<double>::quiet_NaN();
  double cv_high = std::numeric_limits<double>::quiet_NaN();
  bool cv_low_at_poisson = false;
  DemandFamily cv_interval_family = DemandFamily::negative_binomial;
  int days = 0;             ///< store-item-days used
  int censored_days = 0;    ///< of which sold out
  double naive_base = 0.0;  ///< the same decomposition's base from mean sales (biased low)
  double neg_log_likelihood = 0.0;
  std::array<double, 3> aic{};  ///< per family (index = DemandFamily), NaN when not fitted
  bool converged = false;
};

struct StoreEstimate {
  std::string id;
  bool fitted = false;
  std::string problem;
  double size = 1.0;
  double size_se = 0.0;
  std::array<bool, 7> open_weekdays{};  ///< weekdays with rows
  int days = 0;
};

struct Decomposition {
  std::vector<StoreEstimate> stores;
  std::vector<ItemEstimate> items;
  int rounds = 0;  ///< item/store alternations
  /// The fitted mean of a store-item-day (0 when the item or store was not fitted).
  double mean(int store, int item, int weekday) const;
};

/// `extra`: per row of data.rows (empty = none), substitute demand added to the item's own
/// (rows whose extra mean is NaN are left out).
Decomposition fit_decomposition(const FitData& data, const FitOptions& options,
                                std::span<const ExtraDemand> extra = {});

}  // namespace larder
