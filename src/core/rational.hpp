// Exact rational numbers, always in lowest terms with a positive denominator.
// Numbers that fit in 64 bits (the entries of point operations, and nearly all
// the numbers of a catalogue) are kept inline and computed with 128-bit
// intermediates: that path is the hot one and allocates nothing. A result that
// outgrows 64 bits becomes an arbitrary-precision rational (CLN's cl_RA, which
// GiNaC brings along) instead of wrapping or failing: measured lattice
// parameters give tensor coefficients in rotated frames with 30 digits and
// more. Every result that fits in 64 bits again is stored small, so each value
// has exactly one representation and equality is a comparison of fields.
#pragma once

#include "core/error.hpp"

#include <cstdint>
#include <string>

namespace cln {
class cl_RA;
}

namespace ts {

// 128-bit intermediates make every 64-bit product exact before it is checked.
__extension__ typedef __int128 Wide;

class Rational {
public:
  Rational() : num_(0), den_(1) {}
  Rational(std::int64_t n) : num_(n), den_(1) { // NOLINT: integers convert implicitly
    if (n == INT64_MIN) set_big(n, 1);           // keeps -x small for every small x
  }
  Rational(std::int64_t n, std::int64_t d) {
    if (d == 0) fail(ErrorKind::internal, "rational number with zero denominator");
    set(static_cast<Wide>(n), static_cast<Wide>(d));
  }
  Rational(const Rational& o) : den_(o.den_) {
    if (den_ != 0) num_ = o.num_;
    else big_ = clone(o.big_);
  }
  Rational(Rational&& o) noexcept : den_(o.den_) {
    if (den_ != 0) {
      num_ = o.num_;
    } else {
      big_ = o.big_;
      o.den_ = 1;
      o.num_ = 0;
    }
  }
  Rational& operator=(const Rational& o) {
    if (den_ != 0 && o.den_ != 0) {
      num_ = o.num_;
      den_ = o.den_;
    } else if (this != &o) {
      Rational copy(o);
      swap(copy);
    }
    return *this;
  }
  Rational& operator=(Rational&& o) noexcept {
    if (den_ != 0 && o.den_ != 0) {
      num_ = o.num_;
      den_ = o.den_;
    } else {
      swap(o);
    }
    return *this;
  }
  ~Rational() {
    if (den_ == 0) release(big_);
  }

  // The exact value on CLN, and back (stored small whenever it fits).
  cln::cl_RA to_cln() const;
  static Rational from_cln(const cln::cl_RA& value);

  bool is_small() const { return den_ != 0; }
  // The 64-bit numerator and denominator, for callers whose numbers are small by
  // construction (entries of point operations); a big value is refused with a
  // too_large error, never truncated. Everything else uses numerator(), denominator().
  std::int64_t num() const {
    if (den_ == 0) refuse_small();
    return num_;
  }
  std::int64_t den() const {
    if (den_ == 0) refuse_small();
    return den_;
  }
  Rational numerator() const;   // an integer, of any size
  Rational denominator() const; // a positive integer, of any size
  Rational abs() const { return sign() < 0 ? -*this : *this; }
  // Bits of the larger of |numerator| and denominator: a size measure for pivot choice.
  int bit_height() const;

  bool is_zero() const { return num_ == 0; } // a big value's pointer is never null
  bool is_integer() const { return den_ == 1 || (den_ == 0 && big_is_integer()); }
  int sign() const {
    if (den_ == 0) return big_sign();
    return (num_ > 0) - (num_ < 0);
  }
  double to_double() const {
    if (den_ == 0) return big_to_double();
    return static_cast<double>(num_) / static_cast<double>(den_);
  }

  friend Rational operator+(const Rational& x, const Rational& y) {
    if (__builtin_expect(x.den_ == 0 || y.den_ == 0, 0)) return big_sum(x, y);
    if (x.den_ == y.den_) return from_wide(static_cast<Wide>(x.num_) + y.num_, x.den_);
    return from_wide(static_cast<Wide>(x.num_) * y.den_ + static_cast<Wide>(y.num_) * x.den_,
                     static_cast<Wide>(x.den_) * y.den_);
  }
  friend Rational operator-(const Rational& x, const Rational& y) {
    if (__builtin_expect(x.den_ == 0 || y.den_ == 0, 0)) return big_difference(x, y);
    if (x.den_ == y.den_) return from_wide(static_cast<Wide>(x.num_) - y.num_, x.den_);
    return from_wide(static_cast<Wide>(x.num_) * y.den_ - static_cast<Wide>(y.num_) * x.den_,
                     static_cast<Wide>(x.den_) * y.den_);
  }
  Rational operator-() const {
    if (den_ == 0) return big_negated();
    Rational r;
    r.num_ = -num_; // small numerators lie in [-INT64_MAX, INT64_MAX]
    r.den_ = den_;
    return r;
  }
  friend Rational operator*(const Rational& x, const Rational& y) {
    if (x.is_zero() || y.is_zero()) return Rational();
    if (__builtin_expect(x.den_ == 0 || y.den_ == 0, 0)) return big_product(x, y);
    if (x.den_ == 1 && y.den_ == 1) return from_wide(static_cast<Wide>(x.num_) * y.num_, 1);
    return from_wide(static_cast<Wide>(x.num_) * y.num_, static_cast<Wide>(x.den_) * y.den_);
  }
  friend Rational operator/(const Rational& x, const Rational& y) {
    if (y.is_zero()) fail(ErrorKind::internal, "exact division by zero");
    if (__builtin_expect(x.den_ == 0 || y.den_ == 0, 0)) return big_quotient(x, y);
    return from_wide(static_cast<Wide>(x.num_) * y.den_, static_cast<Wide>(x.den_) * y.num_);
  }
  Rational& operator+=(const Rational& y) { return *this = *this + y; }
  Rational& operator-=(const Rational& y) { return *this = *this - y; }
  Rational& operator*=(const Rational& y) { return *this = *this * y; }
  Rational& operator/=(const Rational& y) { return *this = *this / y; }

  // One representation per value: a small and a big number always differ.
  friend bool operator==(const Rational& x, const Rational& y) {
    if (x.den_ != y.den_) return false;
    if (x.den_ != 0) return x.num_ == y.num_;
    return big_equal(x, y);
  }
  friend bool operator!=(const Rational& x, const Rational& y) { return !(x == y); }
  friend bool operator<(const Rational& x, const Rational& y) {
    if (__builtin_expect(x.den_ == 0 || y.den_ == 0, 0)) return big_less(x, y);
    return static_cast<Wide>(x.num_) * y.den_ < static_cast<Wide>(y.num_) * x.den_;
  }
  friend bool operator>(const Rational& x, const Rational& y) { return y < x; }
  friend bool operator<=(const Rational& x, const Rational& y) { return !(y < x); }

  std::string str() const {
    if (den_ == 0) return big_str();
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
    if (__builtin_expect(n > lim || n < -lim || d > lim, 0)) {
      set_big(n, d);
      return;
    }
    num_ = static_cast<std::int64_t>(n);
    den_ = static_cast<std::int64_t>(d);
  }
  void swap(Rational& o) noexcept {
    std::int64_t n = num_, d = den_;
    cln::cl_RA* p = big_;
    if (o.den_ != 0) num_ = o.num_;
    else big_ = o.big_;
    den_ = o.den_;
    if (d != 0) o.num_ = n;
    else o.big_ = p;
    o.den_ = d;
  }

  // The slow path, out of line (rational.cpp) so that only it sees CLN, and marked
  // cold so that the small path stays compact where it is inlined.
  [[gnu::cold]] void set_big(Wide n, Wide d); // n/d in lowest terms, d > 0, beyond 64 bits
  [[gnu::cold]] static cln::cl_RA* clone(const cln::cl_RA* p);
  [[gnu::cold]] static void release(cln::cl_RA* p) noexcept;
  [[noreturn, gnu::cold]] static void refuse_small();
  [[gnu::cold]] bool big_is_integer() const;
  [[gnu::cold]] int big_sign() const;
  [[gnu::cold]] double big_to_double() const;
  [[gnu::cold]] std::string big_str() const;
  [[gnu::cold]] Rational big_negated() const;
  [[gnu::cold]] static Rational big_sum(const Rational& x, const Rational& y);
  [[gnu::cold]] static Rational big_difference(const Rational& x, const Rational& y);
  [[gnu::cold]] static Rational big_product(const Rational& x, const Rational& y);
  [[gnu::cold]] static Rational big_quotient(const Rational& x, const Rational& y);
  [[gnu::cold]] static bool big_equal(const Rational& x, const Rational& y);
  [[gnu::cold]] static bool big_less(const Rational& x, const Rational& y);

  // den_ > 0: the value is num_/den_. den_ == 0: the value is *big_, which does
  // not fit in 64 bits, owned by this object. A copy clones the handle, and CLN
  // shares the digits behind it with reference counts that are not atomic: a big
  // value belongs to the thread that made it (big values arise inside one solve
  // and never enter the group and response catalogues that threads share).
  union {
    std::int64_t num_;
    cln::cl_RA* big_;
  };
  std::int64_t den_;
};

// True when q ≥ 0 is the square of a rational; then *root receives the non-negative root.
bool rational_sqrt(const Rational& q, Rational* root);

} // namespace ts
