#include "core/surd.hpp"

#include "core/error.hpp"

#include <cln/integer.h>
#include <cln/rational.h>

#include <algorithm>
#include <cmath>
#include <numeric>
#include <optional>

namespace ts {

namespace {

// Radicands are square-free parts of squared axis lengths and their products, so they
// stay far below the numbers of the elimination; they are kept in 64 bits, and one that
// does not fit is refused (never approximated).
const char* radicand_valid =
    "fewer significant digits in the lattice parameters (a cut with three nonzero Miller indices of an "
    "orthorhombic crystal works with 3, e.g. 5.43), or smaller Miller indices";

[[noreturn]] void refuse_radicand(const std::string& what) {
  fail(ErrorKind::too_large, "a square root in the sample frame's normalisation, " + what + ", outgrows 64 bits", "",
       radicand_valid);
}

constexpr std::int64_t kTrialBound = std::int64_t(1) << 21;

// Square-free split of an integer n > 0 beyond 64 bits, by the same trial division as
// the 64-bit one; once the cofactor fits in 64 bits that one finishes the job.
std::optional<std::pair<Rational, Rational>> square_free_split_big(cln::cl_I n) {
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
  // whose square-free part is itself beyond 64 bits unless it hides the square of a
  // prime above 2^21, which trial division cannot tell; the caller refuses it.
  cln::cl_I root;
  if (!cln::sqrtp(n, &root)) return std::nullopt;
  return std::make_pair(Rational::from_cln(g * root), Rational::from_cln(s));
}

// The same for an integer of any size; nothing when that cannot be decided.
std::optional<std::pair<Rational, Rational>> square_free_split_any(const Rational& n) {
  if (!n.is_small()) return square_free_split_big(cln::numerator(n.to_cln()));
  auto [g, s] = square_free_split(n.num());
  return std::make_pair(Rational(g), Rational(s));
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
  auto top = square_free_split_any(q.numerator()), bottom = square_free_split_any(q.denominator());
  if (!top || !bottom) refuse_radicand("sqrt(" + q.str() + ")");
  auto [g1, f1] = *top;
  auto [g2, f2] = *bottom;
  Rational radicand = f1 * f2;
  if (!radicand.is_small()) refuse_radicand("sqrt(" + q.str() + ")");
  s.add_term(radicand.num(), g1 / (g2 * f2));
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
      std::int64_t g = std::gcd(ra, rb);
      Wide f = static_cast<Wide>(ra / g) * (rb / g);
      if (f > static_cast<Wide>(INT64_MAX))
        refuse_radicand("sqrt(" + std::to_string(ra) + ")*sqrt(" + std::to_string(rb) + ")");
      r.add_term(static_cast<std::int64_t>(f), ca * cb * Rational(g));
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
