#include "core/qsqrt3.hpp"

namespace ts {

namespace {
std::string sqrt3_term(const Rational& b) {
  // b·√3 written as "sqrt(3)", "-sqrt(3)/2", "3*sqrt(3)/4".
  std::string s = b.sign() < 0 ? "-" : "";
  Rational n = b.numerator().abs();
  if (n != Rational(1)) s += n.str() + "*";
  s += "sqrt(3)";
  if (!b.is_integer()) s += "/" + b.denominator().str();
  return s;
}
} // namespace

std::string QSqrt3::str() const {
  if (b_.is_zero()) return a_.str();
  if (a_.is_zero()) return sqrt3_term(b_);
  std::string t = sqrt3_term(b_);
  if (t[0] == '-') return a_.str() + " - " + t.substr(1);
  return a_.str() + " + " + t;
}

bool exact_sqrt_of_rational(const Rational& q, QSqrt3* root) {
  Rational r;
  if (q.sign() < 0) return false;
  if (rational_sqrt(q, &r)) {
    *root = QSqrt3(r);
    return true;
  }
  // q = 3 r^2  <=>  sqrt(q) = r·√3
  if (rational_sqrt(q / Rational(3), &r)) {
    *root = QSqrt3(0, r);
    return true;
  }
  return false;
}

} // namespace ts
