#include "core/big_qsqrt3.hpp"

namespace ts {

int BigQSqrt3::sign() const {
  int sa = cln::minusp(a_) ? -1 : (cln::zerop(a_) ? 0 : 1);
  int sb = cln::minusp(b_) ? -1 : (cln::zerop(b_) ? 0 : 1);
  if (sb == 0 || sa == sb) return sa != 0 ? sa : sb;
  if (sa == 0) return sb;
  // opposite signs: the larger of a² and 3b² wins
  cln::cl_RA d = a_ * a_ - 3 * b_ * b_;
  return cln::plusp(d) ? sa : sb;
}

} // namespace ts
