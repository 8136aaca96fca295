// Crystal directions written the way physicists write them: [uvw] (and the
// four-index Miller-Bravais [uvtw] for hexagonal crystals), turned into exact
// Cartesian vectors of the conventional frame.
#pragma once

#include "group/operation.hpp"

#include <array>
#include <string>
#include <vector>

namespace ts {

struct LatticeDirection {
  std::array<long, 3> uvw{};
  std::string text; // as given, normalised: "[1-10]"
};

// The integers inside brackets, "1-10" -> {1, -1, 0}: one digit each, or
// comma-separated when an index has several digits ("1,-12,0"). Blanks are skipped.
std::vector<long> parse_miller_indices(const std::string& body, const std::string& raw, const std::string& where,
                                       const std::string& valid);

// Parse "[uvw]", "[1,-1,0]" or "[uvtw]" (t = -(u+v) is checked). `where` names the field for messages.
LatticeDirection parse_direction(const std::string& text, const std::string& where);

} // namespace ts
