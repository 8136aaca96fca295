#include "report/expression_text.hpp"

#include <set>

namespace ts {

namespace {

std::string rational_latex(const Rational& r, const std::string& times) {
  // r·times with r > 0 written as a fraction.
  std::string num = r.numerator().str();
  if (times.empty()) return r.is_integer() ? num : "\\frac{" + num + "}{" + r.denominator().str() + "}";
  std::string top = r.numerator() == Rational(1) ? times : num + times;
  return r.is_integer() ? top : "\\frac{" + top + "}{" + r.denominator().str() + "}";
}

// One term r·√s without its sign.
std::string term_text(const Rational& mag, const Rational& rad, TextStyle style) {
  const bool rational = rad == Rational(1);
  if (style == TextStyle::latex) {
    std::string root = rational ? "" : "\\sqrt{" + rad.str() + "}";
    return rational_latex(mag, root);
  }
  std::string root = "sqrt(" + rad.str() + ")";
  if (rational) return mag.str();
  std::string s = mag.numerator() == Rational(1) ? root : mag.numerator().str() + "*" + root;
  if (!mag.is_integer()) s += "/" + mag.denominator().str();
  return s;
}

} // namespace

std::string surd_text(const Surd& s, TextStyle style) {
  if (s.is_zero()) return "0";
  std::string out;
  bool first = true;
  for (const auto& [rad, c] : s.terms()) {
    Rational mag = c.sign() < 0 ? -c : c;
    if (first) out += c.sign() < 0 ? "-" : "";
    else out += c.sign() < 0 ? " - " : " + ";
    out += term_text(mag, rad, style);
    first = false;
  }
  return out;
}

std::string symbol_text(const std::string& name, TextStyle style) {
  if (style == TextStyle::plain) return name;
  static const std::set<std::string> greek = {"alpha", "beta", "gamma", "delta", "epsilon", "zeta", "eta",
                                              "theta", "iota", "kappa", "lambda", "mu", "nu", "xi", "pi",
                                              "rho", "sigma", "tau", "upsilon", "phi", "chi", "psi", "omega",
                                              "Gamma", "Delta", "Theta", "Lambda", "Xi", "Pi", "Sigma", "Phi",
                                              "Psi", "Omega"};
  std::size_t us = name.rfind('_');
  std::string base = us == std::string::npos ? name : name.substr(0, us);
  std::string sub = us == std::string::npos ? "" : name.substr(us + 1);
  std::string b = greek.count(base) ? "\\" + base : (base.size() > 1 ? "\\mathrm{" + base + "}" : base);
  return sub.empty() ? b : b + "_{" + sub + "}";
}

std::string combination_text(const AllowedForm& form, const std::vector<LinearTerm>& terms, TextStyle style) {
  if (terms.empty()) return "0";
  std::string out;
  bool first = true;
  const std::string times = style == TextStyle::latex ? " " : "*";
  for (const auto& t : terms) {
    std::string p = symbol_text(form.parameter_name(t.parameter), style);
    const Surd& c = t.coefficient;
    bool negative = c.sign() < 0;
    Surd mag = negative ? -c : c;
    std::string sign = first ? (negative ? "-" : "") : (negative ? " - " : " + ");
    std::string body;
    if (mag == Surd(Rational(1))) body = p;
    else if (mag.terms().size() == 1) body = surd_text(mag, style) + times + p;
    else body = "(" + surd_text(mag, style) + ")" + times + p;
    out += sign + body;
    first = false;
  }
  return out;
}

} // namespace ts
