// The frame in which a tensor's components are written: three exact,
// mutually perpendicular axes given in the crystal's Cartesian frame. Sample
// frames (film normal along z, a chosen in-plane x) are built from crystal
// directions by geometry/sample_frame.hpp.
#pragma once

#include "group/operation.hpp"

#include <array>
#include <string>

namespace ts {

// A right-handed orthogonal frame given by its axes as exact vectors in the
// group's Cartesian frame (not necessarily unit length; squared lengths must be
// rational). Components in the frame are T'_{i..} = A_{ia}··· T_{a..} with
// A_{ia} = ê'_i·ê_a (passive change of frame, docs/conventions.md).
struct Frame {
  std::array<Vec3, 3> axes{Vec3{QSqrt3(1), QSqrt3(0), QSqrt3(0)}, Vec3{QSqrt3(0), QSqrt3(1), QSqrt3(0)},
                           Vec3{QSqrt3(0), QSqrt3(0), QSqrt3(1)}};
  std::array<std::string, 3> labels{"x", "y", "z"}; // how the axes are described (e.g. "[1-10]")
  bool is_identity() const;
  // Throws Error(bad_geometry) unless the axes are nonzero, orthogonal, right-handed with rational squared lengths.
  void validate() const;
};

} // namespace ts
