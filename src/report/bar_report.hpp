// The Hall-bar sections of a scenario report: per bar, what each probe reads
// from each response part (exact Fourier series, R_n in text and LaTeX,
// lock-in readings per harmonic, the Hall/gradient split, orientations where
// a probe reads zero for every parameter value, and which Fourier terms tell
// the parts apart); per layout, the bars to pattern. Writers only format the
// values of ScenarioResult.
#pragma once

#include "report/report_format.hpp"
#include "scenario/scenario_run.hpp"

#include <toml++/toml.h>

#include <string>

namespace ts {

// The title of a part in every section of a scenario report: "name [id]: label",
// "tensor SPEC" for an extra tensor, and for a linear Hall part that only the
// applied field allows, a title that says so (not the spontaneous effect).
std::string part_title(const PartForms& p);

std::string write_bars(const ScenarioResult& r, Format f);
std::string write_layouts(const ScenarioResult& r, Format f);
toml::array bars_json(const ScenarioResult& r);
toml::array layouts_json(const ScenarioResult& r);

} // namespace ts
