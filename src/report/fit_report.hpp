// The report of scan fits: the ranking of the hypotheses with their statistics,
// the verdict in words, and each fitted model with its coefficients, in text,
// Markdown, LaTeX or JSON. Writers only write: everything comes from FitRun.
#pragma once

#include "fit/scan_fit.hpp"
#include "report/report_format.hpp"

#include <string>

namespace ts {

std::string write_fits(const FitRun& run, Format format);
// One fit's section without the title, for the HTML page and for write_fits.
std::string write_fit_section(const FitResult& fit, Format format);

} // namespace ts
