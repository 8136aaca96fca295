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

} // namespace ts
