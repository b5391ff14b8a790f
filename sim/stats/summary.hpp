#pragma once
// Across-replication statistics: mean, standard error and a Student-t 95% interval, and the
// paired difference of two policies on common random numbers (Law, Simulation Modeling and
// Analysis, replication and comparison chapters).

#include <span>

namespace larder {

/// Mean with its standard error and a two-sided t confidence interval.
struct Estimate {
  double mean = 0.0;
  double stderr_ = 0.0;  ///< sample sd / sqrt(n); 0 when n < 2
  double ci_low = 0.0;
  double ci_high = 0.0;
  int n = 0;
};

/// Quantile t_{dof, p} of Student's t (dof >= 1).
double student_t_quantile(double p, int dof);

/// Estimate of the mean of i.i.d. values (two-pass, summed in index order, so the result is
/// bit-identical however the values were produced). `level` is the interval's coverage.
Estimate estimate_mean(std::span<const double> values, double level = 0.95);

/// Estimate of the mean of a[j] - b[j] (paired-t on common random numbers).
Estimate estimate_paired_difference(std::span<const double> a, std::span<const double> b,
                                    double level = 0.95);

}  // namespace larder
