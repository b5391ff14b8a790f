#pragma once
// Minimising a smooth function of a few parameters (up to a dozen) by Newton's method with the
// gradient and Hessian from central differences of the whole function (2 n^2 + 1 evaluations
// per step), Levenberg damping when the Hessian is not positive definite, and a backtracking
// line search. For the fits whose parameters all meet each other (substitute shares, the
// joint information of an item's means, cv and shares); `minimize_blocks` handles the sums of
// blocks. The Hessian at the minimum is the observed information.

#include <Eigen/Dense>
#include <functional>

namespace larder {

/// f(x); may return +inf (or NaN) where it is not defined.
using DenseValue = std::function<double(const Eigen::VectorXd&)>;

struct DenseMinimum {
  Eigen::VectorXd x;
  double value = 0.0;
  Eigen::MatrixXd hessian;
  bool converged = false;
};

/// The Hessian of f at x by central differences with step h.
Eigen::MatrixXd dense_hessian(const DenseValue& f, const Eigen::VectorXd& x, double h);

/// Minimises f from x0 (differences with step h); stops when a step changes no parameter by
/// more than 1e-9, or after 100 steps.
DenseMinimum minimize_dense(const DenseValue& f, Eigen::VectorXd x0, double h = 1e-4);

}  // namespace larder
