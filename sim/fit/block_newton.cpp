#include "sim/fit/block_newton.hpp"

#include <cmath>
#include <limits>

namespace larder {

namespace {

constexpr double kStep = 1e-4;  // finite-difference step in log parameters
constexpr double kInf = std::numeric_limits<double>::infinity();

double finite_or_inf(double v) {
  return std::isfinite(v) ? v : kInf;
}

struct Derivatives {
  double value = 0.0;
  Eigen::VectorXd gradient;
  Eigen::MatrixXd hessian;
};

double total(const BlockProblem& p, const Eigen::VectorXd& a, double c) {
  double s = 0.0;
  for (int k = 0; k < p.blocks; ++k) s += finite_or_inf(p.value(k, a[k], c));
  return s;
}

/// Value, gradient and Hessian by central differences, block by block.
Derivatives derivatives(const BlockProblem& p, const Eigen::VectorXd& a, double c) {
  const int n = p.blocks + (p.shared ? 1 : 0);
  Derivatives d;
  d.gradient = Eigen::VectorXd::Zero(n);
  d.hessian = Eigen::MatrixXd::Zero(n, n);
  const double h = kStep;
  for (int k = 0; k < p.blocks; ++k) {
    const auto f = [&](double da, double dc) {
      return finite_or_inf(p.value(k, a[k] + da, c + dc));
    };
    const double f0 = f(0, 0);
    const double fp = f(h, 0);
    const double fm = f(-h, 0);
    d.value += f0;
    d.gradient[k] = (fp - fm) / (2 * h);
    d.hessian(k, k) = (fp - 2 * f0 + fm) / (h * h);
    if (!p.shared) continue;
    const double gp = f(0, h);
    const double gm = f(0, -h);
    d.gradient[n - 1] += (gp - gm) / (2 * h);
    d.hessian(n - 1, n - 1) += (gp - 2 * f0 + gm) / (h * h);
    const double cross = (f(h, h) - f(h, -h) - f(-h, h) + f(-h, -h)) / (4 * h * h);
    d.hessian(k, n - 1) = d.hessian(n - 1, k) = cross;
  }
  return d;
}

/// Newton direction, damped (H + mu I) until the system is positive definite.
Eigen::VectorXd direction(const Derivatives& d) {
  const int n = static_cast<int>(d.gradient.size());
  double mu = 0.0;
  for (int attempt = 0; attempt < 60; ++attempt) {
    Eigen::MatrixXd m = d.hessian + mu * Eigen::MatrixXd::Identity(n, n);
    Eigen::LLT<Eigen::MatrixXd> llt(m);
    if (llt.info() == Eigen::Success) return llt.solve(-d.gradient);
    mu = mu == 0.0 ? 1e-6 * (1.0 + d.hessian.diagonal().cwiseAbs().maxCoeff()) : mu * 10.0;
  }
  return -d.gradient;
}

}  // namespace

BlockMinimum minimize_blocks(const BlockProblem& problem, Eigen::VectorXd a0, double c0) {
  BlockMinimum m;
  m.a = std::move(a0);
  m.c = problem.shared ? c0 : 0.0;
  const int n = problem.blocks + (problem.shared ? 1 : 0);
  int flat = 0;  // consecutive steps that no longer change the value
  for (m.iterations = 0; m.iterations < 200; ++m.iterations) {
    const Derivatives d = derivatives(problem, m.a, m.c);
    if (!std::isfinite(d.value) || n == 0) break;
    Eigen::VectorXd step = direction(d);
    // Keep a step within 2 in log scale (a factor e^2) so a flat start cannot jump away.
    const double longest = step.cwiseAbs().maxCoeff();
    if (longest > 2.0) step *= 2.0 / longest;
    if (longest < 1e-9) {
      m.converged = true;
      break;
    }
    double t = 1.0;
    bool moved = false;
    for (int back = 0; back < 40; ++back, t *= 0.5) {
      const Eigen::VectorXd a = m.a + t * step.head(problem.blocks);
      const double c = problem.shared ? m.c + t * step[n - 1] : 0.0;
      const double v = total(problem, a, c);
      if (v <= d.value + 1e-4 * t * d.gradient.dot(step)) {
        m.a = a;
        m.c = c;
        moved = true;
        flat = d.value - v < 1e-12 * (1.0 + std::abs(d.value)) ? flat + 1 : 0;
        break;
      }
    }
    if (flat >= 3) {
      // A direction in which the likelihood is flat (e.g. a negative binomial that has become
      // Poisson): the value is at its minimum, the parameter is not determined.
      m.converged = true;
      break;
    }
    if (!moved) {
      // No decrease along the direction: at the minimum to the precision of the differences.
      m.converged = step.cwiseAbs().maxCoeff() < 1e-5;
      break;
    }
  }
  const Derivatives d = derivatives(problem, m.a, m.c);
  m.value = d.value;
  m.hessian = d.hessian;
  return m;
}

Eigen::MatrixXd covariance_from(const Eigen::MatrixXd& hessian) {
  const auto n = hessian.rows();
  Eigen::LLT<Eigen::MatrixXd> llt(hessian);
  if (n == 0 || llt.info() != Eigen::Success) return Eigen::MatrixXd::Constant(n, n, kInf);
  return llt.solve(Eigen::MatrixXd::Identity(n, n));
}

}  // namespace larder
