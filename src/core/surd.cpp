#include "core/surd.hpp"

#include "core/error.hpp"

#include <cln/integer.h>
#include <cln/rational.h>

#include <algorithm>
#include <cmath>
#include <numeric>

namespace ts {

namespace {

constexpr std::int64_t kTrialBound = std::int64_t(1) << 21;

// Square-free split of an integer n > 0 beyond 64 bits, by the same trial division as
// the 64-bit one; once the cofactor fits in 64 bits that one finishes the job.
std::pair<Rational, Rational> square_free_split_big(cln::cl_I n) {
  cln::cl_I g = 1, s = 1;
  auto strip = [&](std::uint64_t q) {
    cln::cl_I big_q = cln::cl_I(static_cast<unsigned long long>(q));
    int e = 0;
    for (cln::cl_I_div_t d = cln::floor2(n, big_q); cln::zerop(d.remainder); d = cln::floor2(n, big_q)) {
      n = d.quotient;
      ++e;
    }
    for (int k = 0; k < e / 2; ++k) g = g * big_q;
    if (e % 2) s = s * big_q;
  };
  strip(2);
  // Odd candidates three at a time: one big remainder modulo their product (below 2^64).
  for (std::uint64_t p = 3; p < static_cast<std::uint64_t>(kTrialBound) && cln::integer_length(n) > 63; p += 6) {
    std::uint64_t m = p * (p + 2) * (p + 4);
    std::uint64_t r = cln::cl_I_to_UQ(cln::mod(n, cln::cl_I(static_cast<unsigned long long>(m))));
    for (std::uint64_t q : {p, p + 2, p + 4})
      if (r % q == 0) strip(q);
  }
  if (cln::integer_length(n) <= 63) {
    auto [g2, s2] = square_free_split(cln::cl_I_to_Q(n));
    return std::make_pair(Rational::from_cln(g * g2), Rational::from_cln(s * s2));
  }
  // A cofactor beyond 64 bits without prime factors below 2^21: a square, or a number
  // that may hide the square of a prime above 2^21, which trial division cannot tell.
  // It is kept whole in the radicand; Surd::add_term keeps such radicands in distinct
  // square classes, which is all the zero test needs.
  cln::cl_I root;
  if (cln::sqrtp(n, &root)) return std::make_pair(Rational::from_cln(g * root), Rational::from_cln(s));
  return std::make_pair(Rational::from_cln(g), Rational::from_cln(s * n));
}

// The same for an integer of any size.
std::pair<Rational, Rational> square_free_split_any(const Rational& n) {
  if (!n.is_small()) return square_free_split_big(cln::numerator(n.to_cln()));
  auto [g, s] = square_free_split(n.num());
  return {Rational(g), Rational(s)};
}

} // namespace

std::pair<std::int64_t, std::int64_t> square_free_split(std::int64_t n) {
  if (n <= 0) fail(ErrorKind::internal, "square root of a non-positive integer");
  // Trial division up to 2^21 only: the cofactor left then has no prime below 2^21,
  // and being below 2^63 it has at most two prime factors, so it is 1, p, p^2 or p*q
  // and square-free unless it is a perfect square. This bounds the time on any input.
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

void Surd::add_term(const Rational& radicand, const Rational& coef) {
  if (coef.is_zero()) return;
  if (!radicand.is_small()) {
    // A radicand beyond 64 bits: fold it into a radicand of its square class when the
    // Surd has one (r·r_i a perfect square: √r = √(r·r_i)/r_i·√r_i), or into the
    // rational part when it is a square itself.
    const cln::cl_I r = cln::numerator(radicand.to_cln());
    cln::cl_I root;
    if (cln::sqrtp(r, &root)) return add_term(Rational(1), coef * Rational::from_cln(root));
    for (const auto& term : terms_) {
      const Rational ri = term.first; // a copy: add_term may erase the term
      if (ri == Rational(1) || ri == radicand) continue;
      if (cln::sqrtp(r * cln::numerator(ri.to_cln()), &root))
        return add_term(ri, coef * Rational::from_cln(root) / ri);
    }
  } else {
    for (const auto& term : terms_) {
      const Rational ri = term.first; // a copy: add_term may erase the term
      if (ri.is_small()) continue;
      cln::cl_I root;
      if (cln::sqrtp(cln::numerator(radicand.to_cln()) * cln::numerator(ri.to_cln()), &root))
        return add_term(ri, coef * Rational::from_cln(root) / ri);
    }
  }
  auto it = std::lower_bound(terms_.begin(), terms_.end(), radicand,
                             [](const auto& t, const Rational& r) { return t.first < r; });
  if (it != terms_.end() && it->first == radicand) {
    it->second += coef;
    if (it->second.is_zero()) terms_.erase(it);
  } else {
    terms_.insert(it, {radicand, coef});
  }
}

bool operator==(const Surd& a, const Surd& b) {
  if (a.terms_ == b.terms_) return true;
  // Radicands within 64 bits are canonical (square-free); beyond, one square class may
  // be written with two radicands, so compare the values.
  auto big = [](const Surd& s) {
    return std::any_of(s.terms_.begin(), s.terms_.end(), [](const auto& t) { return !t.first.is_small(); });
  };
  return (big(a) || big(b)) && (a - b).is_zero();
}

Surd Surd::sqrt_of(const Rational& q) {
  if (q.sign() < 0) fail(ErrorKind::internal, "square root of a negative number");
  Surd s;
  if (q.is_zero()) return s;
  // √(n/d) = (g1/g2)·√(f1/f2) = g1/(g2·f2)·√(f1·f2), with n = g1²·f1 and d = g2²·f2;
  // f1 and f2 are square-free and coprime, so f1·f2 is square-free.
  auto [g1, f1] = square_free_split_any(q.numerator());
  auto [g2, f2] = square_free_split_any(q.denominator());
  s.add_term(f1 * f2, g1 / (g2 * f2));
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
      // √ra·√rb = g·√((ra/g)(rb/g)) with g = gcd(ra, rb): for square-free ra and rb the
      // two quotients are coprime and square-free, so their product is the new radicand.
      if (ra.is_small() && rb.is_small()) {
        const std::int64_t x = ra.num(), y = rb.num(), g = std::gcd(x, y);
        r.add_term(Rational(x / g) * Rational(y / g), ca * cb * Rational(g));
        continue;
      }
      // A radicand beyond 64 bits may not be square-free: the product is split again
      // when it fits in 64 bits (so small radicands stay square-free), else kept whole
      // and sorted into its square class by add_term.
      const cln::cl_I x = cln::numerator(ra.to_cln()), y = cln::numerator(rb.to_cln()), g = cln::gcd(x, y);
      const Rational f = Rational::from_cln(cln::exquo(x, g) * cln::exquo(y, g));
      Rational coef = ca * cb * Rational::from_cln(g);
      if (f.is_small()) {
        auto [root, rest] = square_free_split(f.num());
        r.add_term(Rational(rest), coef * Rational(root));
      } else {
        r.add_term(f, coef);
      }
    }
  return r;
}

double Surd::to_double() const {
  double v = 0;
  for (const auto& [rad, c] : terms_) v += c.to_double() * std::sqrt(rad.to_double());
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
    Rational x = r1 * r1 * a, y = r2 * r2 * b;
    if (x == y) return 0; // impossible for distinct square-free radicands, kept for safety
    return x > y ? r1.sign() : r2.sign();
  }
  // More terms only arise in long sums; their magnitude is never near zero in
  // practice, but decide with a generous floating margin and refuse otherwise.
  double v = to_double(), scale = 0;
  for (const auto& [rad, c] : terms_) scale += std::fabs(c.to_double()) * std::sqrt(rad.to_double());
  if (std::fabs(v) > 1e-9 * scale) return v > 0 ? 1 : -1;
  fail(ErrorKind::internal, "cannot decide the sign of a nested radical sum");
}

} // namespace ts
