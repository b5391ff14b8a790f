#pragma once
// The scenario `larder fit` writes: valid v1 YAML (scenario.md) with the fitted stores and
// items, a comment block per item on the quality of its fit (family and AIC, standard errors,
// share of sold-out days, days used, what sales-as-demand would have given, the lag-7 residual
// correlation), items and stores with too little data listed in comments and left out (never
// invented), and two starting policies that differ only in the censoring treatment.

#include <string>
#include <vector>

#include "sim/fit/decomposition.hpp"
#include "sim/fit/intraday_fit.hpp"
#include "sim/fit/persistence_fit.hpp"
#include "sim/fit/series.hpp"
#include "sim/fit/substitution_fit.hpp"
#include "sim/history/item_file.hpp"

namespace larder {

struct FitResult {
  FitData data;
  Decomposition fit;
  std::vector<IntradayFit> intraday;             ///< per item
  std::vector<PersistenceFit> persistence;       ///< per item, lag 7
  std::vector<PersistenceFit> persistence_lag1;  ///< per item, lag 1
  bool substitution_asked = false;
  std::vector<SubstituteShare> substitution;  ///< with FitOptions::substitution
  std::vector<ExtraDemand> extra;  ///< per row: substitute demand at the shares (may be empty)
  std::vector<std::int16_t> substitutes_from;  ///< per row (may be empty): `fit_intraday`
  int substitution_rounds = 0;
  bool substitution_converged = true;
};

/// Fits everything `larder fit` writes from a history: the decomposition, the intraday profiles,
/// with FitOptions::substitution the shares jointly with the decomposition
/// (`fit_substitution`), then the profiles and exposure estimates again without the substitute
/// sales, and the lag-7 and lag-1 correlations. Substitute shares are written
/// (under the item that was out) when they exceed twice their standard error, cut to [0, 1] and
/// scaled down together when an item's shares sum above 1.
FitResult fit_history(FitData data, const FitOptions& options);

struct WriteOptions {
  std::string name;          ///< scenario name (a valid id)
  std::string history_file;  ///< for the header comment
  std::string items_file;    ///< "" = none: prices and costs are marked placeholders
  std::vector<ItemRecord> items;
  /// For `larder fit --check`: when set, the horizon is the history's own dates (no warm-up)
  /// and the only policy is a `replay` of this order file (`replay_orders_csv`), run
  /// `replications` times.
  std::string replay_orders;
  int replications = 100;
};

/// The history's deliveries as the order file of the `replay` quantity rule: one row per
/// fitted store-item-day with a delivery, placed the day before (the scenario's default lead
/// time of one day), days counted from the history's first date.
std::string replay_orders_csv(const FitResult& r);

/// The cv's standard error and 95% profile interval as the comment and table show them.
std::string cv_interval_text(const ItemEstimate& e);

/// Items of the history that the item file does not list (they get placeholders).
std::vector<std::string> items_without_prices(const FitResult& r, const WriteOptions& options);

/// Throws InputError listing what the loader would refuse or misread in the written scenario:
/// store and item ids that are not ids (written as they are, so `, size: 1000 } #` could
/// otherwise set a store's size), prices, costs and shelf lives of the item file beyond the
/// scenario limits, attribute names that are not ids, attribute values that are not text.
void check_fit_writable(const FitData& data, const WriteOptions& options);

/// The scenario text (check_fit_writable first). Throws InputError naming the history when no
/// item or no store could be fitted (there would be nothing valid to write).
std::string fitted_scenario_yaml(const FitResult& r, const WriteOptions& options);

}  // namespace larder
