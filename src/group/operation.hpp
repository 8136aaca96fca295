// A point operation: an exact orthogonal 3x3 matrix in a Cartesian frame,
// optionally combined with time reversal (a "primed" operation g').
//
// Symbols follow the Seitz-type convention of International Tables Vol. A:
// `1`, `-1`, `2 [uvw]`, `m [uvw]` (the direction is the mirror NORMAL),
// `3+ [uvw]`, `-4- [uvw]`, ... with + meaning counterclockwise seen from the
// tip of [uvw]; a prime after the rotation part marks time reversal (`2' [001]`,
// `-1'`, `1'`). Directions are written in the lattice basis of the frame
// (docs/conventions.md).
#pragma once

#include "group/matrix3.hpp"

#include <string>

namespace ts {

// The lattice basis in which directions [uvw] are written. The Cartesian frame is
// always x ∥ a; for hexagonal axes a2 lies at 120° from a1 in the xy plane.
enum class LatticeKind { orthogonal, hexagonal };

Vec3 lattice_to_cartesian(const Vec3& uvw, LatticeKind lattice);
// Cartesian direction -> smallest integer [uvw] in the lattice basis, if one exists.
bool cartesian_to_lattice_direction(const Vec3& v, LatticeKind lattice, std::array<long, 3>* uvw);
std::string direction_str(const std::array<long, 3>& uvw); // "[1-10]"

struct OperationKind {
  bool proper = true; // det +1
  int order = 1;      // order n of the rotation part: 1, 2, 3, 4, 6
  int sense = 0;      // +1, -1 for n >= 3 about the canonical axis, else 0
  Vec3 axis{};        // canonical axis (rotation axis / mirror normal), zero for 1 and -1
};

struct Operation {
  Mat3 R = Mat3::identity();
  bool primed = false; // combined with time reversal

  static Operation identity() { return {}; }
  static Operation time_reversal() { return {Mat3::identity(), true}; }
  int det() const; // ±1
  OperationKind kind() const;
  std::string symbol(LatticeKind lattice = LatticeKind::orthogonal) const;

  friend Operation operator*(const Operation& a, const Operation& b) {
    return {a.R * b.R, a.primed != b.primed};
  }
  Operation inverse() const { return {R.transpose(), primed}; }
  friend bool operator==(const Operation& a, const Operation& b) {
    return a.primed == b.primed && a.R == b.R;
  }
  friend bool operator!=(const Operation& a, const Operation& b) { return !(a == b); }
};

// Parse a symbol such as "3+ [111]", "m' [1-10]" or "-1". Throws Error(bad_spec)
// pointing at the offending character; `where` names the source for messages.
Operation parse_operation(const std::string& text, LatticeKind lattice, const std::string& where = {});

// Rotation by 360/n degrees (sense ±1) about the Cartesian axis, times -1 for
// an improper operation. Throws Error(bad_group) when the matrix would leave
// Q(√3) (the axis length does not allow an exact unit vector).
Mat3 rotation_matrix(int n, int sense, const Vec3& axis_cartesian, bool improper);

// A stable ordering of operations for canonical output: 1 first, then proper
// rotations by order, then improper ones, unprimed before primed.
bool canonical_less(const Operation& a, const Operation& b);
// The same order from kinds computed beforehand: kind() costs exact matrix
// arithmetic, so a sort computes it once per operation, not once per comparison.
bool canonical_less(bool a_primed, const OperationKind& ka, bool b_primed, const OperationKind& kb);

} // namespace ts
