// The scan fits as one self-contained HTML page (`tensorsieve fit --format
// html`): per fit the Markdown report (ranking, verdict, the models shown with
// their coefficients) through markdown_to_html, and the figures inline as SVG.
// Writers only write: everything comes from the FitRun and its figures.
#pragma once

#include "figure/figure_data.hpp"
#include "fit/scan_fit.hpp"
#include "report/html_report.hpp"

#include <string>

namespace ts {

// `figures`: per fit, its figures (fit_figures), the same ones `--figures` writes.
std::string write_fits_html(const FitRun& run, const std::vector<std::vector<FigureData>>& figures,
                            const HtmlStamp& stamp = {});

} // namespace ts
