#include "report/form_report.hpp"
#include "core/text.hpp"

#include "core/error.hpp"
#include "report/expression_text.hpp"

#include <map>
#include <algorithm>
#include <sstream>

namespace ts {

namespace {

const int voigt_digits[6][2] = {{0, 0}, {1, 1}, {2, 2}, {1, 2}, {0, 2}, {0, 1}};

int code3(int a, int b, int c) { return (a * 3 + b) * 3 + c; }

// One term c·√rad of an exact coefficient. JSON readers keep integers exactly only up
// to 53 or 64 bits, so (common practice) a numerator or denominator beyond 64 bits
// is written as a string of decimal digits.
toml::table surd_term_json(const Rational& c, const Rational& rad) {
  toml::table t;
  auto put = [&](const char* key, const Rational& v) {
    if (v.is_small()) t.insert_or_assign(key, v.num());
    else t.insert_or_assign(key, v.str());
  };
  put("sqrt_of", rad);
  put("numerator", c.numerator());
  put("denominator", c.denominator());
  return t;
}

bool symmetric_pair(const AllowedForm& f, int p, int q) {
  const auto& s = *f.symmetry;
  for (int code = 0; code < s.full_size(); ++code) {
    std::vector<int> d = s.digits(code);
    std::swap(d[p], d[q]);
    int other = s.code_of(d);
    if (s.reduced_of(code) != s.reduced_of(other) || s.sign_of(code) != s.sign_of(other)) return false;
  }
  return true;
}

std::string cell(const AllowedForm& f, int code, TextStyle style) {
  return f.is_zero(code) ? "0" : combination_text(f, f.value(code), style);
}

// Reduced components grouped by equal value, in canonical order.
std::vector<std::pair<std::vector<std::string>, std::string>> grouped_components(const AllowedForm& f, TextStyle style) {
  std::vector<std::pair<std::vector<std::string>, std::string>> out;
  std::map<std::string, std::size_t> where;
  for (int r = 0; r < f.symmetry->size(); ++r) {
    if (f.components[r].empty()) continue;
    std::string v = combination_text(f, f.components[r], style);
    std::string name = symbol_text(f.component_name(f.symmetry->rep_code(r)), style);
    auto it = where.find(v);
    if (it == where.end()) {
      where[v] = out.size();
      out.push_back({{name}, v});
    } else {
      out[it->second].first.push_back(name);
    }
  }
  return out;
}

// Characters a LaTeX math entry takes on the page, roughly: command names,
// braces and scripts' marks take none, a \\frac about half its parts.
std::size_t printed_width(const std::string& c) {
  std::size_t n = 0;
  for (std::size_t k = 0; k < c.size(); ++k) {
    if (c[k] == '\\') {
      while (k + 1 < c.size() && std::isalpha(static_cast<unsigned char>(c[k + 1]))) ++k;
      continue;
    }
    if (c[k] == '{' || c[k] == '}' || c[k] == '^' || c[k] == '_') continue;
    ++n;
  }
  return n;
}
// About 50 printed characters of display math fill the text block of a 10 pt
// article; an entry of up to 9 (T_{xxyz}, -T_{xxyy}) stays in the matrix.
constexpr std::size_t kMatrixLine = 50, kShortEntry = 9;

struct ViewGrid {
  std::string title;
  std::vector<std::string> header;
  std::vector<std::vector<std::string>> rows;
};

// A view that does not fit the tensor is refused in every format, JSON included
// (which prints no view), so a script meets the same error as a person.
void check_view(const AllowedForm& f, View view) {
  if (view == View::matrix && f.spec.rank != 2)
    fail(ErrorKind::usage, "the matrix view needs a rank-2 tensor", "--view", "components, or dmatrix/voigt where they fit");
  if (view == View::dmatrix && !has_dmatrix_view(f))
    fail(ErrorKind::usage, "the d-matrix view needs a rank-3 tensor symmetric in its last two indices", "--view");
  if (view == View::voigt && !has_voigt_view(f))
    fail(ErrorKind::usage, "the Voigt view needs a rank-4 tensor symmetric in each index pair", "--view");
}

std::vector<ViewGrid> views_of(const AllowedForm& f, View view, TextStyle style) {
  std::vector<ViewGrid> out;
  const int rank = f.spec.rank;
  static const char* axis[3] = {"x", "y", "z"};
  bool want_matrix = rank == 2 && (view == View::automatic || view == View::matrix);
  bool want_d = has_dmatrix_view(f) && (view == View::automatic || view == View::dmatrix);
  bool want_voigt = has_voigt_view(f) && (view == View::automatic || view == View::voigt);
  if (want_matrix) {
    ViewGrid g{"matrix (row i, column j)", {"", "x", "y", "z"}, {}};
    for (int i = 0; i < 3; ++i) {
      std::vector<std::string> row{axis[i]};
      for (int j = 0; j < 3; ++j) row.push_back(cell(f, i * 3 + j, style));
      g.rows.push_back(row);
    }
    out.push_back(g);
  }
  if (want_d) {
    ViewGrid g{"d-matrix (row i; column l: 1=xx 2=yy 3=zz 4=yz 5=xz 6=xy; entry = component i,jk, no factor 2)",
               {"", "1", "2", "3", "4", "5", "6"}, {}};
    for (int i = 0; i < 3; ++i) {
      std::vector<std::string> row{axis[i]};
      for (int l = 0; l < 6; ++l) row.push_back(cell(f, code3(i, voigt_digits[l][0], voigt_digits[l][1]), style));
      g.rows.push_back(row);
    }
    out.push_back(g);
  }
  if (want_voigt) {
    ViewGrid g{"Voigt matrix (1=xx 2=yy 3=zz 4=yz 5=xz 6=xy; entry = component ij,kl, no factors of 2)",
               {"", "1", "2", "3", "4", "5", "6"}, {}};
    for (int a = 0; a < 6; ++a) {
      std::vector<std::string> row{std::to_string(a + 1)};
      for (int b = 0; b < 6; ++b) {
        int code = ((voigt_digits[a][0] * 3 + voigt_digits[a][1]) * 3 + voigt_digits[b][0]) * 3 + voigt_digits[b][1];
        row.push_back(cell(f, code, style));
      }
      g.rows.push_back(row);
    }
    out.push_back(g);
  }
  return out;
}

std::string index_symmetry_note(const AllowedForm& f) {
  if (f.spec.symmetry_text.empty()) return "";
  return " (one per index-symmetry class: " + join(f.spec.symmetry_text, ", ") + ")";
}

} // namespace

GroupContext GroupContext::of(const NamedGroup& g) {
  GroupContext c;
  c.symbol = g.symbol;
  c.type_symbol = g.type_symbol;
  c.schoenflies = g.schoenflies;
  c.kind = magnetic_kind_name(g.kind);
  c.setting = g.crystal ? g.crystal->setting : "";
  c.order = g.group.order();
  for (const auto& op : g.group.operations()) c.operations.push_back(op.symbol(g.group.lattice()));
  return c;
}

View parse_view(const std::string& name) {
  if (name == "auto") return View::automatic;
  if (name == "components") return View::components;
  if (name == "matrix") return View::matrix;
  if (name == "dmatrix" || name == "d-matrix") return View::dmatrix;
  if (name == "voigt") return View::voigt;
  fail(ErrorKind::usage, "unknown view '" + name + "'", "--view", "auto, components, matrix, dmatrix, voigt");
}

bool has_dmatrix_view(const AllowedForm& f) { return f.spec.rank == 3 && symmetric_pair(f, 1, 2); }
bool has_voigt_view(const AllowedForm& f) {
  return f.spec.rank == 4 && symmetric_pair(f, 0, 1) && symmetric_pair(f, 2, 3);
}

void form_json(const AllowedForm& f, const GroupContext& g, const FrameContext& fr, toml::table& out) {
  toml::array ops;
  for (const auto& o : g.operations) ops.push_back(o);
  out.insert_or_assign("group", toml::table{{"symbol", g.symbol},
                                            {"type", g.type_symbol},
                                            {"schoenflies", g.schoenflies},
                                            {"kind", g.kind},
                                            {"order", static_cast<std::int64_t>(g.order)},
                                            {"setting", g.setting},
                                            {"operations", ops}});
  out.insert_or_assign("frame", toml::table{{"x", fr.axes[0]}, {"y", fr.axes[1]}, {"z", fr.axes[2]},
                                            {"crystal_frame", fr.crystal_frame}});
  toml::array sym;
  for (const auto& s : f.spec.symmetry_text) sym.push_back(s);
  out.insert_or_assign("tensor", toml::table{{"name", f.spec.name},
                                             {"spec", f.spec.canonical_text()},
                                             {"description", f.spec.description()},
                                             {"rank", f.spec.rank},
                                             {"axial", f.spec.axial},
                                             {"time_odd", f.spec.time_odd},
                                             {"jahn", f.spec.jahn},
                                             {"index_symmetry", sym}});
  out.insert_or_assign("independent", static_cast<std::int64_t>(f.independent()));
  toml::array params;
  for (int j = 0; j < f.independent(); ++j) params.push_back(f.parameter_name(j));
  out.insert_or_assign("parameters", params);
  toml::array comps;
  for (int code = 0; code < f.symmetry->full_size(); ++code) {
    auto v = f.value(code);
    if (v.empty()) continue;
    toml::array terms;
    for (const auto& t : v) {
      toml::array coef;
      for (const auto& [rad, c] : t.coefficient.terms())
        coef.push_back(surd_term_json(c, rad));
      terms.push_back(toml::table{{"parameter", f.parameter_name(t.parameter)},
                                  {"coefficient", surd_text(t.coefficient)},
                                  {"coefficient_terms", coef}});
    }
    comps.push_back(toml::table{{"component", f.component_name(code)},
                                {"index", index_string(code, f.spec.rank)},
                                {"value", combination_text(f, v)},
                                {"terms", terms}});
  }
  out.insert_or_assign("components", comps);
  out.insert_or_assign("nonzero_components", static_cast<std::int64_t>(f.nonzero_components()));
}

std::string write_form(const AllowedForm& f, const GroupContext& g, const FrameContext& fr, Format format, View view) {
  check_view(f, view);
  if (format == Format::json) {
    toml::table t;
    form_json(f, g, fr, t);
    return json_text(t);
  }
  std::ostringstream os;
  const std::string frame_text = "x ∥ " + fr.axes[0] + ", y ∥ " + fr.axes[1] + ", z ∥ " + fr.axes[2] +
                                 (fr.crystal_frame ? " (crystal frame)" : " (sample frame)");
  const std::string group_text = g.symbol + (g.type_symbol != g.symbol ? " (type " + g.type_symbol + ")" : "") +
                                 ", " + g.schoenflies + ", " + g.kind + ", order " + std::to_string(g.order);
  std::vector<std::string> params;
  TextStyle style = format == Format::latex ? TextStyle::latex : TextStyle::plain;
  for (int j = 0; j < f.independent(); ++j) params.push_back(symbol_text(f.parameter_name(j), style));
  const int total = f.symmetry->full_size();
  auto groups = grouped_components(f, style);
  auto views = views_of(f, view, style);

  if (format == Format::text) {
    os << "allowed form of " << f.spec.name << " in " << group_text << "\n";
    os << "  setting:     " << g.setting << "\n";
    os << "  frame:       " << frame_text << "\n";
    os << "  tensor:      " << f.spec.canonical_text() << (f.spec.jahn.empty() ? "" : "   [Jahn " + f.spec.jahn + "]") << "\n";
    os << "  independent: " << f.independent() << "   (nonzero components: " << f.nonzero_components() << " of " << total << ")\n";
    os << "  parameters:  " << (params.empty() ? "none: the tensor vanishes" : join(params, ", ")) << "\n";
    if (!groups.empty()) {
      os << "\ncomponents" << index_symmetry_note(f) << "; all others vanish\n";
      std::vector<std::vector<std::string>> rows;
      for (const auto& [names, value] : groups) rows.push_back({join(names, " = "), value});
      os << grid({"component", "value"}, rows, Format::text);
    }
    for (const auto& v : views) os << "\n" << v.title << "\n" << grid(v.header, v.rows, Format::text);
    return finish(os.str(), format);
  }
  if (format == Format::markdown) {
    os << "### Allowed form of " << f.spec.name << " in " << g.symbol << "\n\n";
    os << "- group: " << group_text << "; setting: " << g.setting << "\n";
    os << "- frame: " << frame_text << "\n";
    os << "- tensor: `" << f.spec.canonical_text() << "`" << (f.spec.jahn.empty() ? "" : " (Jahn `" + f.spec.jahn + "`)") << "\n";
    os << "- independent components: **" << f.independent() << "** (nonzero components: " << f.nonzero_components() << " of " << total << ")\n";
    os << "- free parameters: " << (params.empty() ? "none (the tensor vanishes)" : "`" + join(params, "`, `") + "`") << "\n";
    if (!groups.empty()) {
      os << "\nComponents" << index_symmetry_note(f) << "; all others vanish:\n\n";
      std::vector<std::vector<std::string>> rows;
      for (const auto& [names, value] : groups) rows.push_back({"`" + join(names, " = ") + "`", "`" + value + "`"});
      os << grid({"component", "value"}, rows, Format::markdown);
    }
    for (const auto& v : views) {
      std::vector<std::vector<std::string>> rows;
      for (const auto& r : v.rows) {
        std::vector<std::string> q;
        for (const auto& c : r) q.push_back(c.empty() ? c : "`" + c + "`");
        rows.push_back(q);
      }
      os << "\n" << v.title << ":\n\n" << grid(v.header, rows, Format::markdown);
    }
    return os.str();
  }
  // LaTeX: a fragment to \input into a paper (needs amsmath).
  os << "% tensorsieve: allowed form of " << f.spec.name << " in " << g.symbol << "\n";
  os << "% frame: " << frame_text << "\n% tensor: " << f.spec.canonical_text() << "\n";
  os << "\\noindent Group " << latex_escape(g.symbol) << " (" << latex_escape(g.schoenflies) << ", "
     << latex_escape(g.kind) << "), " << f.independent() << " independent components";
  if (!params.empty()) os << ": $" << join(params, ",\\ ") << "$";
  os << ".\n";
  if (!groups.empty()) {
    // A display cannot break across pages: long lists of relations come in blocks.
    constexpr std::size_t kRowsPerBlock = 20; // rows with fractions stand taller than a line
    for (std::size_t first = 0; first < groups.size(); first += kRowsPerBlock) {
      const std::size_t last = std::min(groups.size(), first + kRowsPerBlock);
      os << "\\begin{align*}\n";
      for (std::size_t i = first; i < last; ++i)
        os << "  " << join(groups[i].first, " = ") << " &= " << groups[i].second << (i + 1 < last ? " \\\\\n" : "\n");
      os << "\\end{align*}\n";
    }
  }
  for (const auto& v : views) {
    // A matrix is one unbreakable line per row: when its widest row would run past
    // the text block, its long entries are named a_1, a_2, ... (as handbooks do) and
    // spelled out below it.
    std::vector<std::vector<std::string>> cells;
    for (const auto& row : v.rows) cells.emplace_back(row.begin() + (row.empty() ? 0 : 1), row.end());
    std::size_t widest = 0;
    for (const auto& row : cells) {
      std::size_t w = 0;
      for (const auto& c : row) w += printed_width(c) + 3;
      widest = std::max(widest, w);
    }
    std::vector<std::string> named;
    if (widest > kMatrixLine) {
      for (auto& row : cells)
        for (auto& c : row) {
          if (printed_width(c) <= kShortEntry) continue;
          auto it = std::find(named.begin(), named.end(), c);
          const std::size_t k = it == named.end() ? named.size() : static_cast<std::size_t>(it - named.begin());
          if (it == named.end()) named.push_back(c);
          c = "a_{" + std::to_string(k + 1) + "}";
        }
    }
    os << "% " << v.title << "\n\\[\n\\begin{pmatrix}\n";
    for (std::size_t r = 0; r < cells.size(); ++r) {
      for (std::size_t c = 0; c < cells[r].size(); ++c) os << (c > 0 ? " & " : "  ") << cells[r][c];
      os << (r + 1 < cells.size() ? " \\\\\n" : "\n");
    }
    os << "\\end{pmatrix}\n\\]\n";
    if (!named.empty()) {
      os << "where\n\\begin{align*}\n";
      for (std::size_t k = 0; k < named.size(); ++k)
        os << "  a_{" << k + 1 << "} &= " << named[k] << (k + 1 < named.size() ? " \\\\\n" : "\n");
      os << "\\end{align*}\n";
    }
  }
  return finish(os.str(), format);
}

} // namespace ts

