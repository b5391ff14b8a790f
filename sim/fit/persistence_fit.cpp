#include "sim/fit/persistence_fit.hpp"

#include <cmath>
#include <limits>

namespace larder {

PersistenceFit fit_lag7_persistence(const FitData& data, const Decomposition& fit, int item) {
  PersistenceFit out;
  out.correlation = std::numeric_limits<double>::quiet_NaN();
  double sx = 0, sy = 0, sxx = 0, syy = 0, sxy = 0, n = 0;
  // Rows are sorted by (item, store, day): look back within the same store-item run.
  const auto& rows = data.rows;
  size_t run_start = 0;
  for (size_t r = 0; r < rows.size(); ++r) {
    const FitDay& d = rows[r];
    if (r == 0 || rows[r - 1].item != d.item || rows[r - 1].store != d.store) run_start = r;
    if (d.item != item || d.sold_out) continue;
    const double mu = fit.mean(d.store, item, data.weekday(d.day));
    if (mu <= 0.0) continue;
    // The row 7 days earlier, if any: at most 7 rows back in a daily run.
    for (size_t b = r; b-- > run_start && rows[b].day >= d.day - 7;) {
      if (rows[b].day != d.day - 7) continue;
      if (rows[b].sold_out) break;
      const double mu0 = fit.mean(d.store, item, data.weekday(rows[b].day));
      if (mu0 <= 0.0) break;
      const double y = d.sold / mu - 1.0;
      const double x = rows[b].sold / mu0 - 1.0;
      sx += x, sy += y, sxx += x * x, syy += y * y, sxy += x * y, n += 1;
      break;
    }
  }
  out.pairs = static_cast<int>(n);
  if (n < 3) return out;
  const double cxy = sxy - sx * sy / n;
  const double cxx = sxx - sx * sx / n;
  const double cyy = syy - sy * sy / n;
  if (cxx > 0 && cyy > 0) out.correlation = cxy / std::sqrt(cxx * cyy);
  out.se = 1.0 / std::sqrt(n);
  return out;
}

}  // namespace larder
