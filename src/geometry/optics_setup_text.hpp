// The optical setup in words, for a heading or a caption: shared by the
// reports and the figures, so it sits with the geometry it describes.
#pragma once

#include "geometry/optics_geometry.hpp"

#include <string>

namespace ts {

// "reflection, angle of incidence θ = 45°, sample azimuth φ turning".
std::string optical_setup_text(const OpticalMeasurement& m);

} // namespace ts
