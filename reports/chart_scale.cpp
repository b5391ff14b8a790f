#include "reports/chart_scale.hpp"

#include <algorithm>
#include <array>
#include <cmath>

#include "reports/number_format.hpp"

namespace larder {

namespace {

constexpr std::array kMantissas = {1, 2, 5};
// Rounding slack when testing whether a data end sits on a tick (1 / 0.2 may be 4.999...).
constexpr double kSlack = 1e-9;

/// 10^n for n >= 0: exact up to 10^22 (products of 10 are exact doubles that far).
double power_of_ten(int n) {
  if (n > 22) return std::pow(10.0, n);
  double p = 1.0;
  for (int i = 0; i < n; ++i) p *= 10.0;
  return p;
}

/// i x m x 10^k, the division for k < 0 rounding once to the double nearest the decimal.
double tick_value(long long i, int m, int k) {
  const double whole = static_cast<double>(i * m);
  return k >= 0 ? whole * power_of_ten(k) : whole / power_of_ten(-k);
}

struct Span {
  double lo;
  double hi;
};

Span usable_span(double lo, double hi) {
  if (!std::isfinite(lo) || !std::isfinite(hi)) return {0.0, 1.0};
  if (lo > hi) std::swap(lo, hi);
  if (lo < hi) return {lo, hi};
  if (lo == 0.0) return {0.0, 1.0};
  const double half = std::fabs(lo) / 2.0;
  return {lo - half, hi + half};
}

}  // namespace

LinearScale::LinearScale(double d0, double d1, double r0, double r1)
    : d0_(d0), r0_(r0), slope_(d1 != d0 ? (r1 - r0) / (d1 - d0) : 0.0) {}

Axis nice_axis(double lo, double hi, int max_intervals) {
  const Span span = usable_span(lo, hi);
  max_intervals = std::max(max_intervals, 1);
  // A step below range / max_intervals can never do; start one decade under it.
  int k = static_cast<int>(std::floor(std::log10((span.hi - span.lo) / max_intervals))) - 1;
  for (;; ++k) {
    for (const int m : kMantissas) {
      const double step = tick_value(1, m, k);
      const auto first = static_cast<long long>(std::floor(span.lo / step + kSlack));
      const auto last = static_cast<long long>(std::ceil(span.hi / step - kSlack));
      if (last - first > max_intervals) continue;
      Axis axis;
      axis.step = step;
      axis.decimals = std::max(0, -k);
      for (long long i = first; i <= last; ++i) axis.ticks.push_back(tick_value(i, m, k));
      axis.lo = axis.ticks.front();
      axis.hi = axis.ticks.back();
      return axis;
    }
  }
}

std::string tick_label(const Axis& axis, double value) {
  return format_number(value, axis.decimals);
}

}  // namespace larder
