// The optical setup in words, for a heading or a caption: shared by the
// reports and the figures, so it sits with the geometry it describes.
#pragma once

#include "geometry/optics_geometry.hpp"

#include <functional>
#include <string>

namespace ts {

// "reflection, angle of incidence θ = 45°, sample azimuth φ turning".
std::string optical_setup_text(const OpticalMeasurement& m);

// The clause every report and caption carries on Fresnel / local-field factors:
// none applied, or the symbols and, with indices, their values. With `escape` (a
// LaTeX escaper from the report layer) the words are escaped and the symbols are
// LaTeX math; without it, plain text.
std::string local_field_text(const OpticalMeasurement& m,
                             const std::function<std::string(const std::string&)>& escape = {});

} // namespace ts
