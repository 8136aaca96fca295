#include "core/qsqrt3.hpp"

namespace ts {

namespace {
std::string sqrt3_term(const Rational& b) {
  // b·√3 written as "sqrt(3)", "-sqrt(3)/2", "3*sqrt(3)/4".
  std::string s = b.sign() < 0 ? "-" : "";
  std::int64_t n = b.num() < 0 ? -b.num() : b.num();
  if (n != 1) s += std::to_string(n) + "*";
  s += "sqrt(3)";
  if (b.den() != 1) s += "/" + std::to_string(b.den());
  return s;
}

bool is_square(std::int64_t n, std::int64_t* root) {
  if (n < 0) return false;
  auto r = static_cast<std::int64_t>(std::llround(std::sqrt(static_cast<double>(n))));
  for (std::int64_t c = r > 1 ? r - 1 : 0; c <= r + 1; ++c)
    if (c * c == n) {
      *root = c;
      return true;
    }
  return false;
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
  std::int64_t rn, rd;
  if (q.sign() < 0) return false;
  if (is_square(q.num(), &rn) && is_square(q.den(), &rd)) {
    *root = QSqrt3(Rational(rn, rd));
    return true;
  }
  // q = 3 r^2  <=>  sqrt(q) = r·√3
  Rational r2 = q / Rational(3);
  if (is_square(r2.num(), &rn) && is_square(r2.den(), &rd)) {
    *root = QSqrt3(0, Rational(rn, rd));
    return true;
  }
  return false;
}

} // namespace ts
