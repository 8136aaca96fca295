// Identification of an arbitrary finite set of point operations as one of
// the 122 magnetic point-group types, with the rotation that carries it to the
// type's standard setting.
#pragma once

#include "group/group_catalogue.hpp"

#include <array>

namespace ts {

struct Identification {
  const NamedGroup* type = nullptr;         // standard representative of the type
  const NamedGroup* same_setting = nullptr; // catalogue group with exactly these operations, if any
  // Directions in the input frame that become x, y, z of the standard setting
  // (exact, unnormalised): the rows of the rotation Q with Q G Q^T = standard.
  std::array<Vec3, 3> standard_axes{};
};

// True when the frame with exact orthogonal rows r (unnormalised) carries g
// onto target: Q g Qᵀ = target with Q the normalised rows.
bool frame_carries(const std::array<Vec3, 3>& rows, const PointGroup& g, const PointGroup& target);

// Lines a frame for the group can be built from: its rotation axes and mirror
// normals, their cross products, x, y, z and their cross products with those,
// each scaled to a rational squared length where possible. Needs no catalogue.
std::vector<Vec3> candidate_lines(const PointGroup& g);
// Scales v (a multiple of √3 becomes rational) and says whether its squared length is rational.
bool rational_length(Vec3& v);

// Throws Error(bad_group) when the operations are not a crystallographic
// (magnetic) point group.
Identification identify(const PointGroup& group, const GroupCatalogue& catalogue);

// The symmetry elements of a group in words, for a person reading a report: one
// entry per element, "mirror ⊥ [1-10]", "2' ∥ [001]", "4 ∥ [001]", "inversion centre",
// directions in the lattice basis. Operations with time reversal are left out of a
// grey group (its type symbol says 1'). At most max_items entries, then "... (N in all)".
std::string elements_in_words(const PointGroup& g, LatticeKind lattice, std::size_t max_items = 6);

} // namespace ts
