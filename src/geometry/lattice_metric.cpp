#include "geometry/lattice_metric.hpp"

#include "core/error.hpp"

#include <cctype>
#include <cmath>
#include <cstdio>
#include <vector>

namespace ts {

Rational decimal_length(const std::string& text, const std::string& where, ErrorKind kind) {
  const std::string valid = "a positive decimal length such as 3.905 (at most 9 significant digits, e.g. 4.1e0)";
  auto refuse = [&](const std::string& why) -> Rational {
    fail(kind, "lattice parameter '" + text + "' " + why, where, valid);
  };
  std::size_t i = 0;
  std::int64_t digits = 0;
  int significant = 0, scale = 0;
  bool any = false, point = false;
  for (; i < text.size(); ++i) {
    char ch = text[i];
    if (ch == '.' && !point) {
      point = true;
      continue;
    }
    if (!std::isdigit(static_cast<unsigned char>(ch))) break;
    any = true;
    if (digits == 0 && ch == '0') {
      if (point) --scale;
      continue;
    }
    if (++significant > 9) refuse("has more than 9 significant digits");
    digits = digits * 10 + (ch - '0');
    if (point) --scale;
  }
  if (!any) refuse("is not a decimal number");
  if (i < text.size() && (text[i] == 'e' || text[i] == 'E')) {
    ++i;
    int sign = 1;
    if (i < text.size() && (text[i] == '+' || text[i] == '-')) sign = text[i++] == '-' ? -1 : 1;
    int e = 0;
    std::size_t from = i;
    while (i < text.size() && std::isdigit(static_cast<unsigned char>(text[i])) && i - from < 3) e = e * 10 + (text[i++] - '0');
    if (i == from) refuse("has an exponent without digits");
    scale += sign * e;
  }
  if (i != text.size()) refuse("has unexpected text after the number");
  if (digits == 0) refuse("is not positive");
  if (scale < -18 || scale > 9) refuse("is out of range (exponent beyond +-9)");
  std::int64_t pow10 = 1;
  for (int k = 0; k < (scale < 0 ? -scale : scale); ++k) pow10 *= 10;
  if (scale >= 0 && digits > INT64_MAX / pow10) refuse("is out of range");
  return scale >= 0 ? Rational(digits * pow10) : Rational(digits, pow10);
}

Rational exact_decimal(double value, const std::string& where, ErrorKind kind) {
  if (!std::isfinite(value) || value <= 0)
    fail(kind, "lattice parameter " + std::to_string(value) + " is not a positive number", where,
         "a positive decimal length such as 3.905");
  char buf[64];
  std::snprintf(buf, sizeof buf, "%.9g", value);
  return decimal_length(buf, where, kind);
}

namespace {

const char* cut_help = "a plane (hkl) such as (110), (11-20) for hexagonal axes, or a direction [uvw] such as [111]";

bool needs_metric(const std::array<long, 3>& v, const std::string& system) {
  int nonzero_ab = (v[0] != 0) + (v[1] != 0);
  if (system == "cubic") return false;
  if (system == "tetragonal" || system == "hexagonal" || system == "trigonal") return v[2] != 0 && nonzero_ab > 0;
  if (system == "orthorhombic") return nonzero_ab + (v[2] != 0) > 1;
  return true;
}

void require_metric(const std::array<long, 3>& v, const std::string& system, const LatticeMetric& m,
                    const std::string& text, const std::string& where) {
  if (system == "monoclinic" || system == "triclinic") {
    bool along_axis = (v[0] != 0) + (v[1] != 0) + (v[2] != 0) == 1;
    if (!along_axis)
      fail(ErrorKind::bad_geometry,
           text + ": oblique cuts of monoclinic and triclinic crystals need the full metric, which exact arithmetic "
                  "does not cover",
           where, "a cut along a crystal axis, or describe the sample in the frame of an orthogonal parent");
    return;
  }
  if (!needs_metric(v, system)) return;
  bool ok = m.a.has_value() && m.c.has_value();
  if (system == "orthorhombic") ok = ok && m.b.has_value();
  // Indices of a trigonal group are read in hexagonal axes; a user thinking in
  // rhombohedral axes meant (hkl)_R = (h-k, k-l, h+k+l)_H, e.g. (111)_R = (0001).
  std::string rhombohedral;
  if (system == "trigonal" && v[0] == v[1] && v[1] == v[2])
    rhombohedral = "; indices are read in hexagonal axes: the rhombohedral (111) is the hexagonal (0001), --cut "
                   "\"(0001)\", which needs no lattice parameters";
  if (!ok)
    fail(ErrorKind::bad_geometry,
         text + " in " + (system == "orthorhombic" ? "an " : "a ") + system +
             " crystal depends on the axis ratios; give the lattice parameters" + rhombohedral,
         where,
         system == "orthorhombic" ? "lattice = { a = ..., b = ..., c = ... } in a scenario, --a --b --c on the command line"
                                  : "lattice = { a = ..., c = ... } in a scenario, --a --c on the command line");
}

} // namespace

std::optional<std::string> lattice_direction_indices(const Vec3& v, LatticeKind lattice, const LatticeMetric& m) {
  Rational a = m.a.value_or(Rational(1)), b = m.b.value_or(a), c = m.c.value_or(a);
  Vec3 w = lattice == LatticeKind::hexagonal ? Vec3{v[0] / QSqrt3(a), v[1] / QSqrt3(a), v[2] / QSqrt3(c)}
                                             : Vec3{v[0] / QSqrt3(a), v[1] / QSqrt3(b), v[2] / QSqrt3(c)};
  std::array<long, 3> uvw{};
  if (cartesian_to_lattice_direction(w, lattice, &uvw)) return direction_str(uvw);
  return std::nullopt;
}

std::string lattice_direction_label(const Vec3& v, LatticeKind lattice, const LatticeMetric& m) {
  return lattice_direction_indices(v, lattice, m).value_or(vec_str(v));
}

Vec3 metric_direction(const LatticeDirection& d, const std::string& system, LatticeKind lattice,
                      const LatticeMetric& m, const std::string& where) {
  require_metric(d.uvw, system, m, d.text, where);
  if (!needs_metric(d.uvw, system) || system == "monoclinic" || system == "triclinic")
    return lattice_to_cartesian({QSqrt3(d.uvw[0]), QSqrt3(d.uvw[1]), QSqrt3(d.uvw[2])}, lattice);
  Rational a = *m.a, b = m.b.value_or(a), c = *m.c;
  if (lattice == LatticeKind::hexagonal) {
    Vec3 inplane = lattice_to_cartesian({QSqrt3(d.uvw[0]), QSqrt3(d.uvw[1]), QSqrt3(0)}, lattice);
    return {inplane[0] * QSqrt3(a), inplane[1] * QSqrt3(a), QSqrt3(c * Rational(d.uvw[2]))};
  }
  return {QSqrt3(a * Rational(d.uvw[0])), QSqrt3(b * Rational(d.uvw[1])), QSqrt3(c * Rational(d.uvw[2]))};
}

CutNormal parse_cut(const std::string& raw, const std::string& system, LatticeKind lattice, const LatticeMetric& m,
                    const std::string& where) {
  std::string text;
  for (char ch : raw)
    if (ch != ' ') text += ch;
  if (text.size() >= 2 && text.front() == '[') {
    LatticeDirection d = parse_direction(text, where);
    return {metric_direction(d, system, lattice, m, where), d.text, false};
  }
  if (text.size() < 2 || text.front() != '(' || text.back() != ')')
    fail(ErrorKind::bad_geometry, "'" + raw + "' is not a cut", where, cut_help);
  std::vector<long> idx = parse_miller_indices(text.substr(1, text.size() - 2), raw, where, cut_help);
  std::array<long, 3> hkl{};
  if (idx.size() == 4) {
    if (lattice != LatticeKind::hexagonal)
      fail(ErrorKind::bad_geometry, "'" + raw + "': four-index (hkil) planes belong to hexagonal axes", where, cut_help);
    if (idx[2] != -(idx[0] + idx[1]))
      fail(ErrorKind::bad_geometry, "'" + raw + "': in (hkil) the third index must be i = -(h+k)", where, cut_help);
    hkl = {idx[0], idx[1], idx[3]};
  } else if (idx.size() == 3) {
    hkl = {idx[0], idx[1], idx[2]};
  } else {
    fail(ErrorKind::bad_geometry, "'" + raw + "' has " + std::to_string(idx.size()) + " indices", where, cut_help);
  }
  if (hkl[0] == 0 && hkl[1] == 0 && hkl[2] == 0)
    fail(ErrorKind::bad_geometry, "'" + raw + "' is not a plane", where, cut_help);
  std::string label = "(";
  for (long v : idx) label += std::to_string(v);
  label += ")";
  require_metric(hkl, system, m, label, where);
  bool metric = needs_metric(hkl, system) && system != "monoclinic" && system != "triclinic";
  Rational a = m.a.value_or(Rational(1)), b = m.b.value_or(a), c = m.c.value_or(a);
  if (!metric) a = b = c = Rational(1);
  Vec3 n;
  if (lattice == LatticeKind::hexagonal) {
    // Reciprocal vectors of a1 = a(1,0,0), a2 = a(-1/2, √3/2, 0), a3 = c(0,0,1), times √3·a:
    // n = (√3 h, h + 2k, √3 (a/c) l).
    n = {QSqrt3(0, Rational(hkl[0])), QSqrt3(Rational(hkl[0] + 2 * hkl[1])), QSqrt3(0, a / c * Rational(hkl[2]))};
  } else {
    // n = (h/a, k/b, l/c), times a·b·c to keep it short.
    n = {QSqrt3(Rational(hkl[0]) * b * c), QSqrt3(Rational(hkl[1]) * a * c), QSqrt3(Rational(hkl[2]) * a * b)};
  }
  return {n, label, true};
}

} // namespace ts
