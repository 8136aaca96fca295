#include "core/rational.hpp"

#include <cln/integer.h>
#include <cln/rational.h>
#include <cln/rational_io.h>
#include <cln/real.h>

#include <sstream>

namespace ts {

namespace {

__extension__ typedef unsigned __int128 UnsignedWide;

cln::cl_I wide_integer(Wide v) {
  bool negative = v < 0;
  UnsignedWide m = negative ? -static_cast<UnsignedWide>(v) : static_cast<UnsignedWide>(v);
  cln::cl_I r = cln::cl_I(static_cast<unsigned long long>(m >> 64));
  r = cln::ash(r, 64) + cln::cl_I(static_cast<unsigned long long>(m)); // the low 64 bits
  return negative ? -r : r;
}

// |v| <= INT64_MAX: small numerators exclude INT64_MIN, so that negation stays small.
bool fits_small(const cln::cl_I& v) { return cln::integer_length(cln::abs(v)) <= 63; }

} // namespace

cln::cl_RA Rational::to_cln() const {
  if (den_ == 0) return *big_;
  if (den_ == 1) return cln::cl_I(static_cast<long long>(num_));
  return cln::cl_RA(cln::cl_I(static_cast<long long>(num_))) / cln::cl_I(static_cast<long long>(den_));
}

Rational Rational::from_cln(const cln::cl_RA& value) {
  cln::cl_I n = cln::numerator(value), d = cln::denominator(value);
  Rational r;
  if (fits_small(n) && fits_small(d)) {
    r.num_ = cln::cl_I_to_Q(n);
    r.den_ = cln::cl_I_to_Q(d);
  } else {
    r.big_ = new cln::cl_RA(value);
    r.den_ = 0;
  }
  return r;
}

void Rational::set_big(Wide n, Wide d) {
  big_ = new cln::cl_RA(cln::cl_RA(wide_integer(n)) / wide_integer(d));
  den_ = 0;
}

cln::cl_RA* Rational::clone(const cln::cl_RA* p) { return new cln::cl_RA(*p); }
void Rational::release(cln::cl_RA* p) noexcept { delete p; }

void Rational::refuse_small() {
  fail(ErrorKind::too_large, "a number beyond 64 bits reached a part of the program that needs small numbers", "",
       "smaller numbers: lattice parameters with fewer significant digits, smaller Miller indices");
}

Rational Rational::numerator() const {
  if (den_ != 0) return Rational(num_);
  return from_cln(cln::numerator(*big_));
}

Rational Rational::denominator() const {
  if (den_ != 0) return Rational(den_);
  return from_cln(cln::denominator(*big_));
}

int Rational::bit_height() const {
  if (den_ != 0) {
    auto bits = [](std::int64_t v) { return v == 0 ? 0 : 64 - __builtin_clzll(static_cast<unsigned long long>(v < 0 ? -v : v)); };
    return std::max(bits(num_), bits(den_));
  }
  return static_cast<int>(
      std::max(cln::integer_length(cln::numerator(*big_)), cln::integer_length(cln::denominator(*big_))));
}

bool Rational::big_is_integer() const { return cln::denominator(*big_) == 1; }
int Rational::big_sign() const { return cln::minusp(*big_) ? -1 : 1; } // a big value is never zero
double Rational::big_to_double() const { return cln::double_approx(*big_); }

std::string Rational::big_str() const {
  std::ostringstream os;
  cln::print_rational(os, 10u, *big_); // "n" or "n/d" in decimal, like the small path
  return os.str();
}

Rational Rational::big_negated() const { return from_cln(-*big_); }
Rational Rational::big_sum(const Rational& x, const Rational& y) { return from_cln(x.to_cln() + y.to_cln()); }
Rational Rational::big_difference(const Rational& x, const Rational& y) { return from_cln(x.to_cln() - y.to_cln()); }
Rational Rational::big_product(const Rational& x, const Rational& y) { return from_cln(x.to_cln() * y.to_cln()); }
Rational Rational::big_quotient(const Rational& x, const Rational& y) { return from_cln(x.to_cln() / y.to_cln()); }
bool Rational::big_equal(const Rational& x, const Rational& y) { return *x.big_ == *y.big_; }
bool Rational::big_less(const Rational& x, const Rational& y) { return x.to_cln() < y.to_cln(); }

bool rational_sqrt(const Rational& q, Rational* root) {
  if (q.sign() < 0) return false;
  cln::cl_RA w;
  if (!cln::sqrtp(q.to_cln(), &w)) return false;
  *root = Rational::from_cln(w);
  return true;
}

} // namespace ts
