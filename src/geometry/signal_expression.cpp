#include "geometry/signal_expression.hpp"

#include <sstream>

namespace ts {

namespace {

// "chi_xxx" -> "\chi_{xxx}", "gamma_xxxy" -> "\gamma_{xxxy}", "R_xz" -> "R_{xz}".
std::string latex_name(const std::string& name) {
  static const char* greek[] = {"alpha", "beta",  "gamma", "delta", "epsilon", "zeta", "eta",   "theta",
                                "kappa", "lambda", "mu",   "nu",    "xi",      "pi",   "rho",   "sigma",
                                "tau",   "phi",   "chi",   "psi",   "omega",   "Gamma", "Lambda", "Delta"};
  std::size_t us = name.find('_');
  std::string head = us == std::string::npos ? name : name.substr(0, us);
  std::string tail = us == std::string::npos ? "" : name.substr(us + 1);
  for (const char* g : greek)
    if (head == g) head = std::string("\\") + g;
  if (head == "\\eps" || head == "eps") head = "\\varepsilon";
  return tail.empty() ? head : head + "_{" + tail + "}";
}

} // namespace

const GiNaC::symbol& ExpressionSymbols::named(const std::string& name, const std::string& latex) {
  auto it = symbols_.find(name);
  if (it == symbols_.end()) it = symbols_.emplace(name, GiNaC::symbol(name, latex)).first;
  return it->second;
}

const GiNaC::symbol& ExpressionSymbols::parameter(const std::string& name) { return named(name, latex_name(name)); }

const GiNaC::symbol& ExpressionSymbols::angle(Angle a) { return named(angle_symbol(a), angle_symbol(a, true)); }

GiNaC::ex surd_ex(const Surd& s) {
  GiNaC::ex e = 0;
  for (const auto& [radicand, r] : s.terms()) {
    GiNaC::ex c = GiNaC::numeric(cln::cl_N(r.to_cln()));
    // sqrt of an ex, not of a numeric: GiNaC's numeric overload of sqrt returns a float.
    e += radicand == Rational(1) ? c : c * GiNaC::sqrt(GiNaC::ex(GiNaC::numeric(cln::cl_N(radicand.to_cln()))));
  }
  return e;
}

GiNaC::ex combination_ex(const Combination& c, const AllowedForm& form, ExpressionSymbols& sy) {
  GiNaC::ex e = 0;
  for (const auto& t : c) e += surd_ex(t.coefficient) * sy.parameter(form.parameter_name(t.parameter));
  return e;
}

GiNaC::ex series_ex(const std::vector<FourierTerm>& terms, const AllowedForm& form, ExpressionSymbols& sy) {
  GiNaC::ex e = 0;
  for (const auto& t : terms) {
    GiNaC::ex arg = 0;
    for (int i = 0; i < angle_count; ++i)
      if (t.k[i] != 0) arg += t.k[i] * sy.angle(static_cast<Angle>(i));
    GiNaC::ex f = arg.is_zero() ? GiNaC::ex(1) : (t.sine ? GiNaC::sin(arg) : GiNaC::cos(arg));
    e += combination_ex(t.coefficient, form, sy) * f;
  }
  return e;
}

std::string ex_latex(const GiNaC::ex& e) {
  std::ostringstream os;
  os << GiNaC::latex << e;
  return os.str();
}

} // namespace ts
