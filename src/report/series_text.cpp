#include "report/series_text.hpp"

namespace ts {

namespace {

// a + b with the sign of b pulled out: "a - c" for b = "-c".
void append_term(std::string& s, const std::string& term) {
  if (s.empty()) s = term;
  else if (term[0] == '-') s += " - " + term.substr(1);
  else s += " + " + term;
}

std::string times(TextStyle style) { return style == TextStyle::latex ? " " : "*"; }

// "(a + b)" for a sum, "a" for a single signed term.
std::string grouped(const std::string& s, std::size_t parts) { return parts > 1 ? "(" + s + ")" : s; }

// The local-field factors first, then the powers of cos θ and sin θ.
std::string theta_power(const OpticalMonomial& key, TextStyle style) {
  std::string out;
  for (int i = 0; i < local_field_symbol_count; ++i) {
    const int n = key.field[i];
    if (n == 0) continue;
    if (!out.empty()) out += times(style);
    if (style == TextStyle::latex) out += local_field_symbol_name(i, true) + (n > 1 ? "^{" + std::to_string(n) + "}" : "");
    else out += local_field_symbol_name(i) + (n > 1 ? "^" + std::to_string(n) : "");
  }
  auto one = [&](const char* fn, int n) {
    if (n == 0) return;
    if (!out.empty()) out += times(style);
    if (style == TextStyle::latex) out += std::string("\\") + fn + (n > 1 ? "^{" + std::to_string(n) + "}" : "") + "\\theta";
    else out += std::string(fn) + "(theta)" + (n > 1 ? "^" + std::to_string(n) : "");
  };
  one("cos", key.cos_theta);
  one("sin", key.sin_theta);
  return out;
}

} // namespace

std::string fourier_series_text(const std::vector<FourierTerm>& terms, const AllowedForm& form, TextStyle style) {
  if (terms.empty()) return "0";
  std::string s;
  for (const auto& t : terms) {
    std::string c = grouped(combination_text(form, t.coefficient, style), t.coefficient.size());
    std::string fn = angle_function_text(t, style == TextStyle::latex);
    append_term(s, fn == "1" ? c : c + times(style) + fn);
  }
  return s;
}

toml::array fourier_terms_json(const std::vector<FourierTerm>& terms, const AllowedForm& form) {
  toml::array a;
  for (const auto& t : terms)
    a.push_back(toml::table{{"function", angle_function_text(t, false)},
                            {"coefficient", combination_text(form, t.coefficient, TextStyle::plain)}});
  return a;
}

std::string as_magnetisation_angles(std::string s) {
  static const std::pair<std::string, std::string> names[] = {{"phiB", "phiM"},           {"thetaB", "thetaM"},
                                                              {"\\varphi_B", "\\varphi_M"}, {"\\theta_B", "\\theta_M"},
                                                              {"φ_B", "φ_M"},             {"θ_B", "θ_M"}};
  for (const auto& [from, to] : names)
    for (std::size_t at = s.find(from); at != std::string::npos; at = s.find(from, at + to.size()))
      s.replace(at, from.size(), to);
  return s;
}

std::string optical_amplitude_text(const std::vector<OpticalTerm>& terms, const AllowedForm& form, TextStyle style) {
  if (terms.empty()) return "0";
  std::string s;
  for (const auto& t : terms) {
    std::string inner;
    std::size_t parts = 0; // summands of the coefficient
    for (const auto& [key, comb] : t.by_theta) {
      const std::string mono = theta_power(key, style);
      const std::string c = combination_text(form, comb, style);
      append_term(inner, mono.empty() ? c : grouped(c, comb.size()) + times(style) + mono);
      parts += mono.empty() ? comb.size() : 1;
    }
    const std::string fn = harmonic_text({t.k, t.sine}, style == TextStyle::latex);
    append_term(s, fn == "1" ? inner : grouped(inner, parts) + times(style) + fn);
  }
  return s;
}

} // namespace ts
