#pragma once
// Keeping a network plan's promise with forecasts learned from sales cut off by sell-outs.
// A plan expects each group to be in stock at close with some probability p; what the stores
// then see at their closes says how far that expectation is off. The calibration is a probit
// recalibration of the plan's in-stock probabilities,
//     P(in stock at close) = Phi(shift + slope * Phi^-1(p)),
// fitted by maximum likelihood to the closes the stores have seen (open days and days with a
// unit left, grouped by the p the plan expected for them; older closes weighted down by
// CloseRecord::decay, network_phases.cpp keeps only those since the last plan), with a normal
// prior on the slope around 1 so that a plan whose groups all share one level (one p) still
// gets a shift. The same model as a binomial regression with a probit link (McCullagh and
// Nelder, Generalized Linear Models, 2nd ed. 1989, section 4.3; checked against statsmodels'
// GLM in in_stock_calibration.test.cpp). A store sees whether it had stock at close, so the
// plan learns only from what a store can observe.

#include <cstdint>
#include <vector>

namespace larder {

struct InStockCalibration {
  double shift = 0.0;
  double slope = 1.0;
  /// The calibrated probability of an expected in-stock probability p (p itself when the
  /// calibration is the identity).
  double apply(double p) const;
  bool identity() const { return shift == 0.0 && slope == 1.0; }
};

/// Closes seen, binned by the in-stock probability the plan expected for them.
class CloseRecord {
 public:
  /// Bins of width 1/kBins over (0, 1).
  static constexpr int kBins = 400;
  CloseRecord();
  /// Adds `open_days` closes of which `in_stock_days` had a unit left, expected in stock with
  /// probability `expected`.
  void add(double expected, std::int64_t open_days, std::int64_t in_stock_days);
  std::int64_t closes() const { return total_; }
  /// Keeps a share `keep` of the weight of every close seen so far (older closes count less).
  void decay(double keep);
  /// The maximum-likelihood calibration (Newton's method on the log-likelihood plus the log
  /// prior -(slope - 1)^2 / (2 slope_sd^2)); the identity with no closes. `slope_sd` <= 0 fits
  /// without a prior (the plain probit regression).
  InStockCalibration fit(double slope_sd = 0.1) const;

 private:
  std::vector<double> expected_sum_;  ///< per bin: sum of expected * open days
  std::vector<double> open_;          ///< per bin
  std::vector<double> in_stock_;      ///< per bin
  std::int64_t total_ = 0;
};

}  // namespace larder
