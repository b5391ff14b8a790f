#pragma once
// Minimising a negative log-likelihood that is a sum of blocks, f(a, c) = sum_k f_k(a_k, c):
// one parameter a_k per block (e.g. the log mean of one weekday) and at most one parameter c
// shared by all blocks (e.g. the log cv). Newton's method with the gradient and Hessian from
// central differences of each block in its own two coordinates (9 evaluations of a block per
// step, not 2n^2 of the whole sum), Levenberg damping when the Hessian is not positive
// definite, and a backtracking line search. The Hessian at the minimum is the observed
// information, whose inverse gives the standard errors (Cox and Hinkley, Theoretical
// Statistics, 1974, ch. 9).

#include <Eigen/Dense>
#include <functional>

namespace larder {

/// f_k(a_k, c): block k's value (c is 0 and unused without a shared parameter). May return
/// +inf (or NaN) outside the region where it is defined; the search then steps back.
using BlockValue = std::function<double(int block, double a, double c)>;

struct BlockProblem {
  int blocks = 0;
  bool shared = false;  ///< whether c is a parameter
  BlockValue value;
};

struct BlockMinimum {
  Eigen::VectorXd a;
  double c = 0.0;
  double value = 0.0;       ///< f at the minimum
  Eigen::MatrixXd hessian;  ///< of f at the minimum: blocks first, then c (when shared)
  bool converged = false;
  int iterations = 0;
};

/// Minimises from (a0, c0). Stops when a Newton step changes no parameter by more than 1e-9
/// (the parameters are logs: relative changes), when three steps in a row change the value by
/// less than 1e-12 of it (a flat direction), or after 200 steps (converged = false).
BlockMinimum minimize_blocks(const BlockProblem& problem, Eigen::VectorXd a0, double c0);

/// The inverse of `hessian` (the covariance of the estimates) when it is positive definite;
/// otherwise a matrix of +inf (the data do not pin the parameters down).
Eigen::MatrixXd covariance_from(const Eigen::MatrixXd& hessian);

}  // namespace larder
