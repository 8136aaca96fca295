// The figures of a scenario as JSON: what each picture shows, its caption and
// the sampled curves it draws, so that a script can redraw it.
#pragma once

#include "figure/figure_data.hpp"

#include <toml++/toml.h>

namespace ts {

toml::array figures_json(const std::vector<FigureData>& figures);

} // namespace ts
