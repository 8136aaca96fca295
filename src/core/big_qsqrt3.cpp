#include "core/big_qsqrt3.hpp"

namespace ts {

namespace {
Rational small(const cln::cl_RA& r) {
  cln::cl_I n = cln::numerator(r), d = cln::denominator(r);
  if (cln::integer_length(n) > 62 || cln::integer_length(d) > 62)
    fail(ErrorKind::internal, "exact arithmetic overflow (a coefficient of the result outgrew 64 bits)");
  return Rational(cln::cl_I_to_Q(n), cln::cl_I_to_Q(d));
}
} // namespace

QSqrt3 BigQSqrt3::to_small() const { return QSqrt3(small(a_), small(b_)); }

} // namespace ts
