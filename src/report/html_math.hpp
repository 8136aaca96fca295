// Formulas for the HTML report: the plain-text form the program prints
// (GiNaC's "cos(theta)^2*chi_xxz", combinations such as "sqrt(3)/2*d_xxx")
// rewritten with Greek letters, HTML subscripts and superscripts, a middle
// dot for products and a true minus sign. Readable in any browser, with no
// script and no font to load.
#pragma once

#include <string>

namespace ts {

// Escape &, <, >, " for HTML text and attributes.
std::string html_escape(const std::string& s);

// A plain formula as HTML (already escaped).
std::string html_formula(const std::string& plain);

} // namespace ts
