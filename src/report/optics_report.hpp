// The optical sections of a scenario report: per SHG setup, the amplitude
// each source radiates into each polariser-analyser channel (exact GiNaC
// expression), the harmonics of amplitude and intensity, the channels that
// stay dark for every parameter value, and the i-type / c-type interference
// that gives domain contrast. Writers only format ScenarioResult values.
#pragma once

#include "report/report_format.hpp"
#include "scenario/scenario_run.hpp"

#include <toml++/toml.h>

#include <string>

namespace ts {

std::string write_shg(const ScenarioResult& r, Format f);
toml::array shg_json(const ScenarioResult& r);
// Per magneto-optic question: the Kerr geometries the group allows and the
// quadratic (Voigt-type) terms of the magnetisation direction.
std::string write_kerr(const ScenarioResult& r, Format f);
toml::array kerr_json(const ScenarioResult& r);

// "reflection, θ = 45°, sample azimuth φ turning" for a heading or caption.
std::string optical_setup_text(const OpticalMeasurement& m);
// The clause every report and caption carries on Fresnel / local-field
// factors: none applied, or the symbols and, with indices, their values.
std::string local_field_text(const OpticalMeasurement& m, bool latex = false);

} // namespace ts
