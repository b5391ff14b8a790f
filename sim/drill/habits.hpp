#pragma once
// Readings of a trainee's ordering habits from a decision series, by least squares on the
// behavioural rules of Schweitzer and Cachon (2000) (checks.md 7.2):
// - demand chasing, rule (iii): Q_t = Q_{t-1} + theta (S_{t-1} - Q_{t-1}); theta is the
//   least-squares coefficient of S_{t-1} - Q_{t-1} in Q_t - Q_{t-1}, through the origin, with
//   the change of the mean demand mu_t - mu_{t-1} as a second regressor (a planner who follows
//   the weekday pattern is not read as chasing; without such changes it drops out and theta
//   is the plain slope);
// - pull to centre, rule (i): Q = (1 - w) Q* + w mu; w is the regression through the origin of
//   Q - Q* on mu - Q*.
// Slopes and standard errors are the usual least-squares ones (any regression text, e.g.
// Draper and Smith, Applied Regression Analysis): b = (X'X)^-1 X'y, var = s^2 (X'X)^-1 with
// s^2 = RSS / (n - k).

#include <span>

namespace larder {

/// A slope through the origin and its standard error (NaN when there is too little spread in x
/// or fewer than 3 points).
struct SlopeFit {
  double value;
  double std_error;
  int n = 0;
};

/// b = sum(x y) / sum(x^2) over pairs; NaN when sum(x^2) <= min_spread or n < 3.
SlopeFit slope_through_origin(std::span<const double> x, std::span<const double> y,
                              double min_spread = 1e-9);

/// Demand chasing: the weight theta with which an order moves from the previous order toward
/// the previous sales, controlling for the change of the mean demand. Series are aligned:
/// q_prev[t], s_prev[t], mu_prev[t] (the day of the previous order) and q[t], mu[t].
SlopeFit chasing_weight(std::span<const double> q_prev, std::span<const double> s_prev,
                        std::span<const double> q, std::span<const double> mu_prev,
                        std::span<const double> mu);

/// Pull to centre: the share w of the way from the profit-maximising quantity q_star to the
/// mean demand mu at which the orders q sit.
SlopeFit pull_to_center_weight(std::span<const double> mu, std::span<const double> q_star,
                               std::span<const double> q);

}  // namespace larder
