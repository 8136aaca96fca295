// Crystal directions written the way physicists write them: [uvw] (and the
// four-index Miller-Bravais [uvtw] for hexagonal crystals), turned into exact
// Cartesian vectors of the conventional frame.
#pragma once

#include "group/operation.hpp"

#include <array>
#include <string>

namespace ts {

struct LatticeDirection {
  std::array<long, 3> uvw{};
  std::string text; // as given, normalised: "[1-10]"
};

// Parse "[uvw]", "[1,-1,0]" or "[uvtw]" (t = -(u+v) is checked). `where` names the field for messages.
LatticeDirection parse_direction(const std::string& text, const std::string& where);

// Exact Cartesian vector of a direction. In hexagonal axes a direction with both
// in-plane and c components depends on c/a, which this overload does not know:
// it refuses such directions with Error(bad_geometry).
Vec3 direction_vector(const LatticeDirection& d, LatticeKind lattice, const std::string& where);

} // namespace ts
