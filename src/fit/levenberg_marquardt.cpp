#include "fit/levenberg_marquardt.hpp"

#include <cmath>

namespace ts {

LmResult levenberg_marquardt(const ResidualFunction& evaluate, Eigen::VectorXd start, int max_iterations) {
  LmResult res;
  Eigen::VectorXd r, r_try;
  Eigen::MatrixXd J, J_try;
  Eigen::VectorXd p = std::move(start);
  evaluate(p, r, J);
  double cost = r.squaredNorm();
  double lambda = 1e-3;
  for (int it = 0; it < max_iterations; ++it) {
    res.iterations = it + 1;
    const Eigen::MatrixXd A = J.transpose() * J;
    const Eigen::VectorXd g = J.transpose() * r;
    bool improved = false;
    for (int tries = 0; tries < 30; ++tries) {
      Eigen::MatrixXd damped = A;
      for (Eigen::Index i = 0; i < A.rows(); ++i) damped(i, i) += lambda * std::max(A(i, i), 1e-12);
      // A degenerate direction (a parameter the data do not fix) leaves A singular;
      // the damping keeps the step finite and the rank is reported afterwards.
      const Eigen::VectorXd step = damped.ldlt().solve(-g);
      if (!step.allFinite()) {
        lambda *= 10;
        continue;
      }
      const Eigen::VectorXd p_try = p + step;
      evaluate(p_try, r_try, J_try);
      const double c = r_try.squaredNorm();
      if (std::isfinite(c) && c <= cost) {
        const double drop = cost - c;
        p = p_try;
        r.swap(r_try);
        J.swap(J_try);
        cost = c;
        lambda = std::max(lambda / 10, 1e-12);
        improved = true;
        if (drop <= 1e-12 * (cost + 1e-300) || step.norm() <= 1e-12 * (p.norm() + 1e-12)) res.converged = true;
        break;
      }
      lambda *= 10;
    }
    if (!improved) {
      res.converged = true; // no step lowers the cost: a minimum to working precision
      break;
    }
    if (res.converged) break;
  }
  res.parameters = p;
  res.cost = cost;
  res.jacobian = J;
  return res;
}

} // namespace ts
