// Levenberg–Marquardt minimisation of Σ r_i² for a model with exact
// derivatives (Marquardt, J. Soc. Indust. Appl. Math. 11, 431 (1963); the
// damping λ·diag(JᵀJ) of that paper). The caller gives the weighted residuals
// and their Jacobian; the fits build both from GiNaC expressions compiled once
// (compiled_expression.hpp).
#pragma once

#include <Eigen/Dense>

#include <functional>

namespace ts {

struct LmResult {
  Eigen::VectorXd parameters;
  double cost = 0;          // Σ r_i² at the end
  Eigen::MatrixXd jacobian; // at the end
  int iterations = 0;
  bool converged = false;
};

// `evaluate(p, r, J)` fills the residuals r (size N) and their Jacobian J (N × P).
using ResidualFunction = std::function<void(const Eigen::VectorXd& p, Eigen::VectorXd& r, Eigen::MatrixXd& J)>;

LmResult levenberg_marquardt(const ResidualFunction& evaluate, Eigen::VectorXd start, int max_iterations = 200);

} // namespace ts
