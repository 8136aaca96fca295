// The figures of a scenario in the reports: as JSON, what each picture shows, its
// caption and the sampled curves it draws, so that a script can redraw it; in the
// text formats, the list of figures with their titles and illustrative values.
#pragma once

#include "figure/figure_data.hpp"

#include "report/report_format.hpp"

#include <toml++/toml.h>

#include <string>

namespace ts {

toml::array figures_json(const std::vector<FigureData>& figures);
std::string write_figures_list(const std::vector<FigureData>& figures, Format format);

} // namespace ts
