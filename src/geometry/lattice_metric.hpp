// Lattice metric and cuts. The normal of a surface or interface given as a plane (hkl) (or the
// Miller-Bravais (hkil) of hexagonal crystals) or as a direction [uvw], turned
// into an exact Cartesian vector. A plane normal comes from the reciprocal
// metric, so (hkl) is not parallel to [hkl] when the axes differ in length;
// where that matters and the lattice parameters are missing, the cut is refused.
#pragma once

#include "core/rational.hpp"
#include "geometry/crystal_direction.hpp"
#include "tensor/frame.hpp"

#include <optional>
#include <string>

namespace ts {

// Lattice parameters as exact rationals (decimal input such as 3.905 is read
// exactly as 3905/1000). Only the ratios matter. Angles are the conventional
// ones of the crystal system (90°, or 120° between a and b for hexagonal axes).
struct LatticeMetric {
  std::optional<Rational> a, b, c;
  bool known() const { return a.has_value(); }
};

struct CutNormal {
  Vec3 normal;        // exact Cartesian vector (unnormalised)
  std::string text;   // "(110)", "[111]", "(11-20)"
  bool plane = true;  // given as a plane (hkl) rather than a direction [uvw]
};

// `system` is the crystal system of the parent group ("cubic", "hexagonal", ...).
CutNormal parse_cut(const std::string& text, const std::string& system, LatticeKind lattice,
                    const LatticeMetric& metric, const std::string& where);

// Cartesian vector of a lattice direction [uvw] with the metric applied.
Vec3 metric_direction(const LatticeDirection& d, const std::string& system, LatticeKind lattice,
                      const LatticeMetric& metric, const std::string& where);

// The lattice direction [uvw] of an exact Cartesian vector, the metric applied
// (the inverse of metric_direction); the Cartesian components when there is none.
std::string lattice_direction_label(const Vec3& v, LatticeKind lattice, const LatticeMetric& metric);
// The [uvw] of v when it has integer indices that fit in 64 bits; nothing otherwise.
std::optional<std::string> lattice_direction_indices(const Vec3& v, LatticeKind lattice, const LatticeMetric& metric);

// A lattice parameter written as a decimal number ("3.905", "4.1e0", "41e-1"), read
// exactly. Refused, with the error kind given and `where`, when it is not a plain
// positive decimal (no hex, no trailing text, no NaN), has more than 9 significant
// digits or an exponent beyond +-9.
Rational decimal_length(const std::string& text, const std::string& where, ErrorKind kind);
// The same for a number a TOML reader gave as a double (printed with 9 digits).
Rational exact_decimal(double value, const std::string& where, ErrorKind kind);

} // namespace ts
