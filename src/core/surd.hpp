// Exact real numbers of the form Σ r_k·√s_k (r_k rational, s_k distinct
// square-free positive integers). Components of a tensor seen in a rotated
// sample frame are such numbers (√2, √6, √3/3 ...). Square roots of distinct
// square-free integers are linearly independent over Q, so a Surd is zero
// exactly when every coefficient is: zeros are decided without rounding and
// products like √2·√3 are canonicalised to √6.
//
// Radicands are integers of any size. Those within 64 bits are square-free (they are
// split by trial division, which is complete there); a larger one may hide the square
// of a prime beyond the trial bound, so a Surd never holds two radicands whose product
// is a perfect square (tested exactly): square roots of numbers in distinct square
// classes are linearly independent over Q as well (Besicovitch, J. London Math. Soc.
// 15, 3 (1940), from memory), and the zero test stays exact.
#pragma once

#include "core/qsqrt3.hpp"

#include <cstdint>
#include <string>
#include <utility>
#include <vector>

namespace ts {

class Surd {
public:
  Surd() = default;
  Surd(const Rational& r) { add_term(1, r); }   // NOLINT
  Surd(const QSqrt3& q) {                        // NOLINT
    add_term(1, q.rational_part());
    add_term(3, q.sqrt3_part());
  }
  // √q for a positive rational q.
  static Surd sqrt_of(const Rational& q);

  bool is_zero() const { return terms_.empty(); }
  bool is_rational() const { return terms_.empty() || (terms_.size() == 1 && terms_[0].first == 1); }
  int sign() const; // exact
  double to_double() const;
  const std::vector<std::pair<Rational, Rational>>& terms() const { return terms_; } // {radicand, coefficient}

  friend Surd operator+(const Surd& a, const Surd& b);
  friend Surd operator-(const Surd& a, const Surd& b) { return a + (-b); }
  Surd operator-() const;
  friend Surd operator*(const Surd& a, const Surd& b);
  Surd& operator+=(const Surd& b) { return *this = *this + b; }
  friend bool operator==(const Surd& a, const Surd& b);
  friend bool operator!=(const Surd& a, const Surd& b) { return !(a == b); }

private:
  void add_term(const Rational& radicand, const Rational& coef);
  std::vector<std::pair<Rational, Rational>> terms_; // sorted by radicand, no zero coefficients
};

// Split n > 0 as g^2 · s with s square-free; returns {g, s}.
std::pair<std::int64_t, std::int64_t> square_free_split(std::int64_t n);

} // namespace ts
