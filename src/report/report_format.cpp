#include "report/report_format.hpp"

#include "core/error.hpp"

#include <algorithm>
#include <cstdio>
#include <sstream>

namespace ts {

Format parse_format(const std::string& name) {
  if (name == "text") return Format::text;
  if (name == "markdown" || name == "md") return Format::markdown;
  if (name == "latex" || name == "tex") return Format::latex;
  if (name == "json") return Format::json;
  fail(ErrorKind::usage, "unknown format '" + name + "'", "--format", "text, markdown, latex, json");
}

const char* format_name(Format f) {
  switch (f) {
  case Format::text: return "text";
  case Format::markdown: return "markdown";
  case Format::latex: return "latex";
  case Format::json: return "json";
  }
  return "";
}

namespace {
// Display width of UTF-8 text (count code points).
std::size_t width(const std::string& s) {
  std::size_t w = 0;
  for (unsigned char c : s)
    if ((c & 0xC0) != 0x80) ++w;
  return w;
}
} // namespace

std::string latex_escape(const std::string& s) {
  std::string out;
  for (char c : s) {
    switch (c) {
    case '&': out += "\\&"; break;
    case '%': out += "\\%"; break;
    case '#': out += "\\#"; break;
    case '_': out += "\\_"; break;
    case '$': out += "\\$"; break;
    case '{': out += "\\{"; break;
    case '}': out += "\\}"; break;
    case '~': out += "\\textasciitilde{}"; break;
    case '^': out += "\\textasciicircum{}"; break;
    case '\\': out += "\\textbackslash{}"; break;
    default: out += c;
    }
  }
  return out;
}

std::string inline_code(const std::string& s, Format f) {
  if (f == Format::markdown) return "`" + s + "`";
  if (f == Format::latex) return "\\texttt{" + latex_escape(s) + "}";
  return s;
}

std::string section_heading(const std::string& s, Format f, int level) {
  if (f == Format::markdown) return std::string(level + 1, '#') + " " + s + "\n\n";
  if (f == Format::latex) return std::string(level <= 1 ? "\\section*{" : "\\subsection*{") + latex_escape(s) + "}\n";
  return level <= 1 ? s + "\n" + std::string(s.size() > 70 ? 70 : s.size(), '=') + "\n" : s + "\n";
}

std::string finish(std::string text, Format f) {
  if (f != Format::latex) return text;
  static const std::pair<const char*, const char*> map[] = {
      {"∥", "\\ensuremath{\\parallel}"}, {"⊥", "\\ensuremath{\\perp}"},   {"×", "\\ensuremath{\\times}"},
      {"→", "\\ensuremath{\\to}"},       {"·", "\\ensuremath{\\cdot}"},    {"ω", "\\ensuremath{\\omega}"},
      {"μ", "\\ensuremath{\\mu}"},       {"τ", "\\ensuremath{\\tau}"},     {"θ", "\\ensuremath{\\theta}"},
      {"φ", "\\ensuremath{\\phi}"},      {"Ω", "\\ensuremath{\\Omega}"},   {"χ", "\\ensuremath{\\chi}"},
      {"ε", "\\ensuremath{\\epsilon}"},  {"σ", "\\ensuremath{\\sigma}"},   {"ρ", "\\ensuremath{\\rho}"},
      {"α", "\\ensuremath{\\alpha}"},    {"γ", "\\ensuremath{\\gamma}"},   {"∇", "\\ensuremath{\\nabla}"},
      {"√", "\\ensuremath{\\surd}"},     {"≥", "\\ensuremath{\\geq}"},     {"≤", "\\ensuremath{\\leq}"},
      {"±", "\\ensuremath{\\pm}"},       {"′", "'"},                         {"ᵀ", "\\ensuremath{^{T}}"},
      {"°", "\\ensuremath{^{\\circ}}"},   {"²", "\\ensuremath{^{2}}"},         {"³", "\\ensuremath{^{3}}"},        {"⁰", "\\ensuremath{^{0}}"},
      {"–", "--"},                           {"—", "---"},                       {"Å", "\\AA{}"},
      {"…", "\\ldots{}"},                  {"−", "-"},
      {"∝", "\\ensuremath{\\propto}"},     {"∂", "\\ensuremath{\\partial}"},  {"Δ", "\\ensuremath{\\Delta}"},
      {"δ", "\\ensuremath{\\delta}"},      {"λ", "\\ensuremath{\\lambda}"},   {"β", "\\ensuremath{\\beta}"},
      {"Σ", "\\ensuremath{\\Sigma}"},      {"∫", "\\ensuremath{\\int}"},      {"ħ", "\\ensuremath{\\hbar}"},
      {"⊃", "\\ensuremath{\\supset}"},     {"≠", "\\ensuremath{\\neq}"},      {"≈", "\\ensuremath{\\approx}"},
      {"½", "\\ensuremath{\\tfrac{1}{2}}"}, {"⁻¹", "\\ensuremath{^{-1}}"},    {"⁻", "\\ensuremath{^{-}}"},
      {"¹", "\\ensuremath{^{1}}"},           {"°", "\\ensuremath{^{\\circ}}"}, {"□", "sq"},
      {"§", "\\S{}"},                        {"ẑ", "\\ensuremath{\\hat{z}}"}, {"\u0302", "\\^{}"},
      {"ê", "\\^{e}"},                       {"á", "\\'{a}"},                   {"é", "\\'{e}"},
      {"ý", "\\'{y}"},                       {"ü", "\\\"{u}"},                  {"ö", "\\\"{o}"},
      {"û", "\\^{u}"},                       {"Š", "\\v{S}"},                    {"Ž", "\\v{Z}"}};
  for (const auto& [from, to] : map) {
    const std::string a = from, b = to;
    for (std::size_t p = text.find(a); p != std::string::npos; p = text.find(a, p + b.size())) text.replace(p, a.size(), b);
  }
  // pdflatex reads ASCII and commands only: any character not in the table above is
  // written as its code point, readable and safe, rather than breaking the document.
  std::string ascii;
  for (std::size_t i = 0; i < text.size();) {
    unsigned char c = static_cast<unsigned char>(text[i]);
    if (c < 0x80) {
      ascii += text[i++];
      continue;
    }
    std::size_t len = (c >> 5) == 0x6 ? 2 : (c >> 4) == 0xE ? 3 : (c >> 3) == 0x1E ? 4 : 1;
    unsigned long cp = len == 1 ? c : c & (0xFF >> (len + 1));
    for (std::size_t k = 1; k < len && i + k < text.size(); ++k) cp = (cp << 6) | (text[i + k] & 0x3F);
    char buf[16];
    std::snprintf(buf, sizeof buf, "[U+%04lX]", cp);
    ascii += buf;
    i += len;
  }
  return ascii;
}

namespace {
// A table cell in LaTeX: writers put commands (\texttt{...}, $...$) into cells, so only
// the characters that are still bare in text mode are escaped (x_std, g_i, 50%).
std::string latex_cell(const std::string& s) {
  std::string out;
  bool math = false;
  for (std::size_t i = 0; i < s.size(); ++i) {
    const char c = s[i];
    const bool escaped = i > 0 && s[i - 1] == '\\';
    if (c == '$' && !escaped) math = !math;
    if (!math && !escaped && (c == '_' || c == '%' || c == '#' || c == '&')) out += '\\';
    out += c;
  }
  return out;
}
} // namespace

std::string grid(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows, Format f) {
  std::ostringstream os;
  if (f == Format::latex) {
    os << "\\begin{tabular}{" << std::string(header.size(), 'l') << "}\n\\hline\n";
    for (std::size_t i = 0; i < header.size(); ++i) os << (i ? " & " : "") << latex_cell(header[i]);
    os << " \\\\\n\\hline\n";
    for (const auto& r : rows) {
      for (std::size_t i = 0; i < r.size(); ++i) os << (i ? " & " : "") << latex_cell(r[i]);
      os << " \\\\\n";
    }
    os << "\\hline\n\\end{tabular}\n";
    return os.str();
  }
  std::vector<std::size_t> w(header.size(), 0);
  for (std::size_t i = 0; i < header.size(); ++i) w[i] = width(header[i]);
  for (const auto& r : rows)
    for (std::size_t i = 0; i < r.size() && i < w.size(); ++i) w[i] = std::max(w[i], width(r[i]));
  auto line = [&](const std::vector<std::string>& r) {
    std::string s = f == Format::markdown ? "| " : "  ";
    for (std::size_t i = 0; i < w.size(); ++i) {
      std::string cell = i < r.size() ? r[i] : "";
      s += cell + std::string(w[i] - width(cell), ' ');
      if (i + 1 < w.size()) s += f == Format::markdown ? " | " : "  ";
    }
    if (f == Format::markdown) s += " |";
    else while (!s.empty() && s.back() == ' ') s.pop_back();
    return s + "\n";
  };
  os << line(header);
  if (f == Format::markdown) {
    std::string s = "|";
    for (std::size_t i = 0; i < w.size(); ++i) s += std::string(w[i] + 2, '-') + "|";
    os << s << "\n";
  } else {
    std::string s = "  ";
    for (std::size_t i = 0; i < w.size(); ++i) s += std::string(w[i], '-') + (i + 1 < w.size() ? "  " : "");
    os << s << "\n";
  }
  for (const auto& r : rows) os << line(r);
  return os.str();
}

} // namespace ts
