// The figures of a scan fit: the data with the fitted models of the accepted
// and the best hypotheses against the scan angle (polar panels, one per channel, for an SHG
// scan), and their residuals. Measured points are drawn as markers, models as
// lines; the numbers are those of the fit (FitResult), nothing is resampled.
#pragma once

#include "figure/figure_data.hpp"
#include "fit/scan_fit.hpp"

#include <vector>

namespace ts {

// `stem` prefixes the file names ("fit-1"). The models drawn are those the reports
// show (FitResult::shown_models): the accepted hypothesis first, then the best ranked.
std::vector<FigureData> fit_figures(const FitResult& fit, const std::string& stem);

} // namespace ts
