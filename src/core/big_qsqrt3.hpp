// Q(√3) on CLN's arbitrary-precision rationals, for code that works on big
// numbers throughout (identification of rotated groups). Conversions to and
// from QSqrt3 are lossless: Rational itself holds numbers of any size.
#pragma once

#include "core/qsqrt3.hpp"

#include <cln/integer.h>
#include <cln/rational.h>

namespace ts {

class BigQSqrt3 {
public:
  BigQSqrt3() : a_(0), b_(0) {}
  BigQSqrt3(const cln::cl_RA& a, const cln::cl_RA& b) : a_(a), b_(b) {}
  explicit BigQSqrt3(const QSqrt3& q)
      : a_(q.rational_part().to_cln()), b_(q.sqrt3_part().to_cln()) {}
  bool is_zero() const { return cln::zerop(a_) && cln::zerop(b_); }
  bool is_rational() const { return cln::zerop(b_); }
  int sign() const; // of a + b√3, exactly
  friend bool operator==(const BigQSqrt3& x, const BigQSqrt3& y) { return (x - y).is_zero(); }
  friend BigQSqrt3 operator+(const BigQSqrt3& x, const BigQSqrt3& y) { return {x.a_ + y.a_, x.b_ + y.b_}; }
  friend BigQSqrt3 operator-(const BigQSqrt3& x, const BigQSqrt3& y) { return {x.a_ - y.a_, x.b_ - y.b_}; }
  friend BigQSqrt3 operator*(const BigQSqrt3& x, const BigQSqrt3& y) {
    return {x.a_ * y.a_ + 3 * x.b_ * y.b_, x.a_ * y.b_ + x.b_ * y.a_};
  }
  friend BigQSqrt3 operator/(const BigQSqrt3& x, const BigQSqrt3& y) {
    cln::cl_RA n = y.a_ * y.a_ - 3 * y.b_ * y.b_;
    BigQSqrt3 p = x * BigQSqrt3(y.a_, -y.b_);
    return {p.a_ / n, p.b_ / n};
  }
  BigQSqrt3& operator-=(const BigQSqrt3& y) { return *this = *this - y; }
  // A size measure for pivot choice: bits of the largest numerator or denominator.
  std::int64_t height() const {
    auto bits = [](const cln::cl_RA& r) {
      return static_cast<std::int64_t>(std::max(cln::integer_length(cln::numerator(r)), cln::integer_length(cln::denominator(r))));
    };
    return std::max(bits(a_), bits(b_));
  }
  // Back to QSqrt3, exactly (parts that fit in 64 bits are stored small again).
  QSqrt3 to_small() const { return QSqrt3(Rational::from_cln(a_), Rational::from_cln(b_)); }

private:
  cln::cl_RA a_, b_;
};

} // namespace ts
