// Bar and optical signals as GiNaC expressions: symbols for the free
// parameters (named after their leading components) and the angles, for
// evaluation and checks. The Fourier coefficients come from the exact series
// (angle_series.hpp), so GiNaC never decides whether a term is zero.
#pragma once

#include "geometry/bar_signal.hpp"

#include <ginac/ginac.h>

#include <map>
#include <string>

namespace ts {

class ExpressionSymbols {
public:
  // The parameter symbol "chi_xxx" (LaTeX \chi_{xxx}).
  const GiNaC::symbol& parameter(const std::string& name);
  const GiNaC::symbol& angle(Angle a);
  const GiNaC::symbol& named(const std::string& name, const std::string& latex);

private:
  std::map<std::string, GiNaC::symbol> symbols_;
};

GiNaC::ex surd_ex(const Surd& s);
GiNaC::ex combination_ex(const Combination& c, const AllowedForm& form, ExpressionSymbols& sy);
// Σ coefficient · cos/sin(k·angles).
GiNaC::ex series_ex(const std::vector<FourierTerm>& terms, const AllowedForm& form, ExpressionSymbols& sy);

// GiNaC's LaTeX of an expression. Its term order follows hash values that
// change from run to run, so reports print series with report/series_text.
std::string ex_latex(const GiNaC::ex& e);

} // namespace ts
