#include "core/surd.hpp"

#include "core/error.hpp"

#include <algorithm>
#include <cmath>

namespace ts {

std::pair<std::int64_t, std::int64_t> square_free_split(std::int64_t n) {
  if (n <= 0) fail(ErrorKind::internal, "square root of a non-positive integer");
  // Trial division up to 2^21 only: the cofactor left then has no prime below 2^21,
  // and being below 2^63 it has at most two prime factors, so it is 1, p, p^2 or p*q
  // and square-free unless it is a perfect square. This bounds the time on any input.
  constexpr std::int64_t kTrialBound = std::int64_t(1) << 21;
  std::int64_t g = 1, s = 1;
  std::int64_t p = 2;
  for (; p * p <= n && p < kTrialBound; ++p) {
    int e = 0;
    while (n % p == 0) {
      n /= p;
      ++e;
    }
    for (int k = 0; k < e / 2; ++k) g *= p;
    if (e % 2) s *= p;
  }
  if (n > 1 && p * p <= n) {
    auto root = static_cast<std::int64_t>(std::llround(std::sqrt(static_cast<long double>(n))));
    for (std::int64_t r = std::max<std::int64_t>(root - 2, 1); r <= root + 2; ++r)
      if (static_cast<Wide>(r) * r == n) {
        g *= r;
        n = 1;
        break;
      }
  }
  return {g, s * n};
}

void Surd::add_term(std::int64_t radicand, const Rational& coef) {
  if (coef.is_zero()) return;
  auto it = std::lower_bound(terms_.begin(), terms_.end(), radicand,
                             [](const auto& t, std::int64_t r) { return t.first < r; });
  if (it != terms_.end() && it->first == radicand) {
    it->second += coef;
    if (it->second.is_zero()) terms_.erase(it);
  } else {
    terms_.insert(it, {radicand, coef});
  }
}

Surd Surd::sqrt_of(const Rational& q) {
  if (q.sign() < 0) fail(ErrorKind::internal, "square root of a negative number");
  Surd s;
  if (q.is_zero()) return s;
  // √(n/d) = (g1/g2)·√(f1/f2) = g1/(g2·f2)·√(f1·f2), with n = g1²·f1 and d = g2²·f2;
  // f1 and f2 are square-free and coprime, so f1·f2 is square-free.
  auto [g1, f1] = square_free_split(q.num());
  auto [g2, f2] = square_free_split(q.den());
  Wide radicand = static_cast<Wide>(f1) * f2;
  if (radicand > static_cast<Wide>(INT64_MAX))
    fail(ErrorKind::too_large, "a square root in the frame's normalisation outgrows exact 64-bit arithmetic", "",
         "lattice parameters with fewer significant digits (e.g. 3.905 rather than 3.90512)");
  s.add_term(static_cast<std::int64_t>(radicand), Rational(g1) / (Rational(g2) * Rational(f2)));
  return s;
}

Surd operator+(const Surd& a, const Surd& b) {
  Surd r = a;
  for (const auto& [rad, c] : b.terms_) r.add_term(rad, c);
  return r;
}

Surd Surd::operator-() const {
  Surd r = *this;
  for (auto& t : r.terms_) t.second = -t.second;
  return r;
}

Surd operator*(const Surd& a, const Surd& b) {
  Surd r;
  for (const auto& [ra, ca] : a.terms_)
    for (const auto& [rb, cb] : b.terms_) {
      auto [g, f] = square_free_split(ra * rb);
      r.add_term(f, ca * cb * Rational(g));
    }
  return r;
}

double Surd::to_double() const {
  double v = 0;
  for (const auto& [rad, c] : terms_) v += c.to_double() * std::sqrt(static_cast<double>(rad));
  return v;
}

int Surd::sign() const {
  if (terms_.empty()) return 0;
  if (terms_.size() == 1) return terms_[0].second.sign();
  if (terms_.size() == 2) {
    // r1√a + r2√b: compare r1²a with r2²b when the signs differ.
    const auto& [a, r1] = terms_[0];
    const auto& [b, r2] = terms_[1];
    if (r1.sign() == r2.sign()) return r1.sign();
    Rational x = r1 * r1 * Rational(a), y = r2 * r2 * Rational(b);
    if (x == y) return 0; // impossible for distinct square-free radicands, kept for safety
    return x > y ? r1.sign() : r2.sign();
  }
  // More terms only arise in long sums; their magnitude is never near zero in
  // practice, but decide with a generous floating margin and refuse otherwise.
  double v = to_double(), scale = 0;
  for (const auto& [rad, c] : terms_) scale += std::fabs(c.to_double()) * std::sqrt(static_cast<double>(rad));
  if (std::fabs(v) > 1e-9 * scale) return v > 0 ? 1 : -1;
  fail(ErrorKind::internal, "cannot decide the sign of a nested radical sum");
}

} // namespace ts
