// Exact series written out in a fixed order (lowest harmonic first, then the
// order of the parameters), so the same input always gives the same bytes.
// GiNaC orders the terms of a sum by hash values that change from run to run,
// so its printed form is not used in reports.
#pragma once

#include "geometry/optics_geometry.hpp"
#include "report/expression_text.hpp"

#include <toml++/toml.h>

#include <string>
#include <vector>

namespace ts {

// "chi_xxy*sin(3*phi) + (chi_zxx - chi_zzz)*cos(2*phi)"; "0" when empty.
std::string fourier_series_text(const std::vector<FourierTerm>& terms, const AllowedForm& form, TextStyle style);

// The same terms for JSON: [{"function": "sin(3*phi)", "coefficient": "chi_xxy"}, ...].
toml::array fourier_terms_json(const std::vector<FourierTerm>& terms, const AllowedForm& form);

// The same text with the field angles named as the magnetisation's: phiB, thetaB,
// \varphi_B, \theta_B, φ_B, θ_B become phiM, thetaM, ... (for parts expanded in M
// and for a magnetisation direction).
std::string as_magnetisation_angles(std::string s);

// An optical amplitude: per Fourier term its coefficient as a sum over powers
// of cos θ and sin θ, e.g. "-chi_xxy*cos(theta)^3*sin(3*phi) + (chi_zzz)*sin(theta)".
std::string optical_amplitude_text(const std::vector<OpticalTerm>& terms, const AllowedForm& form, TextStyle style);

} // namespace ts
