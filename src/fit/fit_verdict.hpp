// Comparing the fitted hypotheses: information criteria, Akaike weights, the
// ranking, F-tests of nested models (a subgroup's model contains its
// supergroup's, by Neumann's principle), rejections at the significance level,
// and the verdict in words. Floating point throughout: the verdict ranks
// models that were derived exactly and decides no symmetry zero.
#pragma once

#include "fit/scan_fit.hpp"

#include <Eigen/Dense>

namespace ts {

// Fills the statistics of every fitted hypothesis of `r` (chi2, k and dof set),
// sorts them and writes the verdict. `parent` is the last sample group.
void rank_and_judge(FitResult& r, const PointGroup& parent);

// The weighted linear least-squares solution of F c ≈ y (F and y already
// divided by the uncertainties): coefficients, their covariance (unscaled),
// the rank of F and, when F is rank deficient, a null vector.
struct LinearSolution {
  Eigen::VectorXd c;
  Eigen::MatrixXd covariance;
  int rank = 0;
  Eigen::VectorXd null_vector;
  double cost = 0;
};
LinearSolution solve_linear(const Eigen::MatrixXd& F, const Eigen::VectorXd& y);

} // namespace ts
