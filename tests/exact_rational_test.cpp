// The hybrid Rational: 64-bit numbers inline, bigger ones on CLN, one representation
// per value. Reference values are exact integer arithmetic as Python's integers and
// fractions.Fraction give it (an outside implementation; each value printed by
// python3 -c "..."), and INT64_MAX = 2^63 - 1 = 9223372036854775807 (common practice).
#include "core/error.hpp"
#include "core/qsqrt3.hpp"
#include "core/rational.hpp"
#include "core/surd.hpp"

#include <catch2/catch.hpp>

#include <cln/rational.h>

#include <cstdint>

using namespace ts;

namespace {
const Rational max64(INT64_MAX);
}

TEST_CASE("the overflow boundary at INT64_MAX", "[rational]") {
  CHECK(max64.is_small());
  CHECK(max64.str() == "9223372036854775807");
  Rational over = max64 + Rational(1);
  CHECK_FALSE(over.is_small());
  CHECK(over.str() == "9223372036854775808"); // Python: 2**63
  CHECK(over.is_integer());
  CHECK(over.sign() == 1);
  Rational back = over - Rational(1);
  CHECK(back.is_small()); // a result that fits is stored small again
  CHECK(back == max64);
  // -2^63 fits in int64_t but is kept big, so that negating a small number stays small
  Rational low = -max64 - Rational(1);
  CHECK_FALSE(low.is_small());
  CHECK(low.str() == "-9223372036854775808");
  CHECK(Rational(INT64_MIN) == low);
  CHECK(-low == over);
}

TEST_CASE("big products and quotients are exact and normalise back", "[rational]") {
  Rational square = max64 * max64;
  CHECK(square.str() == "85070591730234615847396907784232501249"); // Python: (2**63-1)**2
  CHECK(square / max64 == max64);
  CHECK((square / max64).is_small());
  CHECK((max64 / Rational(3) + max64 / Rational(5)).str() == "73786976294838206456/15");
  Rational tiny = Rational(1) / max64 * (Rational(1) / (max64 - Rational(1)));
  CHECK(tiny.str() == "1/85070591730234615838173535747377725442");
  CHECK(tiny.numerator() == Rational(1));
  CHECK(tiny.denominator().str() == "85070591730234615838173535747377725442");
  CHECK_FALSE(tiny.is_integer());
  CHECK(square / (square * Rational(2)) == Rational(1, 2));
  CHECK((max64 / Rational(2) * (Rational(2) / max64)) == Rational(1));
  CHECK((square - square).is_zero());
  CHECK((square - square).is_small());
}

TEST_CASE("mixed small and big arithmetic, comparison and sign", "[rational]") {
  Rational big = max64 * Rational(10);
  Rational small(7, 3);
  CHECK((big + small) - big == small);
  CHECK((small - big) + big == small);
  CHECK(small < big);
  CHECK(-big < small);
  CHECK(-big < -small);
  CHECK(big > small);
  CHECK_FALSE(big < big);
  CHECK(big <= big);
  CHECK(big != small);
  CHECK(big == max64 * Rational(5) * Rational(2));
  CHECK((-big).sign() == -1);
  CHECK((-big).abs() == big);
  CHECK(big.bit_height() == 67); // 10 (2^63 - 1) < 2^67
  CHECK(Rational(5, 8).bit_height() == 4);
  CHECK(big.to_double() == Approx(9.223372036854775807e19));
  // copies and moves keep the value
  Rational copy = big;
  Rational moved = std::move(copy);
  CHECK(moved == big);
  copy = small;
  CHECK(copy == small);
  copy = big;
  copy = copy; // self-assignment
  CHECK(copy == big);
}

TEST_CASE("the 64-bit view of a big number is refused, never truncated", "[rational]") {
  Rational big = max64 + Rational(1);
  CHECK(max64.num() == INT64_MAX);
  CHECK_THROWS_AS(big.num(), Error);
  try {
    (void)big.den();
  } catch (const Error& e) {
    CHECK(e.kind() == ErrorKind::too_large);
  }
}

TEST_CASE("CLN round trip and exact square roots of big rationals", "[rational]") {
  Rational big = max64 * max64 / Rational(49);
  CHECK(Rational::from_cln(big.to_cln()) == big);
  CHECK(Rational::from_cln(cln::cl_RA(12) / 8) == Rational(3, 2));
  CHECK(Rational::from_cln(cln::cl_RA(12) / 8).is_small());
  Rational root;
  REQUIRE(rational_sqrt(big, &root));
  CHECK(root == max64 / Rational(7));
  CHECK_FALSE(rational_sqrt(big * Rational(2), &root));
  // 3 (2^63-1)^2 / 4 = (sqrt(3) (2^63-1) / 2)^2
  QSqrt3 q;
  REQUIRE(exact_sqrt_of_rational(Rational(3) * max64 * max64 / Rational(4), &q));
  CHECK(q == QSqrt3(Rational(0), max64 / Rational(2)));
  CHECK(q.str() == "9223372036854775807*sqrt(3)/2");
}

TEST_CASE("surds with big coefficients and square roots of big rationals", "[rational][surd]") {
  // sqrt(2 (2^63-1)^2 / 9) = (2^63-1)/3 sqrt(2)
  Surd s = Surd::sqrt_of(Rational(2) * max64 * max64 / Rational(9));
  REQUIRE(s.terms().size() == 1);
  CHECK(s.terms()[0].first == 2);
  CHECK(s.terms()[0].second == max64 / Rational(3));
  // √6·√10 = 2√15 (common practice), with big coefficients
  Surd p = Surd::sqrt_of(Rational(6)) * Surd::sqrt_of(Rational(10)) * Surd(max64 * max64);
  REQUIRE(p.terms().size() == 1);
  CHECK(p.terms()[0].first == 15);
  CHECK(p.terms()[0].second == Rational(2) * max64 * max64);
  CHECK((p - p).is_zero());
  // sympy.factorint: 2^63-1 = 7^2·73·127·337·92737·649657, 2^63-3 = 5·23·53301701·1504703107.
  // A big square of primes above the trial-division bound 2^21 is still found:
  const Rational pq = Rational(53301701) * Rational(1504703107);
  Surd r = Surd::sqrt_of(Rational(2) * pq * pq);
  REQUIRE(r.terms().size() == 1);
  CHECK(r.terms()[0].first == 2);
  CHECK(r.terms()[0].second == pq);
  // A square root whose square-free part does not fit in 64 bits: that of (2^63-1)(2^63-3)
  // is 1736134525106828894468370687969856115 (sympy), with 7 outside.
  const Rational free_part = max64 * (max64 - Rational(2)) / Rational(49);
  CHECK(free_part.str() == "1736134525106828894468370687969856115");
  Surd b = Surd::sqrt_of(max64 * (max64 - Rational(2)));
  REQUIRE(b.terms().size() == 1);
  CHECK(b.terms()[0].first == free_part);
  CHECK(b.terms()[0].second == Rational(7));
  // A radicand beyond 64 bits that hides the square of a prime above the trial-division
  // bound (p = 53301701, q = 1504703107, both prime by sympy.factorint above): sqrt(p^2 q)
  // is kept whole, yet equals p sqrt(q) exactly, and their difference is an exact zero.
  const Rational p53(53301701), q15(1504703107);
  Surd hidden = Surd::sqrt_of(p53 * p53 * q15);
  Surd plain = Surd::sqrt_of(q15) * Surd(p53);
  CHECK(hidden == plain);
  CHECK((hidden - plain).is_zero());
  CHECK((plain - hidden).is_zero());
  CHECK_FALSE((hidden - plain * Surd(Rational(2))).is_zero());
  CHECK((hidden * hidden).is_rational());
  CHECK((hidden * hidden) == Surd(p53 * p53 * q15));
  CHECK((hidden * Surd::sqrt_of(q15)) == Surd(p53 * q15));
}
