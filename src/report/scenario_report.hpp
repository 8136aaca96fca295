// The report of a scenario run: symmetry chain with groups and settings, the
// allowed form of every response part in the sample frame, what each step
// switched on, and the domain variants with their average.
#pragma once

#include "report/json_text.hpp"
#include "report/report_format.hpp"
#include "figure/figure_data.hpp"
#include "scenario/scenario_run.hpp"

#include <string>

namespace ts {

// `figures` (report_figures) are the figures the report carries: their samples in
// JSON, their list in the text formats; nullopt for none.
std::string write_scenario(const ScenarioResult& result, const ReportFigures& figures, Format format);
// The JSON object of write_scenario(result, figures, json), for reports that add to it.
toml::table scenario_json(const ScenarioResult& result, const ReportFigures& figures);

} // namespace ts
