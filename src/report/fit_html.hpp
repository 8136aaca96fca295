// The scan fits as one self-contained HTML page (`tensorsieve fit --format
// html`): per fit the ranking, the verdict, the best models and the figures
// inline as SVG. Writers only write: everything comes from the FitRun.
#pragma once

#include "fit/scan_fit.hpp"

#include <string>

namespace ts {

std::string write_fits_html(const FitRun& run);

} // namespace ts
