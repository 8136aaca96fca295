// Frames a tensor is reported in: z along a chosen crystal direction, x along
// a chosen perpendicular direction, y = z × x (always right-handed, so axial
// components need no extra sign).
#pragma once

#include "geometry/crystal_direction.hpp"
#include "tensor/allowed_form.hpp"

#include <string>

namespace ts {

// Throws Error(bad_geometry) when x is not perpendicular to z.
Frame frame_from_directions(const std::string& z, const std::string& x, LatticeKind lattice, const std::string& where);
Frame frame_from_vectors(const Vec3& z, const std::string& z_label, const Vec3& x, const std::string& x_label,
                         LatticeKind lattice, const std::string& where);

} // namespace ts
