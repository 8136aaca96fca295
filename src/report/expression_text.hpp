// Exact coefficients and linear combinations written out for people: plain
// text ("sqrt(3)/2*d_xxx - d_xyy") and LaTeX ("\frac{\sqrt{3}}{2} d_{xxx}").
#pragma once

#include "tensor/allowed_form.hpp"

#include <string>

namespace ts {

enum class TextStyle { plain, latex };

std::string surd_text(const Surd& s, TextStyle style = TextStyle::plain);
// "d_xxz" -> "d_{xxz}", "chi_xyz" -> "\chi_{xyz}" in LaTeX.
std::string symbol_text(const std::string& name, TextStyle style);
// A component's value as a combination of the form's parameters; "0" when zero.
std::string combination_text(const AllowedForm& form, const std::vector<LinearTerm>& terms,
                             TextStyle style = TextStyle::plain);

} // namespace ts
