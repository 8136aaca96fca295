// Symmetry lowering by the Curie principle: the group that remains is the set
// of operations of the parent that leave every imposed quantity invariant.
// Each quantity transforms by its own law: a polar vector as R·v, an axial
// vector as det(R)·R·v, a time-odd quantity also changes sign under a primed
// operation g' (Birss, Symmetry and Magnetism, 1964).
#pragma once

#include "group/point_group.hpp"

#include <string>

namespace ts {

enum class QuantityKind {
  polar_even,   // polar displacement, electric field, surface normal of an interface
  polar_odd,    // electric current (a flow: reverses under time reversal)
  axial_odd,    // magnetisation, magnetic field
  axial_even,   // rotation of a rigid unit about an axis (pseudovector, time-even)
  strain,       // symmetric rank-2 tensor, time-even
  line,         // an unoriented line (the normal of a slab with two equivalent faces)
};

struct ImposedQuantity {
  QuantityKind kind;
  Vec3 direction;                 // for vectors and lines
  Mat3 tensor = Mat3::identity(); // for strain
};

// The stabiliser of one quantity within g.
PointGroup stabiliser(const PointGroup& g, const ImposedQuantity& q);

// Strain shapes along crystal directions (exact symmetric matrices).
Mat3 uniaxial_strain(const Vec3& d);              // d dᵀ (also describes biaxial strain ⊥ d)
Mat3 shear_strain(const Vec3& d1, const Vec3& d2); // d1 d2ᵀ + d2 d1ᵀ

const char* quantity_kind_name(QuantityKind k);

} // namespace ts
