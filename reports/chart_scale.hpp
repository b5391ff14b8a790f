#pragma once
// Axes for the report's charts: a linear map from data to drawing coordinates, and "nice" tick
// steps of 1, 2 or 5 times a power of ten, so tick labels are short round numbers (the rule of
// Heckbert, "Nice numbers for graph labels", Graphics Gems, 1990; our own variant below).

#include <string>
#include <vector>

namespace larder {

/// A linear map of the domain [d0, d1] onto the range [r0, r1] (either may be decreasing, as
/// a y axis drawn downwards is).
class LinearScale {
 public:
  LinearScale(double d0, double d1, double r0, double r1);
  /// The range coordinate of data value `x` (values outside the domain extrapolate).
  double operator()(double x) const { return r0_ + (x - d0_) * slope_; }

 private:
  double d0_;
  double r0_;
  double slope_;
};

/// An axis whose ends and ticks are whole multiples of a nice step.
struct Axis {
  double lo = 0.0;            ///< first tick, at or below the data
  double hi = 1.0;            ///< last tick, at or above the data
  double step = 0.2;          ///< 1, 2 or 5 x 10^k
  int decimals = 1;           ///< decimals that write every tick exactly (max(0, -k))
  std::vector<double> ticks;  ///< lo, lo + step, ..., hi
};

/// The axis for data in [lo, hi]: the smallest step s = m x 10^k (m in 1, 2, 5) such that the
/// ticks from floor(lo / s) s to ceil(hi / s) s span at most `max_intervals` steps. An empty
/// span [x, x] widens to [0, 1] when x is 0, else to [x - |x|/2, x + |x|/2]; non-finite ends
/// give [0, 1]. Ticks are computed as (integer x m) scaled by a power of ten, so 0.6 is the
/// double nearest 0.6, not 3 x 0.2.
Axis nice_axis(double lo, double hi, int max_intervals = 5);

/// A tick's label: `value` with the axis's decimals and thousands separators ("1,000", "0.2").
std::string tick_label(const Axis& axis, double value);

}  // namespace larder
