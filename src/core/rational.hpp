// Exact rational numbers on 64-bit integers, always in lowest terms with a
// positive denominator. Every operation checks for overflow and throws rather
// than wrap: a silently wrapped numerator would turn an allowed component into
// a wrong one. The numbers met in point-group work are small, so a fixed-size
// representation is fast and, with the checks, safe.
#pragma once

#include "core/error.hpp"

#include <cstdint>
#include <numeric>
#include <string>

namespace ts {

// 128-bit intermediates make every 64-bit product exact before it is checked.
__extension__ typedef __int128 Wide;

class Rational {
public:
  constexpr Rational() = default;
  constexpr Rational(std::int64_t n) : num_(n) {} // NOLINT: integers convert implicitly
  Rational(std::int64_t n, std::int64_t d) {
    if (d == 0) fail(ErrorKind::internal, "rational number with zero denominator");
    set(static_cast<Wide>(n), static_cast<Wide>(d));
  }

  std::int64_t num() const { return num_; }
  std::int64_t den() const { return den_; }
  bool is_zero() const { return num_ == 0; }
  bool is_integer() const { return den_ == 1; }
  int sign() const { return (num_ > 0) - (num_ < 0); }
  double to_double() const { return static_cast<double>(num_) / static_cast<double>(den_); }

  friend Rational operator+(const Rational& x, const Rational& y) {
    if (x.den_ == y.den_) return from_wide(static_cast<Wide>(x.num_) + y.num_, x.den_);
    return from_wide(static_cast<Wide>(x.num_) * y.den_ + static_cast<Wide>(y.num_) * x.den_,
                     static_cast<Wide>(x.den_) * y.den_);
  }
  friend Rational operator-(const Rational& x, const Rational& y) { return x + (-y); }
  Rational operator-() const {
    Rational r;
    r.num_ = -num_;
    r.den_ = den_;
    return r;
  }
  friend Rational operator*(const Rational& x, const Rational& y) {
    if (x.num_ == 0 || y.num_ == 0) return Rational();
    if (x.den_ == 1 && y.den_ == 1) return from_wide(static_cast<Wide>(x.num_) * y.num_, 1);
    return from_wide(static_cast<Wide>(x.num_) * y.num_, static_cast<Wide>(x.den_) * y.den_);
  }
  friend Rational operator/(const Rational& x, const Rational& y) {
    if (y.num_ == 0) fail(ErrorKind::internal, "exact division by zero");
    return from_wide(static_cast<Wide>(x.num_) * y.den_, static_cast<Wide>(x.den_) * y.num_);
  }
  Rational& operator+=(const Rational& y) { return *this = *this + y; }
  Rational& operator-=(const Rational& y) { return *this = *this - y; }
  Rational& operator*=(const Rational& y) { return *this = *this * y; }
  Rational& operator/=(const Rational& y) { return *this = *this / y; }

  friend bool operator==(const Rational& x, const Rational& y) {
    return x.num_ == y.num_ && x.den_ == y.den_;
  }
  friend bool operator!=(const Rational& x, const Rational& y) { return !(x == y); }
  friend bool operator<(const Rational& x, const Rational& y) {
    return static_cast<Wide>(x.num_) * y.den_ < static_cast<Wide>(y.num_) * x.den_;
  }
  friend bool operator>(const Rational& x, const Rational& y) { return y < x; }
  friend bool operator<=(const Rational& x, const Rational& y) { return !(y < x); }

  std::string str() const {
    return den_ == 1 ? std::to_string(num_) : std::to_string(num_) + "/" + std::to_string(den_);
  }

private:
  static Rational from_wide(Wide n, Wide d) {
    Rational r;
    r.set(n, d);
    return r;
  }
  void set(Wide n, Wide d) {
    if (d < 0) {
      n = -n;
      d = -d;
    }
    Wide a = n < 0 ? -n : n, b = d;
    while (b != 0) {
      Wide t = a % b;
      a = b;
      b = t;
    }
    if (a > 1) {
      n /= a;
      d /= a;
    }
    constexpr Wide lim = INT64_MAX;
    if (n > lim || n < -lim || d > lim)
      fail(ErrorKind::too_large, "exact arithmetic overflow (a number outgrew 64 bits)", "",
           "smaller numbers: lattice parameters with fewer significant digits, smaller Miller indices");
    num_ = static_cast<std::int64_t>(n);
    den_ = static_cast<std::int64_t>(d);
  }
  std::int64_t num_ = 0;
  std::int64_t den_ = 1;
};

} // namespace ts
