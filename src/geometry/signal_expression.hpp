// Bar signals written as GiNaC expressions: symbols for the free parameters
// (named after their leading components), the angles and the bar (L, w, t,
// I, rho0), printed as plain text and as LaTeX. The Fourier coefficients come
// from the exact series (angle_series.hpp), so GiNaC only writes the
// expression; it never decides whether a term is zero.
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

// R_n of V = R_n I^n for a probe: L (or w) · S_p / (w t)^n, times -rho0^(n+1)
// for a part written for a driving field (leading order, docs/hall-bars.md).
GiNaC::ex probe_coefficient_ex(const PartSignal& ps, const ProbeSignal& probe, const AllowedForm& form,
                               ExpressionSymbols& sy);

std::string ex_text(const GiNaC::ex& e);
std::string ex_latex(const GiNaC::ex& e);

} // namespace ts
