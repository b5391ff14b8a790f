#include "sim/fit/total_demand.hpp"

#include <cmath>
#include <limits>

#include "sim/fit/count_likelihood.hpp"

namespace larder {

double own_variance(DemandFamily family, double mean, double cv) {
  if (family == DemandFamily::poisson) return mean;
  const double v = cv * mean * cv * mean;
  return family == DemandFamily::negative_binomial ? std::max(v, mean) : v;
}

double total_cv(DemandFamily family, double mean, double cv, const ExtraDemand& extra) {
  if (extra.mean == 0.0 && extra.var == 0.0) return cv;
  const double total = mean + extra.mean;
  if (!(total > 0.0)) return cv;
  return std::sqrt(own_variance(family, mean, cv) + extra.var) / total;
}

double total_log_likelihood(DemandFamily family, double mean, double cv, const ExtraDemand& extra,
                            int x, bool at_least) {
  // A negative share can take the sum below 0 during a search: impossible, not an error.
  if (!(mean + extra.mean >= 0.0)) return -std::numeric_limits<double>::infinity();
  return count_log_likelihood(family, mean + extra.mean, total_cv(family, mean, cv, extra), x,
                              at_least);
}

double total_cdf(DemandFamily family, double mean, double cv, const ExtraDemand& extra, int x) {
  if (x < 0) return 0.0;
  return -std::expm1(total_log_likelihood(family, mean, cv, extra, x + 1, true));
}

}  // namespace larder
