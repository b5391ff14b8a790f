#include "sim/fit/dense_newton.hpp"

#include <cmath>
#include <limits>

namespace larder {

namespace {

double finite_or_inf(double v) {
  return std::isfinite(v) ? v : std::numeric_limits<double>::infinity();
}

Eigen::VectorXd gradient(const DenseValue& f, const Eigen::VectorXd& x, double h) {
  Eigen::VectorXd g(x.size());
  for (Eigen::Index i = 0; i < x.size(); ++i) {
    Eigen::VectorXd p = x, m = x;
    p[i] += h, m[i] -= h;
    g[i] = (finite_or_inf(f(p)) - finite_or_inf(f(m))) / (2 * h);
  }
  return g;
}

}  // namespace

Eigen::MatrixXd dense_hessian(const DenseValue& f, const Eigen::VectorXd& x, double h) {
  const Eigen::Index n = x.size();
  Eigen::MatrixXd H(n, n);
  const double f0 = finite_or_inf(f(x));
  const auto at = [&](Eigen::Index i, double di, Eigen::Index j, double dj) {
    Eigen::VectorXd y = x;
    y[i] += di;
    y[j] += dj;
    return finite_or_inf(f(y));
  };
  for (Eigen::Index i = 0; i < n; ++i) {
    H(i, i) = (at(i, h, i, 0) - 2 * f0 + at(i, -h, i, 0)) / (h * h);
    for (Eigen::Index j = 0; j < i; ++j) {
      H(i, j) = H(j, i) =
          (at(i, h, j, h) - at(i, h, j, -h) - at(i, -h, j, h) + at(i, -h, j, -h)) / (4 * h * h);
    }
  }
  return H;
}

DenseMinimum minimize_dense(const DenseValue& f, Eigen::VectorXd x0, double h) {
  DenseMinimum m;
  m.x = std::move(x0);
  const Eigen::Index n = m.x.size();
  double value = finite_or_inf(f(m.x));
  for (int it = 0; it < 100 && n > 0 && std::isfinite(value); ++it) {
    const Eigen::VectorXd g = gradient(f, m.x, h);
    const Eigen::MatrixXd H = dense_hessian(f, m.x, h);
    Eigen::VectorXd step = -g;
    double mu = 0.0;
    for (int attempt = 0; attempt < 60; ++attempt) {
      Eigen::LLT<Eigen::MatrixXd> llt(H + mu * Eigen::MatrixXd::Identity(n, n));
      if (llt.info() == Eigen::Success) {
        step = llt.solve(-g);
        break;
      }
      mu = mu == 0.0 ? 1e-6 * (1.0 + H.diagonal().cwiseAbs().maxCoeff()) : mu * 10.0;
    }
    const double longest = step.cwiseAbs().maxCoeff();
    if (longest < 1e-9) {
      m.converged = true;
      break;
    }
    if (longest > 1.0) step *= 1.0 / longest;
    bool moved = false;
    for (double t = 1.0; t > 1e-12; t *= 0.5) {
      const Eigen::VectorXd y = m.x + t * step;
      const double v = finite_or_inf(f(y));
      if (v <= value + 1e-4 * t * g.dot(step)) {
        m.x = y;
        moved = value - v > 1e-13 * (1.0 + std::abs(value)) || longest > 1e-6;
        value = v;
        break;
      }
    }
    if (!moved) {
      m.converged = longest < 1e-5;
      break;
    }
  }
  m.value = value;
  m.hessian = dense_hessian(f, m.x, h);
  return m;
}

}  // namespace larder
