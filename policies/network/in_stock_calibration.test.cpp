// The in-stock calibration of network plans (in_stock_calibration.hpp) against a binomial GLM
// with a probit link fitted by statsmodels 0.13.5, and the fit with a normal prior on the slope
// against scipy.optimize (BFGS on the penalised log-likelihood). The reference values are
// printed by `/usr/bin/python3 tests/reference/probit_calibration.py`.

#include "policies/network/in_stock_calibration.hpp"

#include <catch2/catch.hpp>

namespace larder {
namespace {

CloseRecord four_bins() {
  CloseRecord r;
  r.add(0.30, 200, 50);
  r.add(0.50, 300, 120);
  r.add(0.70, 250, 150);
  r.add(0.90, 400, 330);
  return r;
}

TEST_CASE("calibration: the plain fit is statsmodels' probit GLM", "[network][calibration]") {
  const InStockCalibration c = four_bins().fit(0.0);
  CHECK(c.shift == Approx(-0.227778714).margin(1e-6));
  CHECK(c.slope == Approx(0.903858294).margin(1e-6));
}

TEST_CASE("calibration: the prior on the slope is scipy's penalised optimum",
          "[network][calibration]") {
  const InStockCalibration c = four_bins().fit(0.1);
  CHECK(c.shift == Approx(-0.238629594).margin(1e-6));
  CHECK(c.slope == Approx(0.930153745).margin(1e-6));
}

TEST_CASE(
    "calibration: with one expected level the prior keeps the slope and the shift meets "
    "the observed share",
    "[network][calibration]") {
  CloseRecord r;
  r.add(0.75, 600, 420);
  r.add(0.75, 400, 280);  // pooled with the first
  const InStockCalibration c = r.fit(0.1);
  CHECK(c.shift == Approx(-0.150089253).margin(1e-4));
  CHECK(c.slope == Approx(1.0).margin(1e-4));
  CHECK(c.apply(0.75) == Approx(0.70).margin(1e-4));
}

TEST_CASE("calibration: no closes is the identity; probabilities at the ends stay put",
          "[network][calibration]") {
  const InStockCalibration c = CloseRecord{}.fit();
  CHECK(c.identity());
  CHECK(c.apply(0.42) == 0.42);
  const InStockCalibration d = four_bins().fit();
  CHECK(d.apply(0.0) == 0.0);
  CHECK(d.apply(1.0) == 1.0);
  // Monotone: a higher expected probability is never calibrated lower (the slope is positive).
  CHECK(d.slope > 0.0);
  CHECK(d.apply(0.6) < d.apply(0.8));
}

}  // namespace
}  // namespace larder
