#include "report/html_math.hpp"

#include "core/markup.hpp"

#include <cctype>
#include <map>

namespace ts {

std::string html_escape(const std::string& s) { return markup_escape(s); }

namespace {

std::string symbol_html(const std::string& name) {
  static const std::map<std::string, std::string> greek = {
      {"alpha", "α"}, {"beta", "β"},   {"gamma", "γ"}, {"delta", "δ"}, {"eps", "ε"},   {"epsilon", "ε"},
      {"zeta", "ζ"},  {"eta", "η"},    {"theta", "θ"}, {"kappa", "κ"}, {"lambda", "λ"}, {"mu", "μ"},
      {"nu", "ν"},    {"xi", "ξ"},     {"pi", "π"},    {"rho", "ρ"},   {"sigma", "σ"}, {"tau", "τ"},
      {"phi", "φ"},   {"chi", "χ"},    {"psi", "ψ"},   {"omega", "ω"}, {"Gamma", "Γ"}, {"Lambda", "Λ"},
      {"Delta", "Δ"}, {"chim", "χ<sup>m</sup>"}, {"chiem", "χ<sup>em</sup>"}, {"chiq", "χ<sup>q</sup>"},
      {"phiB", "φ<sub>B</sub>"}, {"thetaB", "θ<sub>B</sub>"}, {"wt", "ωt"}, {"rho0", "ρ<sub>0</sub>"}};
  std::size_t us = name.find('_');
  std::string head = us == std::string::npos ? name : name.substr(0, us);
  std::string tail = us == std::string::npos ? "" : name.substr(us + 1);
  auto g = greek.find(head);
  std::string h = g == greek.end() ? "<i>" + html_escape(head) + "</i>" : g->second;
  if (head == "sin" || head == "cos" || head == "tan" || head == "exp" || head == "log") h = head;
  return tail.empty() ? h : h + "<sub>" + html_escape(tail) + "</sub>";
}

} // namespace

std::string html_formula(const std::string& s) {
  std::string out;
  std::size_t i = 0;
  while (i < s.size()) {
    const char c = s[i];
    if (std::isalpha(static_cast<unsigned char>(c))) {
      std::size_t j = i;
      while (j < s.size() && (std::isalnum(static_cast<unsigned char>(s[j])) || s[j] == '_')) ++j;
      std::string name = s.substr(i, j - i);
      if (name == "sqrt") out += "√";
      else out += symbol_html(name);
      i = j;
    } else if (c == '^') {
      std::size_t j = i + 1;
      std::string exponent;
      if (j < s.size() && s[j] == '(') {
        int depth = 0;
        std::size_t k = j;
        for (; k < s.size(); ++k) {
          if (s[k] == '(') ++depth;
          if (s[k] == ')' && --depth == 0) break;
        }
        exponent = s.substr(j + 1, k - j - 1);
        j = k + 1;
      } else {
        while (j < s.size() && (std::isalnum(static_cast<unsigned char>(s[j])) || s[j] == '-')) ++j;
        exponent = s.substr(i + 1, j - i - 1);
      }
      out += "<sup>" + html_formula(exponent) + "</sup>";
      i = j;
    } else if (c == '*') {
      out += "·";
      ++i;
    } else if (c == '-') {
      out += (i > 0 && s[i - 1] != '(' && s[i - 1] != ' ') ? " − " : "−";
      ++i;
    } else if (c == '+') {
      out += (i > 0 && s[i - 1] != ' ') ? " + " : "+";
      ++i;
    } else {
      out += html_escape(std::string(1, c));
      ++i;
    }
  }
  return out;
}

} // namespace ts
