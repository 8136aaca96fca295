#include "core/big_qsqrt3.hpp"

namespace ts {

namespace {
Rational small(const cln::cl_RA& r) {
  cln::cl_I n = cln::numerator(r), d = cln::denominator(r);
  if (cln::integer_length(n) > 62 || cln::integer_length(d) > 62)
    fail(ErrorKind::too_large, "exact arithmetic overflow (a coefficient of the result outgrew 64 bits)", "",
         "smaller numbers: lattice parameters with fewer significant digits, smaller Miller indices");
  return Rational(cln::cl_I_to_Q(n), cln::cl_I_to_Q(d));
}
} // namespace

int BigQSqrt3::sign() const {
  int sa = cln::minusp(a_) ? -1 : (cln::zerop(a_) ? 0 : 1);
  int sb = cln::minusp(b_) ? -1 : (cln::zerop(b_) ? 0 : 1);
  if (sb == 0 || sa == sb) return sa != 0 ? sa : sb;
  if (sa == 0) return sb;
  // opposite signs: the larger of a² and 3b² wins
  cln::cl_RA d = a_ * a_ - 3 * b_ * b_;
  return cln::plusp(d) ? sa : sb;
}

QSqrt3 BigQSqrt3::to_small() const { return QSqrt3(small(a_), small(b_)); }

} // namespace ts
