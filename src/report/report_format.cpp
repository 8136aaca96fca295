#include "report/report_format.hpp"

#include "core/error.hpp"
#include "core/text.hpp"

#include <algorithm>
#include <cmath>
#include <cctype>
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

// Byte offset of the code point after the first `n` code points of s (s.size() if fewer).
std::size_t prefix_bytes(const std::string& s, std::size_t n) {
  std::size_t w = 0;
  for (std::size_t i = 0; i < s.size(); ++i)
    if ((static_cast<unsigned char>(s[i]) & 0xC0) != 0x80 && w++ == n) return i;
  return s.size();
}

// `text` in lines of at most `columns` code points, broken after a space where one
// is, else inside the word.
std::vector<std::string> wrap_words(std::string text, std::size_t columns) {
  std::vector<std::string> lines;
  columns = std::max<std::size_t>(columns, 1);
  while (width(text) > columns) {
    const std::size_t limit = prefix_bytes(text, columns);
    std::size_t cut = text.rfind(' ', limit);
    if (cut == std::string::npos || cut == 0) cut = limit; // one long word: break it
    if (cut == 0) cut = prefix_bytes(text, 1);            // always make progress
    lines.push_back(text.substr(0, cut));
    while (cut < text.size() && text[cut] == ' ') ++cut;
    text.erase(0, cut);
  }
  lines.push_back(text);
  return lines;
}

std::size_t g_text_width = 0;
} // namespace

void set_text_width(std::size_t columns) { g_text_width = columns; }
std::size_t text_width() { return g_text_width; }

std::string wrap_text(const std::string& text, std::size_t columns) {
  if (columns == 0) return text;
  std::string out;
  for (const std::string& line : split(text, '\n')) {
    if (width(line) <= columns) {
      out += line + "\n";
      continue;
    }
    const std::size_t indent = std::min(line.find_first_not_of(' '), columns / 2);
    const std::string more(indent + 2, ' ');
    std::vector<std::string> pieces = wrap_words(line.substr(indent), columns - indent);
    // the continuation lines are narrower by the two extra spaces: wrap them again
    std::string rest;
    for (std::size_t i = 1; i < pieces.size(); ++i) rest += (i > 1 ? " " : "") + pieces[i];
    out += std::string(indent, ' ') + pieces.front() + "\n";
    if (!rest.empty())
      for (const auto& l : wrap_words(rest, columns - indent - 2)) out += more + l + "\n";
  }
  out.pop_back(); // split gave one line more than the text had newlines
  return out;
}

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

std::string as_text(const std::string& s, Format f) { return f == Format::latex ? latex_escape(s) : s; }

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

namespace {

bool symbol_char(char c) { return (c >= '0' && c <= '9') || c == 'm' || c == '/' || c == '\'' || c == '-'; }

// A Hermann-Mauguin symbol with a bar ("m-3m1'", "-4'2m'", "-1") in text mode, set as
// $\mathrm{m\bar{3}m1'}$; everything else as it was. Text mode only: a "--" there
// becomes "-{}-", so an option (--format) is not set as an en dash.
std::string latex_text_mode(const std::string& text) {
  std::string out;
  bool math = false;
  for (std::size_t i = 0; i < text.size(); ++i) {
    const char c = text[i];
    const bool escaped = i > 0 && text[i - 1] == '\\';
    // Displayed math (align*, \[ \]) is the writers' own LaTeX: copied as it is,
    // so that "-3 c_{xzz}" there stays a coefficient and never becomes a barred 3.
    if (!math && !escaped && (text.compare(i, 14, "\\begin{align*}") == 0 || text.compare(i, 2, "\\[") == 0)) {
      const bool align = text[i + 1] == 'b';
      const std::size_t e = text.find(align ? "\\end{align*}" : "\\]", i);
      const std::size_t stop = e == std::string::npos ? text.size() : e + (align ? 12 : 2);
      out += text.substr(i, stop - i);
      i = stop - 1;
      continue;
    }
    if (c == '$' && !escaped) math = !math;
    // A long formula in a table cell or a line may break after each item of a list
    // and after a closing parenthesis; \left( \right) would hold it in one piece.
    if (math && !escaped && (c == ';' || c == ',' || (c == ')' && i + 1 < text.size() && text[i + 1] == ' '))) {
      out += c;
      out += "\\allowbreak ";
      continue;
    }
    if (math && text.compare(i, 6, "\\left(") == 0) {
      out += "\\bigl(";
      i += 5;
      continue;
    }
    if (math && text.compare(i, 7, "\\right)") == 0) {
      out += "\\bigr)";
      i += 6;
      continue;
    }
    if (math || c == '%') {
      if (c == '%' && !escaped && !math) { // a comment runs to the end of the line
        const std::size_t e = text.find('\n', i);
        out += text.substr(i, e == std::string::npos ? std::string::npos : e - i);
        if (e == std::string::npos) break;
        i = e - 1;
        continue;
      }
      out += c;
      continue;
    }
    if (c == '-' && i + 1 < text.size() && text[i + 1] == '-') {
      out += "-{}";
      continue;
    }
    const bool bar_here = c == '-' && i + 1 < text.size() && std::string("1346").find(text[i + 1]) != std::string::npos;
    if (!bar_here) {
      out += c;
      continue;
    }
    // The whole token around the bar: its start is already in `out`.
    std::size_t start = i;
    while (start > 0 && symbol_char(text[start - 1]) && text[start - 1] != '-') --start;
    std::size_t end = i;
    while (end < text.size() && symbol_char(text[end])) ++end;
    const std::string token = text.substr(start, end - start);
    auto word_char = [](char ch) {
      return std::isalnum(static_cast<unsigned char>(ch)) || ch == '\\' || ch == '_' || ch == '.' || ch == '^';
    };
    const bool bounded = (start == 0 || !word_char(text[start - 1])) && (end == text.size() || !word_char(text[end]));
    const bool lone = token.size() == 2 || (token.size() == 3 && token[2] == '\'');
    const bool group_like = token.find('m') != std::string::npos || token.find('\'') != std::string::npos || lone;
    if (!bounded || !group_like || token.find("--") != std::string::npos || token.back() == '-') {
      out += c;
      continue;
    }
    out.erase(out.size() - (i - start));
    std::string barred;
    for (std::size_t k = 0; k < token.size(); ++k) {
      if (token[k] == '-' && k + 1 < token.size()) {
        barred += "\\bar{" + std::string(1, token[k + 1]) + "}";
        ++k;
      } else {
        barred += token[k];
      }
    }
    out += "$\\mathrm{" + barred + "}$";
    i = end - 1;
  }
  return out;
}

} // namespace

std::string finish(std::string text, Format f) {
  if (f != Format::latex) return text;
  // \sloppy in a group: long symbols and ids break a line early rather than run into
  // the margin, in this fragment only.
  text = "{\\sloppy\n" + latex_text_mode(text) + "\\par}\n";
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
      {"§", "\\S{}"},                        {"ẑ", "\\ensuremath{\\hat{z}}"}, {"k\u0302", "\\ensuremath{\\hat{k}}"}, {"\u0302", "\\^{}"},
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
    if (!math && !escaped && (c == '^' || c == '~')) { // chi^m: bare, a math-mode error
      out += c == '^' ? "\\textasciicircum{}" : "\\textasciitilde{}";
      continue;
    }
    out += c;
  }
  return out;
}
} // namespace

std::string row_list(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows) {
  std::ostringstream os;
  os << "\\begin{itemize}\n";
  for (const auto& r : rows) {
    os << "\\item ";
    for (std::size_t i = 0; i < header.size() && i < r.size(); ++i)
      os << (i ? "; " : "") << (i ? latex_cell(header[i]) + ": " : "") << latex_cell(r[i]);
    os << "\n";
  }
  os << "\\end{itemize}\n";
  return os.str();
}

std::string grid(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows, Format f) {
  std::ostringstream os;
  if (f == Format::latex) {
    // A table wider than the text block gets paragraph columns for its long cells,
    // ragged right, sharing what the short columns leave of \linewidth. Widths are
    // estimated from characters (about 70 to a line of 10 pt text), rows end with
    // \tabularnewline because \raggedright redefines \\.
    // Widths in printed characters: a command name, braces and math marks take no room.
    auto printed = [](const std::string& c) {
      std::size_t n = 0;
      for (std::size_t k = 0; k < c.size(); ++k) {
        if (c[k] == '\\') {
          while (k + 1 < c.size() && std::isalpha(static_cast<unsigned char>(c[k + 1]))) ++k;
          continue;
        }
        if (c[k] == '{' || c[k] == '}' || c[k] == '$' || c[k] == '^' || c[k] == '_') continue;
        if ((static_cast<unsigned char>(c[k]) & 0xC0) != 0x80) ++n;
      }
      return n;
    };
    // The longest piece a line cannot break: TeX breaks at spaces and after the
    // hyphens of ids such as unidirectional-magnetoresistance.
    auto longest_piece = [&](const std::string& c) {
      std::size_t most = 0;
      for (const auto& word : split(c, ' '))
        for (const auto& piece : split(word, '-')) most = std::max(most, printed(piece) + 1);
      return most;
    };
    std::vector<std::size_t> longest(header.size(), 0), longest_word(header.size(), 0);
    for (std::size_t i = 0; i < header.size(); ++i) {
      longest[i] = printed(header[i]);
      longest_word[i] = std::max(longest_word[i], longest_piece(header[i]));
    }
    for (const auto& r : rows)
      for (std::size_t i = 0; i < r.size() && i < longest.size(); ++i) {
        longest[i] = std::max(longest[i], printed(r[i]));
        longest_word[i] = std::max(longest_word[i], longest_piece(r[i]));
      }
    constexpr double kLine = 64, kShort = 12, kSeparation = 0.035;
    double used = 0, wide = 0;
    for (std::size_t x : longest) {
      if (x <= kShort) used += x / kLine + kSeparation;
      else wide += static_cast<double>(x);
    }
    const bool fits = used * kLine + wide <= 0.92 * kLine;
    // Each paragraph column gets room for its longest word, and what is left of the
    // line in proportion to its text.
    double budget = 0.92 - used, least = 0;
    for (std::size_t i = 0; i < header.size(); ++i)
      if (longest[i] > kShort) {
        budget -= kSeparation;
        least += static_cast<double>(longest_word[i]) / kLine + 0.02;
      }
    const double extra = std::max(0.0, budget - least);
    // Columns whose unbreakable pieces alone overfill the line (catalogue ids,
    // formulas) well past what is left of it cannot be a tabular on the page (the
    // estimate is cautious: \small with narrow gaps holds more): each row becomes an
    // item of a list.
    if (!fits && least + (0.92 - budget) > 1.25) return row_list(header, rows);
    std::string columns;
    std::vector<bool> paragraph(header.size(), false);
    std::vector<double> widths(header.size(), 0.0);
    for (std::size_t i = 0; i < header.size(); ++i) {
      if (fits || longest[i] <= kShort) {
        columns += 'l';
        continue;
      }
      const double share = static_cast<double>(longest_word[i]) / kLine + 0.02 +
                           extra * static_cast<double>(longest[i]) / wide;
      widths[i] = share;
      char buf[48];
      std::snprintf(buf, sizeof buf, "p{%.2f\\linewidth}", share);
      columns += buf;
      paragraph[i] = true;
    }
    auto cell = [&](const std::vector<std::string>& r, std::size_t i) {
      const std::string c = i < r.size() ? latex_cell(r[i]) : "";
      return paragraph[i] ? "\\raggedright " + c : c;
    };
    // A tabular cannot break across pages: a long table is set as several, each with
    // its header, of at most kLines printed lines (a row of paragraph cells takes as
    // many lines as its fullest cell needs at its column's width).
    constexpr double kLines = 34;
    auto lines_of = [&](const std::vector<std::string>& r) {
      double most = 1;
      for (std::size_t i = 0; i < r.size() && i < widths.size(); ++i)
        if (paragraph[i] && widths[i] > 0)
          most = std::max(most, std::ceil(static_cast<double>(printed(r[i])) / (widths[i] * kLine)));
      return most;
    };
    for (std::size_t first = 0, next = 0; first < rows.size() || first == 0; first = next) {
      double lines = lines_of(header);
      next = first;
      do {
        lines += next < rows.size() ? lines_of(rows[next]) : 0;
        ++next;
      } while (next < rows.size() && lines + lines_of(rows[next]) <= kLines);
      const std::size_t kRows = next - first;
      // A table with paragraph columns is set a size smaller with narrower gaps, so its
      // unbreakable cells (formulas, long words) stay inside the text block.
      const bool tight = std::find(paragraph.begin(), paragraph.end(), true) != paragraph.end();
      os << (first ? "\n" : "") << (tight ? "{\\small\\setlength{\\tabcolsep}{3pt}" : "")
         << "\\noindent\\begin{tabular}{" << columns << "}\n\\hline\n";
      for (std::size_t i = 0; i < header.size(); ++i) os << (i ? " & " : "") << cell(header, i);
      os << " \\tabularnewline\n\\hline\n";
      for (std::size_t k = first; k < rows.size() && k < first + kRows; ++k) {
        for (std::size_t i = 0; i < header.size(); ++i) os << (i ? " & " : "") << cell(rows[k], i);
        os << " \\tabularnewline\n";
      }
      os << "\\hline\n\\end{tabular}" << (std::find(paragraph.begin(), paragraph.end(), true) != paragraph.end() ? "}" : "")
         << "\n";
      if (rows.empty()) break;
    }
    return os.str();
  }
  if (f == Format::markdown) {
    // A '|' in a cell (a step label, a file name) would end the cell: "\|" keeps it.
    auto bare = [](const std::string& c) {
      for (std::size_t p = c.find('|'); p != std::string::npos; p = c.find('|', p + 1))
        if (p == 0 || c[p - 1] != '\\') return true;
      return false;
    };
    auto guarded = [](std::vector<std::string> r) {
      for (auto& c : r)
        for (std::size_t p = c.find('|'); p != std::string::npos; p = c.find('|', p + 2))
          if (p == 0 || c[p - 1] != '\\') c.insert(p, 1, '\\');
          else --p; // already guarded: look on after it
      return r;
    };
    std::vector<std::vector<std::string>> safe;
    bool any = std::any_of(header.begin(), header.end(), bare);
    for (const auto& r : rows) any = any || std::any_of(r.begin(), r.end(), bare);
    if (any) {
      for (const auto& r : rows) safe.push_back(guarded(r));
      return grid(guarded(header), safe, f);
    }
  }
  std::vector<std::size_t> w(header.size(), 0);
  for (std::size_t i = 0; i < header.size(); ++i) w[i] = width(header[i]);
  for (const auto& r : rows)
    for (std::size_t i = 0; i < r.size() && i < w.size(); ++i) w[i] = std::max(w[i], width(r[i]));
  // A text table wider than the terminal narrows its widest columns one step at a
  // time (a column keeps its longest word, up to 24 characters, and at least 8) and
  // wraps their cells onto continuation lines.
  const std::size_t limit = f == Format::text ? text_width() : 0;
  auto total = [&] {
    std::size_t t = 2 * w.size();
    for (std::size_t x : w) t += x;
    return t;
  };
  std::vector<std::size_t> narrowest(w.size(), 8);
  for (const auto& r : rows)
    for (std::size_t i = 0; i < r.size() && i < w.size(); ++i)
      for (const auto& word : split(r[i], ' ')) narrowest[i] = std::max(narrowest[i], std::min<std::size_t>(width(word), 24));
  while (limit > 0 && total() > limit) {
    std::size_t widest = w.size();
    for (std::size_t i = 0; i < w.size(); ++i)
      if (w[i] > narrowest[i] && (widest == w.size() || w[i] > w[widest])) widest = i;
    if (widest == w.size()) break; // every column at its narrowest: the line stays long
    --w[widest];
  }
  auto line = [&](const std::vector<std::string>& r) {
    std::vector<std::vector<std::string>> cells(w.size());
    std::size_t height = 1;
    for (std::size_t i = 0; i < w.size(); ++i) {
      const std::string cell = i < r.size() ? r[i] : "";
      cells[i] = limit > 0 ? wrap_words(cell, w[i]) : std::vector<std::string>{cell};
      height = std::max(height, cells[i].size());
    }
    std::string out;
    for (std::size_t h = 0; h < height; ++h) {
      std::string s = f == Format::markdown ? "| " : "  ";
      for (std::size_t i = 0; i < w.size(); ++i) {
        const std::string cell = h < cells[i].size() ? cells[i][h] : "";
        s += cell + std::string(w[i] - std::min(w[i], width(cell)), ' ');
        if (i + 1 < w.size()) s += f == Format::markdown ? " | " : "  ";
      }
      if (f == Format::markdown) s += " |";
      else while (!s.empty() && s.back() == ' ') s.pop_back();
      out += s + "\n";
    }
    return out;
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
