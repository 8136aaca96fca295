#include "group/operation.hpp"

#include <cctype>
#include <numeric>

namespace ts {

namespace {

// cos and sin of 360°/n for the crystallographic orders, exactly.
QSqrt3 cos_of_order(int n) {
  switch (n) {
  case 1: return QSqrt3(1);
  case 2: return QSqrt3(-1);
  case 3: return QSqrt3(Rational(-1, 2));
  case 4: return QSqrt3(0);
  case 6: return QSqrt3(Rational(1, 2));
  }
  fail(ErrorKind::bad_group, "rotation of order " + std::to_string(n) + " is not crystallographic",
       {}, "orders 1, 2, 3, 4, 6");
}
QSqrt3 sin_of_order(int n) {
  switch (n) {
  case 1:
  case 2: return QSqrt3(0);
  case 3:
  case 6: return QSqrt3(0, Rational(1, 2));
  case 4: return QSqrt3(1);
  }
  fail(ErrorKind::bad_group, "rotation of order " + std::to_string(n) + " is not crystallographic",
       {}, "orders 1, 2, 3, 4, 6");
}

int first_nonzero_sign(const Vec3& v) {
  for (const auto& c : v)
    if (!c.is_zero()) return c.sign();
  return 0;
}

long long gcd_ll(long long a, long long b) { return std::gcd(a < 0 ? -a : a, b < 0 ? -b : b); }

} // namespace

Vec3 lattice_to_cartesian(const Vec3& uvw, LatticeKind lattice) {
  if (lattice == LatticeKind::orthogonal) return uvw;
  // a1 = (1, 0, 0), a2 = (-1/2, √3/2, 0), c along z (directions only: c/a does
  // not enter the point-group axes, which are either along c or in the plane).
  return {uvw[0] - uvw[1] * QSqrt3(Rational(1, 2)), uvw[1] * QSqrt3(0, Rational(1, 2)), uvw[2]};
}

bool cartesian_to_lattice_direction(const Vec3& v, LatticeKind lattice, std::array<long, 3>* uvw) {
  Vec3 l = v;
  if (lattice == LatticeKind::hexagonal) {
    QSqrt3 beta = v[1] * QSqrt3(0, Rational(2, 3)); // 2 v_y / √3
    l = {v[0] + beta * QSqrt3(Rational(1, 2)), beta, v[2]};
  }
  bool all_rational = true, all_sqrt3 = true;
  for (const auto& c : l) {
    if (!c.sqrt3_part().is_zero()) all_rational = false;
    if (!c.rational_part().is_zero()) all_sqrt3 = false;
  }
  std::array<Rational, 3> r;
  if (all_rational)
    for (int i = 0; i < 3; ++i) r[i] = l[i].rational_part();
  else if (all_sqrt3)
    for (int i = 0; i < 3; ++i) r[i] = l[i].sqrt3_part();
  else
    return false;
  // Integer indices that do not fit in 64 bits have no [uvw] label (the caller writes
  // the vector instead); checked here, since a wrapped product would name a wrong direction.
  for (const auto& x : r)
    if (!x.is_small()) return false;
  constexpr Wide limit = INT64_MAX;
  Wide den = 1;
  for (const auto& x : r) {
    den = den / std::gcd(static_cast<long long>(den), static_cast<long long>(x.den())) * x.den();
    if (den > limit) return false;
  }
  long long n[3], g = 0;
  for (int i = 0; i < 3; ++i) {
    const Wide ni = static_cast<Wide>(r[i].num()) * (den / r[i].den());
    if (ni > limit || ni < -limit) return false;
    n[i] = static_cast<long long>(ni);
    g = gcd_ll(g, n[i]);
  }
  if (g == 0) return false;
  for (int i = 0; i < 3; ++i) (*uvw)[i] = static_cast<long>(n[i] / g);
  return true;
}

std::string direction_str(const std::array<long, 3>& uvw) {
  bool wide = false;
  for (long c : uvw) wide = wide || c > 9 || c < -9;
  std::string s = "[";
  for (int i = 0; i < 3; ++i) {
    if (wide && i) s += ",";
    s += std::to_string(uvw[i]);
  }
  return s + "]";
}

int Operation::det() const { return R.det().sign(); }

OperationKind Operation::kind() const {
  OperationKind k;
  int d = det();
  k.proper = d > 0;
  Mat3 P = k.proper ? R : R.scaled(QSqrt3(-1));
  QSqrt3 t = P.trace();
  if (!t.is_rational() || !t.rational_part().is_integer())
    fail(ErrorKind::bad_group, "operation " + R.str() + " is not crystallographic (trace " + t.str() + ")",
         {}, "rotation parts of order 1, 2, 3, 4 or 6");
  switch (t.rational_part().num()) {
  case 3: k.order = 1; break;
  case -1: k.order = 2; break;
  case 0: k.order = 3; break;
  case 1: k.order = 4; break;
  case 2: k.order = 6; break;
  default:
    fail(ErrorKind::bad_group, "operation " + R.str() + " is not crystallographic", {},
         "rotation parts of order 1, 2, 3, 4 or 6");
  }
  if (k.order == 1) return k;
  Mat3 A = P - Mat3::identity();
  Vec3 axis{};
  for (int i = 0; i < 3 && is_zero(axis); ++i)
    for (int j = i + 1; j < 3 && is_zero(axis); ++j) axis = cross(A.m[i], A.m[j]);
  if (first_nonzero_sign(axis) < 0) axis = -axis;
  k.axis = axis;
  if (k.order >= 3) {
    Vec3 w{P(2, 1) - P(1, 2), P(0, 2) - P(2, 0), P(1, 0) - P(0, 1)}; // 2 sin θ · unit axis
    k.sense = dot(w, axis).sign();
  }
  return k;
}

std::string Operation::symbol(LatticeKind lattice) const {
  OperationKind k = kind();
  std::string s;
  if (k.order == 1) {
    s = k.proper ? "1" : "-1";
    return primed ? s + "'" : s;
  }
  std::array<long, 3> uvw{};
  std::string dir;
  int sense = k.sense;
  if (cartesian_to_lattice_direction(k.axis, lattice, &uvw)) {
    int first = 0;
    for (long c : uvw)
      if (c != 0) {
        first = c > 0 ? 1 : -1;
        break;
      }
    if (first < 0) {
      for (auto& c : uvw) c = -c;
      sense = -sense;
    }
    dir = direction_str(uvw);
  } else {
    dir = vec_str(k.axis); // not a lattice direction: give the Cartesian axis
  }
  if (k.order == 2)
    s = k.proper ? "2" : "m";
  else
    s = std::string(k.proper ? "" : "-") + std::to_string(k.order) + (sense > 0 ? "+" : "-");
  if (primed) s += "'";
  return s + " " + dir;
}

Mat3 rotation_matrix(int n, int sense, const Vec3& d, bool improper) {
  QSqrt3 c = cos_of_order(n), s = sin_of_order(n);
  if (sense < 0) s = -s;
  Mat3 R = Mat3::identity().scaled(c);
  if (n != 1) {
    QSqrt3 len2 = dot(d, d);
    if (len2.is_zero()) fail(ErrorKind::bad_group, "rotation axis is the zero vector");
    if (!len2.is_rational())
      fail(ErrorKind::bad_group, "axis " + vec_str(d) + " has an irrational length in this frame", {},
           "lattice directions of the conventional frame");
    QSqrt3 inv_len2 = QSqrt3(1) / len2;
    QSqrt3 one_minus_c = QSqrt3(1) - c;
    for (int i = 0; i < 3; ++i)
      for (int j = 0; j < 3; ++j) R.m[i][j] += one_minus_c * d[i] * d[j] * inv_len2;
    if (!s.is_zero()) {
      QSqrt3 len;
      if (!exact_sqrt_of_rational(len2.rational_part(), &len))
        fail(ErrorKind::bad_group,
             "a " + std::to_string(n) + "-fold rotation about " + vec_str(d) +
                 " is not exact in Q(sqrt 3): the axis is not a crystallographic " + std::to_string(n) +
                 "-fold axis of this frame",
             {}, "4-fold axes along <100>, 3-fold along <111> (cubic) or [001] (hexagonal), 6-fold along [001]");
      QSqrt3 f = s / len;
      Mat3 K; // f·[d]x
      K.m[0][1] = -d[2] * f;
      K.m[0][2] = d[1] * f;
      K.m[1][0] = d[2] * f;
      K.m[1][2] = -d[0] * f;
      K.m[2][0] = -d[1] * f;
      K.m[2][1] = d[0] * f;
      R = R + K;
    }
  }
  if (!R.is_orthogonal())
    fail(ErrorKind::bad_group, "rotation about " + vec_str(d) + " is not orthogonal in this frame");
  return improper ? R.scaled(QSqrt3(-1)) : R;
}

Operation parse_operation(const std::string& text, LatticeKind lattice, const std::string& where) {
  std::size_t i = 0;
  auto at = [&](std::size_t pos, const std::string& what) -> std::string {
    return "operation '" + text + "', at character " + std::to_string(pos + 1) + ": " + what;
  };
  const std::string valid =
      "1, -1, 2 [uvw], m [uvw], 3+ [uvw], 3- [uvw], 4+ [uvw], -4+ [uvw], 6+ [uvw], -3+ [uvw], ... "
      "with ' for time reversal, e.g. 2' [001], m' [1-10], -1'";
  while (i < text.size() && std::isspace(static_cast<unsigned char>(text[i]))) ++i;
  bool improper = false, primed = false;
  int n = 0, sense = 0;
  if (i < text.size() && text[i] == '-') {
    improper = true;
    ++i;
  }
  if (i >= text.size()) fail(ErrorKind::bad_spec, at(i, "expected a rotation order or m"), where, valid);
  char c = text[i];
  if (c == 'm' && !improper) {
    n = 2;
    improper = true;
  } else if (c == '1' || c == '2' || c == '3' || c == '4' || c == '6') {
    n = c - '0';
  } else {
    fail(ErrorKind::bad_spec, at(i, std::string("unexpected '") + c + "'"), where, valid);
  }
  ++i;
  auto take_prime = [&] {
    if (i < text.size() && text[i] == '\'') {
      primed = true;
      ++i;
    }
  };
  take_prime();
  if (i < text.size() && (text[i] == '+' || text[i] == '-') && n >= 3) {
    sense = text[i] == '+' ? 1 : -1;
    ++i;
  }
  take_prime();
  if (n >= 3 && sense == 0)
    fail(ErrorKind::bad_spec, at(i, "a " + std::to_string(n) + "-fold operation needs a sense, + or -"), where,
         valid);
  while (i < text.size() && std::isspace(static_cast<unsigned char>(text[i]))) ++i;
  if (n == 1) {
    if (i != text.size()) fail(ErrorKind::bad_spec, at(i, "1 and -1 take no direction"), where, valid);
    Mat3 R = improper ? Mat3::identity().scaled(QSqrt3(-1)) : Mat3::identity();
    return {R, primed};
  }
  if (i >= text.size() || text[i] != '[')
    fail(ErrorKind::bad_spec, at(i, "expected a direction such as [001]"), where, valid);
  std::size_t open = i++;
  std::array<long, 3> uvw{};
  int count = 0;
  bool commas = text.find(',', open) != std::string::npos;
  while (i < text.size() && text[i] != ']') {
    if (text[i] == ',' || text[i] == ' ') {
      ++i;
      continue;
    }
    long sign = 1;
    if (text[i] == '-') {
      sign = -1;
      ++i;
    }
    if (i >= text.size() || !std::isdigit(static_cast<unsigned char>(text[i])))
      fail(ErrorKind::bad_spec, at(i, "expected a digit in the direction"), where, valid);
    long value = 0;
    do {
      value = value * 10 + (text[i] - '0');
      ++i;
      // The axes of crystallographic operations have indices 0, ±1, ±2; the bound
      // keeps long digit strings from overflowing.
      if (value > 1000) fail(ErrorKind::too_large, at(i - 1, "a direction index beyond 1000"), where, valid);
    } while (commas && i < text.size() && std::isdigit(static_cast<unsigned char>(text[i])));
    if (count == 3) fail(ErrorKind::bad_spec, at(i - 1, "a direction has three indices"), where, valid);
    uvw[count++] = sign * value;
  }
  if (i >= text.size()) fail(ErrorKind::bad_spec, at(open, "unclosed '['"), where, valid);
  if (count != 3) fail(ErrorKind::bad_spec, at(i, "a direction has three indices"), where, valid);
  ++i;
  while (i < text.size() && std::isspace(static_cast<unsigned char>(text[i]))) ++i;
  if (i != text.size()) fail(ErrorKind::bad_spec, at(i, "unexpected text after the direction"), where, valid);
  if (uvw[0] == 0 && uvw[1] == 0 && uvw[2] == 0)
    fail(ErrorKind::bad_spec, at(open, "the direction [000] has no orientation"), where, valid);
  Vec3 d = lattice_to_cartesian({QSqrt3(uvw[0]), QSqrt3(uvw[1]), QSqrt3(uvw[2])}, lattice);
  try {
    return {rotation_matrix(n, sense, d, improper), primed};
  } catch (const Error& e) {
    fail(e.kind(), "operation '" + text + "': " + e.problem(), where, e.valid());
  }
}

bool canonical_less(const Operation& a, const Operation& b) {
  if (a.primed != b.primed) return !a.primed;
  return canonical_less(a.primed, a.kind(), b.primed, b.kind());
}

bool canonical_less(bool a_primed, const OperationKind& ka, bool b_primed, const OperationKind& kb) {
  if (a_primed != b_primed) return !a_primed;
  if (ka.proper != kb.proper) return ka.proper;
  if (ka.order != kb.order) return ka.order < kb.order;
  for (int i = 0; i < 3; ++i)
    if (ka.axis[i] != kb.axis[i]) return lexically_less(kb.axis[i], ka.axis[i]);
  if (ka.sense != kb.sense) return ka.sense > kb.sense;
  return false;
}

} // namespace ts
