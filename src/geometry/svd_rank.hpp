// The numerical rank and condition number of a design matrix, from Eigen's SVD.
// Used to search among bar layouts and to grade them; exact ranks that a claim
// rests on are decided elsewhere (device/surd_echelon.hpp).
#pragma once

#include <Eigen/SVD>

namespace ts {

struct RankCondition {
  int rank = 0;
  double condition = 0; // σ_max/σ_min over the singular values counted in the rank
};

// Singular values below `tolerance` times the largest count as zero. The
// coefficients of bar readings are small algebraic numbers, so a true zero is 0 and
// a nonzero is far above the default threshold.
inline RankCondition svd_rank(const Eigen::MatrixXd& m, double tolerance = 1e-9) {
  if (m.rows() == 0 || m.cols() == 0) return {};
  Eigen::JacobiSVD<Eigen::MatrixXd> svd(m);
  const auto& s = svd.singularValues();
  if (s.size() == 0 || s(0) == 0) return {};
  RankCondition rc;
  double smallest = s(0);
  for (Eigen::Index i = 0; i < s.size(); ++i)
    if (s(i) > tolerance * s(0)) {
      ++rc.rank;
      smallest = s(i);
    }
  rc.condition = s(0) / smallest;
  return rc;
}

} // namespace ts
