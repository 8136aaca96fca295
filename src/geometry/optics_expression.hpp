// Optical channel amplitudes written as GiNaC expressions: the parameters,
// cos θ and sin θ of the angle of incidence, and cos/sin of the Fourier angles
// (azimuth φ, polariser and analyser angles). The terms come from the exact
// series (optics_geometry.hpp); GiNaC only writes them.
#pragma once

#include "geometry/optics_geometry.hpp"
#include "geometry/signal_expression.hpp"

namespace ts {

GiNaC::ex optical_amplitude_ex(const std::vector<OpticalTerm>& terms, const AllowedForm& form, ExpressionSymbols& sy);

} // namespace ts
