// Exact numbers a + b·√3 with rational a, b: the field Q(√3). Every matrix
// entry of a crystallographic point operation in its conventional Cartesian
// frame lies in this field ({0, ±1, ±1/2, ±√3/2}), so zeros, equalities and
// signs are decided here without floating point.
#pragma once

#include "core/rational.hpp"

#include <cmath>
#include <string>
#include <utility>

namespace ts {

class QSqrt3 {
public:
  QSqrt3() = default;
  // By value and moved: a Rational has a destructor, so temporaries are not free.
  QSqrt3(Rational a) : a_(std::move(a)) {} // NOLINT: rationals convert implicitly
  QSqrt3(std::int64_t a) : a_(a) {} // NOLINT
  QSqrt3(Rational a, Rational b) : a_(std::move(a)), b_(std::move(b)) {}
  static QSqrt3 sqrt3() { return QSqrt3(0, 1); }

  const Rational& rational_part() const { return a_; }
  const Rational& sqrt3_part() const { return b_; }
  bool is_zero() const { return a_.is_zero() && b_.is_zero(); }
  bool is_rational() const { return b_.is_zero(); }
  double to_double() const { return a_.to_double() + b_.to_double() * std::sqrt(3.0); }

  // Exact sign: compare a with -b√3 through their squares.
  int sign() const {
    int sa = a_.sign(), sb = b_.sign();
    if (sb == 0) return sa;
    if (sa == 0 || sa == sb) return sa == 0 ? sb : sa;
    Rational a2 = a_ * a_, b2 = Rational(3) * b_ * b_;
    if (a2 == b2) return 0;
    return a2 > b2 ? sa : sb;
  }
  QSqrt3 conjugate() const { return QSqrt3(a_, -b_); } // √3 -> -√3
  Rational norm() const { return a_ * a_ - Rational(3) * b_ * b_; }

  friend QSqrt3 operator+(const QSqrt3& x, const QSqrt3& y) { return QSqrt3(x.a_ + y.a_, x.b_ + y.b_); }
  friend QSqrt3 operator-(const QSqrt3& x, const QSqrt3& y) { return QSqrt3(x.a_ - y.a_, x.b_ - y.b_); }
  QSqrt3 operator-() const { return QSqrt3(-a_, -b_); }
  friend QSqrt3 operator*(const QSqrt3& x, const QSqrt3& y) {
    if (x.b_.is_zero() && y.b_.is_zero()) return QSqrt3(x.a_ * y.a_);
    return QSqrt3(x.a_ * y.a_ + Rational(3) * x.b_ * y.b_, x.a_ * y.b_ + x.b_ * y.a_);
  }
  friend QSqrt3 operator/(const QSqrt3& x, const QSqrt3& y) {
    if (y.b_.is_zero()) return QSqrt3(x.a_ / y.a_, x.b_ / y.a_);
    Rational n = y.norm(); // nonzero for y != 0 since √3 is irrational
    QSqrt3 p = x * y.conjugate();
    return QSqrt3(p.a_ / n, p.b_ / n);
  }
  QSqrt3& operator+=(const QSqrt3& y) { return *this = *this + y; }
  QSqrt3& operator-=(const QSqrt3& y) { return *this = *this - y; }
  QSqrt3& operator*=(const QSqrt3& y) { return *this = *this * y; }
  friend bool operator==(const QSqrt3& x, const QSqrt3& y) { return x.a_ == y.a_ && x.b_ == y.b_; }
  friend bool operator!=(const QSqrt3& x, const QSqrt3& y) { return !(x == y); }
  // A total order used only to sort and deduplicate; not the numeric order.
  friend bool lexically_less(const QSqrt3& x, const QSqrt3& y) {
    if (x.a_ != y.a_) return x.a_ < y.a_;
    return x.b_ < y.b_;
  }

  // Plain text such as "-1/2", "sqrt(3)/2", "1/2 - sqrt(3)/2".
  std::string str() const;

private:
  Rational a_, b_;
};

// True when q is the square of a number in Q(√3) of the form r or r·√3 with r
// rational; then *root receives that square root. Used to normalise axes.
bool exact_sqrt_of_rational(const Rational& q, QSqrt3* root);

} // namespace ts
