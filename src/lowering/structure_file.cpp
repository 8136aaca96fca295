#include "lowering/structure_file.hpp"

#include "core/error.hpp"
#include "lowering/cif_text.hpp"
#include "lowering/site_grid.hpp"

// The system stb_sprintf header that gemmi falls back to warns on every
// include; gemmi's plain-snprintf switch avoids it, and we format no numbers
// through gemmi anyway.
#define USE_STD_SNPRINTF
#include <gemmi/cif.hpp>
#include <gemmi/smcif.hpp>
#include <gemmi/symmetry.hpp>

#include <algorithm>
#include <cmath>
#include <cstring>
#include <numeric>
#include <fstream>
#include <map>
#include <set>
#include <sstream>

namespace ts {

namespace {

using IMat = std::array<std::array<int, 3>, 3>;
using Vec = std::array<double, 3>;
using Mat = std::array<Vec, 3>;

// Operations are kept exactly in units of 1/2520 = 1/lcm(1, ..., 10): real files
// write translations in fifths, sevenths and ninths (supercells of modulated
// magnets) and rotation parts with fractional entries (operations written in a
// centred or super cell, e.g. an orthohexagonal one), none of which fits gemmi's 24ths.
constexpr long long kDen = 2520;
using LMat = std::array<std::array<long long, 3>, 3>;

// One operation of a magnetic space group on fractional coordinates:
// f -> W f + t, moment reversed once more when primed.
struct SpaceOperation {
  LMat w{};                   // W in units of 1/kDen
  std::array<long long, 3> t{}; // in units of 1/kDen, wrapped into [0, kDen)
  bool primed = false;
  std::string text; // as written in the file (or expanded from the symbol)
  int line = 0;     // the file's line that states it, 0 when expanded from a symbol
  bool operator<(const SpaceOperation& o) const { return std::tie(w, t, primed) < std::tie(o.w, o.t, o.primed); }
  bool operator==(const SpaceOperation& o) const { return w == o.w && t == o.t && primed == o.primed; }
};

long long wrap(long long v) { return ((v % kDen) + kDen) % kDen; }

SpaceOperation identity_operation(const std::string& text) {
  SpaceOperation op;
  for (int i = 0; i < 3; ++i) op.w[i][i] = kDen;
  op.text = text;
  return op;
}

// a after b. False when the product leaves the 1/kDen grid; it is then none of
// the stated operations, which all lie on it.
bool compose(const SpaceOperation& a, const SpaceOperation& b, SpaceOperation* c) {
  *c = SpaceOperation{};
  for (int i = 0; i < 3; ++i) {
    long long t = 0;
    for (int k = 0; k < 3; ++k) {
      t += a.w[i][k] * b.t[k];
      for (int j = 0; j < 3; ++j) c->w[i][j] += a.w[i][k] * b.w[k][j];
    }
    if (t % kDen) return false;
    c->t[i] = wrap(a.t[i] + t / kDen);
    for (int j = 0; j < 3; ++j) {
      if (c->w[i][j] % kDen) return false;
      c->w[i][j] /= kDen;
    }
  }
  c->primed = a.primed != b.primed;
  return true;
}

// det W times kDen^3.
long long det_scaled(const LMat& m) {
  return m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) - m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0]) +
         m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0]);
}

int det_sign(const SpaceOperation& op) { return det_scaled(op.w) > 0 ? 1 : -1; }

// The point part as an integer matrix, when it is one in the file's axes.
bool integer_rotation(const SpaceOperation& op, IMat* w) {
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) {
      if (op.w[i][j] % kDen) return false;
      (*w)[i][j] = static_cast<int>(op.w[i][j] / kDen);
    }
  return true;
}

Mat real_rotation(const SpaceOperation& op) {
  Mat w{};
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) w[i][j] = static_cast<double>(op.w[i][j]) / kDen;
  return w;
}

std::string lower(std::string s) {
  for (char& c : s) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  return s;
}

std::string number_text(double x) {
  std::ostringstream s;
  s.precision(6);
  s << x;
  return s.str();
}

std::string vec_text(const Vec& v) {
  return "(" + number_text(v[0]) + ", " + number_text(v[1]) + ", " + number_text(v[2]) + ")";
}

// v / kDen as a reduced fraction without its sign: "1/5", "2", "" for 1.
std::string magnitude_text(long long v, bool one_is_empty) {
  v = std::llabs(v);
  long long d = kDen;
  const long long g = std::gcd(v, d);
  v /= g, d /= g;
  if (d == 1) return v == 1 && one_is_empty ? "" : std::to_string(v);
  return std::to_string(v) + "/" + std::to_string(d);
}

std::string operation_text(const SpaceOperation& op) {
  std::string out;
  for (int i = 0; i < 3; ++i) {
    std::string row;
    for (int j = 0; j < 3; ++j) {
      if (!op.w[i][j]) continue;
      row += op.w[i][j] < 0 ? "-" : row.empty() ? "" : "+";
      row += magnitude_text(op.w[i][j], true) + "xyz"[j];
    }
    if (op.t[i]) row += "+" + magnitude_text(op.t[i], false);
    out += (i ? "," : "") + (row.empty() ? std::string("0") : row);
  }
  return out + (op.primed ? ",-1" : ",+1");
}

// One coordinate expression of an operation: terms such as -x, +2y, -1/2x,
// 0.5*z, 1/5, -3/7 in any order. Coefficients and translations are exact
// fractions whose denominator divides 2520; a decimal is read exactly, or as
// the nearest fraction with a denominator up to 12 when it is that within
// 0.001 (0.3333 is 1/3).
bool parse_coordinate(const std::string& s, std::array<long long, 4>* out, std::string* problem) {
  *out = {0, 0, 0, 0};
  std::size_t i = 0;
  auto skip = [&] {
    while (i < s.size() && (s[i] == ' ' || s[i] == '\t')) ++i;
  };
  auto digits = [&](long long* v) {
    const std::size_t from = i;
    *v = 0;
    while (i < s.size() && std::isdigit(static_cast<unsigned char>(s[i])) && i - from < 9) *v = *v * 10 + (s[i++] - '0');
    return i > from && !(i < s.size() && std::isdigit(static_cast<unsigned char>(s[i])));
  };
  skip();
  if (i == s.size()) return *problem = "an empty coordinate", false;
  bool first = true;
  while (true) {
    skip();
    if (i == s.size()) break;
    int sign = 1;
    if (s[i] == '+' || s[i] == '-') {
      sign = s[i] == '-' ? -1 : 1;
      ++i;
      skip();
    } else if (!first) {
      return *problem = "'" + s.substr(i) + "' does not start with + or -", false;
    }
    first = false;
    bool has_number = false;
    long long num = 1, den = 1; // the number, exact
    if (i < s.size() && (std::isdigit(static_cast<unsigned char>(s[i])) || s[i] == '.')) {
      has_number = true;
      long long whole = 0;
      if (s[i] != '.' && !digits(&whole)) return *problem = "a number with too many digits", false;
      num = whole;
      if (i < s.size() && s[i] == '.') {
        ++i;
        const std::size_t from = i;
        long long frac = 0;
        if (i < s.size() && std::isdigit(static_cast<unsigned char>(s[i])) && !digits(&frac))
          return *problem = "a number with too many digits", false;
        long long scale = 1;
        for (std::size_t k = from; k < i; ++k) scale *= 10;
        num = whole * scale + frac;
        den = scale;
        if ((num * kDen) % den != 0) { // not exact on the grid: the nearest small fraction
          const double v = static_cast<double>(num) / static_cast<double>(den);
          bool found = false;
          for (long long q = 2; q <= 12 && !found; ++q) {
            const double p = std::round(v * static_cast<double>(q));
            if (std::fabs(v - p / static_cast<double>(q)) < 1e-3) num = static_cast<long long>(p), den = q, found = true;
          }
          if (!found) return *problem = "the decimal '" + s.substr(from - 1) + "' is no fraction with a small denominator", false;
        }
      } else if (i < s.size() && s[i] == '/') {
        ++i;
        if (!digits(&den) || den == 0) return *problem = "a fraction without a denominator", false;
      }
    }
    skip();
    if (i < s.size() && s[i] == '*') {
      if (!has_number) return *problem = "'*' without a number before it", false;
      ++i;
      skip();
    }
    int axis = -1;
    if (i < s.size()) {
      const char c = static_cast<char>(std::tolower(static_cast<unsigned char>(s[i])));
      if (c == 'x' || c == 'y' || c == 'z') axis = c - 'x', ++i;
    }
    if (!has_number && axis < 0)
      return *problem = i < s.size() ? "unexpected '" + s.substr(i, 1) + "'" : "a sign without a term", false;
    if (axis >= 0 && i < s.size() && s[i] == '/') { // x/2
      ++i;
      long long d = 0;
      if (!digits(&d) || d == 0) return *problem = "a fraction without a denominator", false;
      den *= d;
    }
    if ((num * kDen) % den != 0)
      return *problem = "the fraction " + std::to_string(num) + "/" + std::to_string(den) +
                        " has a denominator that is not a divisor of 2520", false;
    const long long value = sign * num * kDen / den;
    if (axis >= 0) {
      if (std::llabs(value) > 12 * kDen) return *problem = "a coefficient larger than 12", false;
      (*out)[axis] += value;
    } else {
      (*out)[3] = wrap((*out)[3] + value);
    }
  }
  return true;
}

// Where a value of a loop is written: the first line at or after the loop's
// start holding it as a word, so a message points at the offending row.
struct Source {
  std::string name;
  std::string block;
  const std::vector<std::string>* lines = nullptr; // the file's lines, after repair
  std::string at(const gemmi::cif::Item* item) const {
    std::string s = name;
    if (item && item->line_number > 0) s += ":" + std::to_string(item->line_number);
    return s + " (data_" + block + ")";
  }
  std::string at_line(int line) const { return name + ":" + std::to_string(line) + " (data_" + block + ")"; }
  int line_of(const gemmi::cif::Item* item, const std::string& word) const {
    if (!item || item->line_number <= 0 || !lines) return 0;
    for (std::size_t l = static_cast<std::size_t>(item->line_number) - 1; l < lines->size(); ++l) {
      const std::string& text = (*lines)[l];
      for (std::size_t p = text.find(word); p != std::string::npos; p = text.find(word, p + 1)) {
        const bool left = p == 0 || std::isspace(static_cast<unsigned char>(text[p - 1])) || text[p - 1] == '\'' ||
                          text[p - 1] == '"';
        const std::size_t e = p + word.size();
        const bool right = e == text.size() || std::isspace(static_cast<unsigned char>(text[e])) || text[e] == '\'' ||
                           text[e] == '"';
        if (left && right) return static_cast<int>(l) + 1;
      }
    }
    return 0;
  }
  // The row of `word` in the loop `item` when it can be found, the loop otherwise.
  std::string at_value(const gemmi::cif::Item* item, const std::string& word) const {
    const int line = line_of(item, word);
    return line ? at_line(line) : at(item);
  }
};

const gemmi::cif::Item* item_of(const gemmi::cif::Block& b, const std::string& tag) {
  if (const gemmi::cif::Item* p = b.find_pair_item(tag)) return p;
  return b.find_loop_item(tag);
}

// Any tag of the block, pair or loop column, starting with one of the prefixes.
const gemmi::cif::Item* first_tag_with_prefix(const gemmi::cif::Block& b, const std::vector<std::string>& prefixes,
                                              std::string* tag_found) {
  auto starts = [&](const std::string& tag) {
    const std::string t = lower(tag);
    for (const auto& p : prefixes)
      if (t.compare(0, p.size(), p) == 0) return true;
    return false;
  };
  for (const auto& item : b.items) {
    if (item.type == gemmi::cif::ItemType::Pair && starts(item.pair[0])) {
      *tag_found = item.pair[0];
      return &item;
    }
    if (item.type == gemmi::cif::ItemType::Loop)
      for (const auto& tag : item.loop.tags)
        if (starts(tag)) {
          *tag_found = tag;
          return &item;
        }
  }
  return nullptr;
}

// Superspace descriptions (modulation wave vectors, Fourier amplitudes, 3+d
// operations) describe incommensurate order, which no magnetic point group of
// a periodic crystal captures.
void refuse_incommensurate(const gemmi::cif::Block& b, const Source& src) {
  std::string tag;
  if (const gemmi::cif::Item* item = first_tag_with_prefix(
          b,
          {"_cell_wave_vector", "_cell_modulation_dimension", "_space_group_symop_magn_ssg", "_space_group_symop_ssg",
           "_space_group_ssg", "_space_group_magn_ssg", "_atom_site_moment_fourier", "_atom_site_fourier",
           "_atom_site_displace_fourier", "_atom_site_occ_fourier"},
          &tag))
    fail(ErrorKind::bad_file,
         "incommensurate (superspace) structure: " + tag +
             " describes a modulation that is not periodic with the cell, so there is no magnetic point group to "
             "screen",
         src.at(item),
         "a commensurate CIF or mCIF (an approximant in a supercell, with every moment listed, can stand in for it)");
}

double cell_number(const gemmi::cif::Block& b, const std::string& tag, const Source& src, bool angle) {
  const gemmi::cif::Item* item = b.find_pair_item(tag);
  if (!item)
    fail(ErrorKind::bad_file, "missing " + tag + ": the file gives no complete unit cell", src.at(nullptr),
         "_cell_length_a, _cell_length_b, _cell_length_c (Angstrom) and _cell_angle_alpha, _cell_angle_beta, "
         "_cell_angle_gamma (degrees)");
  const double v = gemmi::cif::as_number(item->pair[1]);
  const bool ok = std::isfinite(v) && v > 0 && (!angle || v < 180);
  if (!ok)
    fail(ErrorKind::bad_file, tag + " is '" + item->pair[1] + "', not a usable " + (angle ? "angle" : "length"),
         src.at(item), angle ? "an angle strictly between 0 and 180 degrees, e.g. 90 or 120.0(1)" : "a positive length in Angstrom, e.g. 4.9588(2)");
  return v;
}

Mat read_cell(const gemmi::cif::Block& b, const Source& src) {
  const double a = cell_number(b, "_cell_length_a", src, false), bl = cell_number(b, "_cell_length_b", src, false),
               c = cell_number(b, "_cell_length_c", src, false);
  const double al = cell_number(b, "_cell_angle_alpha", src, true), be = cell_number(b, "_cell_angle_beta", src, true),
               ga = cell_number(b, "_cell_angle_gamma", src, true);
  Mat m{};
  if (!lattice_from_cell_parameters({a, bl, c, al, be, ga}, &m))
    fail(ErrorKind::bad_file, "the cell angles do not form a cell", src.at(b.find_pair_item("_cell_angle_alpha")),
         "each angle smaller than the sum of the other two, none within 1e-6 degrees of 0 or 180");
  return m;
}

SpaceOperation parse_operation(const std::string& raw, bool magnetic, const Source& src,
                               const gemmi::cif::Item* item, const std::string& tag) {
  const std::string text = gemmi::cif::as_string(raw);
  const int line = src.line_of(item, text);
  const std::string where = line ? src.at_line(line) : src.at(item);
  std::string xyz = text;
  bool primed = false;
  const std::string valid = magnetic ? "x,y,z,+1 style: three coordinate expressions and the time-reversal sign +1 or -1"
                                     : "x,y,z style: three coordinate expressions such as -x+1/2,y,z+1/2";
  if (magnetic) {
    const std::size_t comma = text.rfind(',');
    const std::string sign = comma == std::string::npos ? "" : text.substr(comma + 1);
    if (sign == "+1" || sign == "1") primed = false;
    else if (sign == "-1") primed = true;
    else
      fail(ErrorKind::bad_file, tag + " '" + text + "' has no time-reversal sign", where, valid);
    xyz = text.substr(0, comma);
  }
  SpaceOperation op;
  std::size_t from = 0;
  for (int row = 0; row < 3; ++row) {
    const std::size_t comma = xyz.find(',', from);
    if ((row < 2) != (comma != std::string::npos))
      fail(ErrorKind::bad_file, tag + " '" + text + "' does not have three coordinate expressions", where, valid);
    std::array<long long, 4> r{};
    std::string problem;
    if (!parse_coordinate(xyz.substr(from, row < 2 ? comma - from : std::string::npos), &r, &problem))
      fail(ErrorKind::bad_file, tag + " '" + text + "' is not an operation (" + problem + ")", where, valid);
    for (int j = 0; j < 3; ++j) op.w[row][j] = r[j];
    op.t[row] = r[3];
    from = comma + 1;
  }
  const long long d = det_scaled(op.w), unit = kDen * kDen * kDen;
  if (d != unit && d != -unit)
    fail(ErrorKind::bad_file, tag + " '" + text + "' is not invertible on the lattice (determinant " +
                                  number_text(static_cast<double>(d) / static_cast<double>(unit)) + ")",
         where, "a rotation or rotoinversion, determinant +1 or -1");
  op.primed = primed;
  op.text = text;
  op.line = line;
  return op;
}

struct OperationList {
  std::vector<SpaceOperation> ops; // the whole group modulo lattice translations, identity first
  const gemmi::cif::Item* item = nullptr;
  bool magnetic = false;
  std::string how; // "12 magnetic operations stated", "expanded from R -3 c", ...
  std::vector<std::string> notes;
};

std::vector<SpaceOperation> read_operation_column(const gemmi::cif::Block& b, const std::vector<std::string>& tags,
                                                  bool magnetic, const Source& src,
                                                  const gemmi::cif::Item** item) {
  std::vector<SpaceOperation> out;
  for (const auto& tag : tags) {
    gemmi::cif::Column col = const_cast<gemmi::cif::Block&>(b).find_values(tag);
    if (!col) continue;
    *item = col.item();
    for (int i = 0; i < col.length(); ++i) out.push_back(parse_operation(col[i], magnetic, src, col.item(), tag));
    break;
  }
  return out;
}

std::string operation_where(const SpaceOperation& op, const Source& src, const gemmi::cif::Item* item) {
  return op.line ? src.at_line(op.line) : src.at(item);
}

// Products of the stated operations must be stated too (modulo lattice
// translations): a list that does not close is not a group, and atoms
// generated from it would depend on the order of the list.
void check_closure(const std::vector<SpaceOperation>& ops, const Source& src, const gemmi::cif::Item* item) {
  std::set<SpaceOperation> all(ops.begin(), ops.end());
  if (!all.count(identity_operation("")))
    fail(ErrorKind::bad_file, "the stated operations do not include the identity x,y,z", src.at(item),
         "a complete list of the space group's operations (x,y,z first)");
  for (std::size_t i = 0; i < ops.size(); ++i)
    for (std::size_t j = 0; j < ops.size(); ++j) {
      SpaceOperation p;
      const bool on_grid = compose(ops[i], ops[j], &p);
      if (!on_grid || !all.count(p))
        fail(ErrorKind::bad_file,
             "the stated operations do not close: " + ops[i].text + " after " + ops[j].text + " gives " +
                 (on_grid ? operation_text(p) : std::string("an operation with finer fractions")) +
                 ", which is not listed",
             operation_where(ops[i], src, item), "the complete list of the group's operations (and centerings), each once");
    }
}

std::vector<SpaceOperation> from_gemmi(const gemmi::GroupOps& group) {
  std::vector<SpaceOperation> out;
  constexpr long long scale = kDen / gemmi::Op::DEN;
  for (const gemmi::Op& g : group) {
    SpaceOperation op;
    for (int i = 0; i < 3; ++i) {
      for (int j = 0; j < 3; ++j) op.w[i][j] = g.rot[i][j] * scale;
      op.t[i] = wrap(g.tran[i] * scale);
    }
    op.text = g.triplet();
    out.push_back(op);
  }
  std::stable_partition(out.begin(), out.end(), [](const SpaceOperation& o) { return o == identity_operation(""); });
  return out;
}

std::string pair_text(const gemmi::cif::Block& b, const std::vector<const char*>& tags,
                      const gemmi::cif::Item** item) {
  for (const char* tag : tags)
    if (const gemmi::cif::Item* p = b.find_pair_item(tag)) {
      const std::string v = gemmi::cif::as_string(p->pair[1]);
      if (v.empty() || gemmi::cif::is_null(p->pair[1])) continue;
      *item = p;
      return v;
    }
  return "";
}

bool same_operations(std::vector<SpaceOperation> a, std::vector<SpaceOperation> b) {
  std::sort(a.begin(), a.end());
  std::sort(b.begin(), b.end());
  return a == b;
}

// The International Tables number alone names a space-group type, which the
// standard setting expands; where the Tables themselves give two choices
// (origin choice 1 or 2) or the cell contradicts the standard setting
// (monoclinic with another unique axis), the number does not say which, and
// the file is refused rather than guessed.
const gemmi::SpaceGroup* group_of_number(int number, double alpha, double beta, double gamma, std::string* problem) {
  const gemmi::SpaceGroup* reference = nullptr;
  const gemmi::SpaceGroup* rhombohedral = nullptr;
  bool origin_choices = false;
  for (const gemmi::SpaceGroup& sg : gemmi::spacegroup_tables::main) {
    if (sg.number != number) continue;
    if (sg.is_reference_setting() && !reference) reference = &sg;
    if (sg.ext == '1' || sg.ext == '2') origin_choices = true;
    if (sg.ext == 'R') rhombohedral = &sg;
  }
  if (!reference) return *problem = "there is no space group number " + std::to_string(number), nullptr;
  if (origin_choices)
    return *problem = "space group " + std::to_string(number) + " (" + reference->hm +
                      ") has two origin choices in International Tables and the number does not say which",
           nullptr;
  if (number >= 3 && number <= 15 && (std::fabs(alpha - 90) > 1e-6 || std::fabs(gamma - 90) > 1e-6))
    return *problem = "monoclinic space group " + std::to_string(number) +
                      " is standard with b unique, but this cell has alpha or gamma other than 90 degrees",
           nullptr;
  const bool rhombohedral_cell = std::fabs(alpha - beta) < 1e-6 && std::fabs(alpha - gamma) < 1e-6 &&
                                 std::fabs(alpha - 90) > 1e-6;
  if (rhombohedral && rhombohedral_cell) return rhombohedral;
  return reference;
}

OperationList read_operations(const gemmi::cif::Block& b, const Source& src, double alpha, double beta, double gamma) {
  OperationList list;
  const gemmi::cif::Item* item = nullptr;
  std::vector<SpaceOperation> ops = read_operation_column(
      b, {"_space_group_symop_magn_operation_xyz"},
      true, src, &item);
  if (!ops.empty()) {
    list.magnetic = true;
    list.item = item;
    const gemmi::cif::Item* centering_item = nullptr;
    std::vector<SpaceOperation> centerings = read_operation_column(
        b, {"_space_group_symop_magn_centering_xyz"},
        true, src, &centering_item);
    if (centerings.empty()) centerings.push_back(identity_operation("x,y,z,+1"));
    for (const auto& c : centerings) {
      bool pure_translation = true;
      for (int i = 0; i < 3; ++i)
        for (int j = 0; j < 3; ++j) pure_translation &= c.w[i][j] == (i == j ? kDen : 0);
      if (!pure_translation)
        fail(ErrorKind::bad_file, "centering '" + c.text + "' is not a translation",
             operation_where(c, src, centering_item), "x+t1,y+t2,z+t3,+1 or ,-1 (an anti-translation)");
    }
    std::set<SpaceOperation> seen;
    for (const auto& c : centerings)
      for (const auto& o : ops) {
        SpaceOperation p;
        compose(c, o, &p); // a pure translation times an operation stays on the grid
        p.text = centerings.size() == 1 ? o.text : "(" + o.text + ") with centering (" + c.text + ")";
        p.line = o.line;
        if (seen.insert(p).second) list.ops.push_back(p);
      }
    list.how = std::to_string(list.ops.size()) + " magnetic operations stated (" + std::to_string(ops.size()) +
               " times " + std::to_string(centerings.size()) + " centering" + (centerings.size() == 1 ? "" : "s") +
               ")";
    check_closure(list.ops, src, list.item);
    return list;
  }
  ops = read_operation_column(b, {"_space_group_symop_operation_xyz", "_symmetry_equiv_pos_as_xyz"}, false, src,
                              &item);
  list.item = item;
  if (!ops.empty()) {
    std::set<SpaceOperation> seen;
    for (const auto& o : ops)
      if (seen.insert(o).second) list.ops.push_back(o);
    list.how = std::to_string(list.ops.size()) + " operations stated";
    check_closure(list.ops, src, list.item);
    return list;
  }
  // No operations: the Hall symbol (which fixes origin and axes), then the
  // Hermann-Mauguin symbol, then the International Tables number.
  const gemmi::cif::Item* hall_item = nullptr;
  const gemmi::cif::Item* hm_item = nullptr;
  const gemmi::cif::Item* number_item = nullptr;
  const std::string hall = pair_text(b, {"_space_group_name_Hall", "_symmetry_space_group_name_Hall"}, &hall_item);
  const std::string hm = pair_text(b, {"_space_group_name_H-M_alt", "_symmetry_space_group_name_H-M"}, &hm_item);
  const std::string number =
      pair_text(b, {"_space_group_IT_number", "_symmetry_Int_Tables_number", "_space_group_IT_number"}, &number_item);
  const gemmi::SpaceGroup* by_name = hm.empty() ? nullptr : gemmi::find_spacegroup_by_name(hm, alpha, gamma);
  if (!hall.empty()) {
    list.item = hall_item;
    try {
      list.ops = from_gemmi(gemmi::symops_from_hall(hall.c_str()));
    } catch (const std::exception& e) {
      fail(ErrorKind::bad_file, "the Hall symbol '" + hall + "' cannot be read (" + e.what() + ")", src.at(hall_item),
           "a Hall symbol such as '-P 2ybc' or '-I 4bd 2', or the operations as a _space_group_symop_operation_xyz "
           "loop");
    }
    list.how = std::to_string(list.ops.size()) + " operations expanded from the Hall symbol " + hall;
    if (by_name && !same_operations(list.ops, from_gemmi(by_name->operations())))
      list.notes.push_back("the Hall symbol " + hall + " was used; the symbol " + hm +
                           " alone stands for another origin or setting (" + by_name->hall + ")");
    return list;
  }
  if (!hm.empty()) {
    list.item = hm_item;
    if (!by_name)
      fail(ErrorKind::bad_file, "unknown space-group symbol '" + hm + "'", src.at(hm_item),
           "a Hermann-Mauguin symbol such as 'P 21/c', 'R -3 c' or 'F m -3 m', or the operations as a "
           "_space_group_symop_operation_xyz loop");
    list.ops = from_gemmi(by_name->operations());
    list.how = std::to_string(list.ops.size()) + " operations expanded from the symbol " + hm;
    return list;
  }
  if (!number.empty()) {
    list.item = number_item;
    const double n = gemmi::cif::as_number(number);
    std::string problem;
    const gemmi::SpaceGroup* sg =
        n >= 1 && n <= 230 && n == std::floor(n) ? group_of_number(static_cast<int>(n), alpha, beta, gamma, &problem)
                                                 : nullptr;
    if (!sg)
      fail(ErrorKind::bad_file,
           (problem.empty() ? "'" + number + "' is not a space-group number" : problem) +
               "; the atoms listed are an asymmetric unit that cannot be expanded without knowing the operations",
           src.at(number_item),
           "the operations as a _space_group_symop_operation_xyz loop, a Hall symbol (_space_group_name_Hall) or a "
           "Hermann-Mauguin symbol with its setting (_space_group_name_H-M_alt)");
    list.ops = from_gemmi(sg->operations());
    list.how = std::to_string(list.ops.size()) + " operations expanded from the International Tables number " +
               number + " in the setting " + sg->xhm();
    return list;
  }
  list.ops.push_back(identity_operation("x,y,z"));
  list.how = "no operations, space-group symbol or number given: the listed atoms are taken as the whole cell (P1)";
  return list;
}

struct ListedSite {
  std::string label, species;
  Vec frac{};
  double occupancy = 1;
  Vec moment{}; // Cartesian
  bool has_moment = false;
};

Vec cartesian(const Mat& m, const Vec& f) {
  Vec r{};
  for (int i = 0; i < 3; ++i)
    for (int k = 0; k < 3; ++k) r[i] += m[k][i] * f[k];
  return r;
}

double length(const Vec& v) { return std::sqrt(v[0] * v[0] + v[1] * v[1] + v[2] * v[2]); }

std::vector<ListedSite> read_sites(const gemmi::cif::Block& b, const Source& src, const gemmi::cif::Item** atoms_item) {
  gemmi::SmallStructure small = gemmi::make_small_structure_from_block(b);
  *atoms_item = b.find_loop_item("_atom_site_label");
  if (!*atoms_item) *atoms_item = b.find_pair_item("_atom_site_label");
  if (small.sites.empty())
    fail(ErrorKind::bad_file, "no atom sites: the file has no _atom_site_label list", src.at(nullptr),
         "a loop_ with _atom_site_label, _atom_site_type_symbol, _atom_site_fract_x, _atom_site_fract_y, "
         "_atom_site_fract_z (and optionally _atom_site_occupancy)");
  for (const char* tag : {"_atom_site_fract_x", "_atom_site_fract_y", "_atom_site_fract_z"})
    if (!item_of(b, tag))
      fail(ErrorKind::bad_file, std::string("the atom sites have no ") + tag + " column", src.at(*atoms_item),
           "fractional coordinates _atom_site_fract_x, _y and _z for every site");
  std::vector<ListedSite> out;
  std::set<std::string> labels;
  for (const auto& s : small.sites) {
    ListedSite site;
    site.label = s.label;
    if (!labels.insert(s.label).second)
      fail(ErrorKind::bad_file, "site label '" + s.label + "' is listed twice", src.at_value(*atoms_item, s.label),
           "a distinct _atom_site_label for every site");
    site.frac = {s.fract.x, s.fract.y, s.fract.z};
    for (double v : site.frac)
      if (!std::isfinite(v))
        fail(ErrorKind::bad_file, "site '" + s.label + "' has a coordinate that is not a number",
             src.at_value(*atoms_item, s.label),
             "numbers such as 0.3475(2) for _atom_site_fract_x, _y and _z");
    site.occupancy = s.occ;
    if (!std::isfinite(site.occupancy) || site.occupancy <= 0 || site.occupancy > 1 + 1e-6)
      fail(ErrorKind::bad_file, "site '" + s.label + "' has occupancy " + number_text(site.occupancy),
           src.at_value(*atoms_item, s.label), "an occupancy in (0, 1]");
    site.species = s.element == gemmi::El::X ? s.type_symbol : s.element_and_charge_symbol();
    out.push_back(site);
  }
  return out;
}

// Moments along unit vectors parallel to a, b, c (the mCIF convention).
bool read_moments(const gemmi::cif::Block& b, const Source& src, const Mat& lattice, std::vector<ListedSite>* sites) {
  auto& block = const_cast<gemmi::cif::Block&>(b);
  for (const char* prefix : {"_atom_site_moment_"}) {
    gemmi::cif::Table t = block.find(prefix, {"label", "crystalaxis_x", "crystalaxis_y", "crystalaxis_z"});
    if (!t.ok()) {
      if (item_of(b, std::string(prefix) + "label"))
        fail(ErrorKind::bad_file, "the moment list lacks one of " + std::string(prefix) + "crystalaxis_x, _y, _z",
             src.at(item_of(b, std::string(prefix) + "label")),
             std::string(prefix) + "label with " + prefix + "crystalaxis_x, " + prefix + "crystalaxis_y, " + prefix +
                 "crystalaxis_z");
      continue;
    }
    const gemmi::cif::Item* item = item_of(b, std::string(prefix) + "label");
    std::string listed;
    for (const auto& s : *sites) listed += (listed.empty() ? "" : ", ") + s.label;
    for (auto row : t) {
      const std::string label = row.str(0);
      auto it = std::find_if(sites->begin(), sites->end(), [&](const ListedSite& s) { return s.label == label; });
      if (it == sites->end())
        fail(ErrorKind::bad_file, "a moment is given for site '" + label + "', which the atom sites do not list",
             src.at_value(item, label), "a label of the atom-site list: " + listed);
      Vec m{};
      for (int k = 0; k < 3; ++k) {
        const double v = gemmi::cif::as_number(row[k + 1]);
        if (!std::isfinite(v))
          fail(ErrorKind::bad_file, "the moment of site '" + label + "' has a component '" + row[k + 1] +
                                        "' that is not a number",
               src.at_value(item, label), "numbers in Bohr magnetons, e.g. 0.0 or 2.48(3)");
        m[k] = v;
      }
      Vec cart{};
      for (int k = 0; k < 3; ++k) {
        const double len = length(lattice[k]);
        for (int i = 0; i < 3; ++i) cart[i] += m[k] * lattice[k][i] / len;
      }
      it->moment = cart;
      it->has_moment = true;
    }
    return true;
  }
  return false;
}

Mat inverse(const Mat& m) {
  const double d = m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) - m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0]) +
                   m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0]);
  Mat r{};
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) {
      const int i1 = (j + 1) % 3, i2 = (j + 2) % 3, j1 = (i + 1) % 3, j2 = (i + 2) % 3;
      r[i][j] = (m[i1][j1] * m[i2][j2] - m[i1][j2] * m[i2][j1]) / d;
    }
  return r;
}

// R_cart = M^T W M^-T (docs/structures.md), to carry moments.
Mat cartesian_rotation(const Mat& m, const Mat& w) {
  const Mat mi = inverse(m);
  Mat out{};
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j)
      for (int l = 0; l < 3; ++l)
        for (int k = 0; k < 3; ++k) out[i][j] += m[l][i] * w[l][k] * mi[j][k];
  return out;
}

struct CellSite {
  std::size_t listed; // index into the listed sites it was generated from
  std::string species;
  Vec frac{}, moment{};
};

// The atoms of the cell: every stated operation applied to every listed site.
// An image that lands on an atom already placed must be that atom (same
// species, the moment the operation predicts); otherwise the operations do
// not belong to this structure and we say which one and where.
std::vector<CellSite> expand(const std::vector<ListedSite>& listed, const OperationList& ops, const Mat& lattice,
                             const StructureFileOptions& options, const Source& src,
                             std::vector<std::string>* notes) {
  const double tolerance = options.symprec;
  const OccupancyPolicy occupancy = options.occupancy;
  std::vector<Mat> rotations;
  for (const auto& op : ops.ops) rotations.push_back(cartesian_rotation(lattice, real_rotation(op)));
  std::vector<CellSite> cell;
  SiteGrid grid(lattice, tolerance);
  std::set<std::string> merged_notes;
  for (std::size_t s = 0; s < listed.size(); ++s) {
    const ListedSite& site = listed[s];
    const double moment_tolerance = 1e-2 * std::max(1.0, length(site.moment));
    for (std::size_t k = 0; k < ops.ops.size(); ++k) {
      const SpaceOperation& op = ops.ops[k];
      CellSite image;
      image.listed = s;
      image.species = site.species;
      for (int i = 0; i < 3; ++i) {
        double f = static_cast<double>(op.t[i]) / kDen;
        for (int j = 0; j < 3; ++j) f += static_cast<double>(op.w[i][j]) / kDen * site.frac[j];
        image.frac[i] = f - std::floor(f + 1e-9);
      }
      const double sign = det_sign(op) * (op.primed ? -1.0 : 1.0);
      for (int i = 0; i < 3; ++i)
        for (int j = 0; j < 3; ++j) image.moment[i] += sign * rotations[k][i][j] * site.moment[j];
      bool placed = false;
      for (std::size_t ci : grid.candidates(image.frac)) {
        CellSite& c = cell[ci];
        Vec d{};
        for (int i = 0; i < 3; ++i) d[i] = image.frac[i] - c.frac[i] - std::round(image.frac[i] - c.frac[i]);
        if (length(cartesian(lattice, d)) > tolerance) continue;
        placed = true;
        const ListedSite& other = listed[c.listed];
        Vec dm{};
        for (int i = 0; i < 3; ++i) dm[i] = image.moment[i] - c.moment[i];
        if (c.listed == s) {
          if (length(dm) > moment_tolerance)
            fail(ErrorKind::bad_file,
                 "operation " + std::to_string(k + 1) + " (" + op.text + ") maps site '" + site.label +
                     "' onto itself but turns its moment " + vec_text(c.moment) + " into " + vec_text(image.moment) +
                     "; the stated operations do not map this magnetic structure onto itself",
                 operation_where(op, src, ops.item),
                 "moments allowed by the site symmetry, or the operations of this structure");
          break;
        }
        const bool partial = site.occupancy < 1 - 1e-6 || other.occupancy < 1 - 1e-6;
        if (partial && occupancy == OccupancyPolicy::ignore) {
          if (c.species != site.species && c.species.find(site.species) == std::string::npos) {
            c.species += "/" + site.species;
            merged_notes.insert(other.label + " and " + site.label);
          }
          break;
        }
        if (other.species != site.species || length(dm) > moment_tolerance)
          fail(ErrorKind::bad_file,
               "operation " + std::to_string(k + 1) + " (" + op.text + ") maps site '" + site.label + "' (" +
                   site.species + (site.has_moment ? ", moment " + vec_text(image.moment) : "") +
                   ") onto the position of site '" + other.label + "' (" + other.species +
                   (other.has_moment ? ", moment " + vec_text(c.moment) : "") +
                   "); the stated operations do not map this structure onto itself",
               operation_where(op, src, ops.item),
               "operations and sites of one structure: each listed site in its own orbit");
        merged_notes.insert("=" + other.label + " and " + site.label);
        break;
      }
      if (!placed) {
        grid.insert(image.frac, cell.size());
        cell.push_back(image);
        if (cell.size() > options.max_atoms)
          fail(ErrorKind::bad_file,
               "the cell holds more than " + std::to_string(options.max_atoms) + " atoms (" +
                   std::to_string(listed.size()) + " listed sites, " + std::to_string(ops.ops.size()) +
                   " operations); the symmetry search grows with the square of the atoms, so this is refused by "
                   "default",
               src.at(ops.item ? ops.item : nullptr),
               "a smaller cell (the primitive or conventional one), or a larger limit: --max-atoms N (sample, "
               "screen) or max_atoms = N in [crystal] (run)");
      }
    }
  }
  for (const auto& m : merged_notes) {
    if (m[0] == '=')
      notes->push_back("sites " + m.substr(1) + " are images of each other under the stated operations; kept once");
    else
      notes->push_back("partially occupied sites " + m + " share positions: taken as one mixed species");
  }
  return cell;
}

bool is_rhombohedral_cell(const Mat& m) {
  double len[3], cosine[3];
  for (int i = 0; i < 3; ++i) len[i] = length(m[i]);
  for (int i = 0; i < 3; ++i) {
    const Vec& u = m[(i + 1) % 3];
    const Vec& v = m[(i + 2) % 3];
    cosine[i] = (u[0] * v[0] + u[1] * v[1] + u[2] * v[2]) / (length(u) * length(v));
  }
  return std::fabs(len[0] - len[1]) < 1e-6 * len[0] && std::fabs(len[1] - len[2]) < 1e-6 * len[0] &&
         std::fabs(cosine[0] - cosine[1]) < 1e-9 && std::fabs(cosine[1] - cosine[2]) < 1e-9 &&
         std::fabs(cosine[0]) > 1e-9 && std::fabs(cosine[0] + 0.5) > 1e-9;
}

// A rhombohedral cell (a = b = c, alpha = beta = gamma) has its 3-fold axis
// along a + b + c, so its point operations are not exact in a frame with a
// along x; the rest of the program wants the hexagonal axes of the same
// lattice (obverse setting: a_h = a - b, b_h = b - c, c_h = a + b + c, three
// times the volume), with c_h along z. Atoms, moments and the stated point
// operations are carried over.
void to_hexagonal_axes(CrystalStructure* st) {
  const Mat r = st->lattice;
  Mat h{};
  for (int k = 0; k < 3; ++k) {
    h[0][k] = r[0][k] - r[1][k];
    h[1][k] = r[1][k] - r[2][k];
    h[2][k] = r[0][k] + r[1][k] + r[2][k];
  }
  const double a = length(h[0]), c = length(h[2]);
  Mat hex{};
  lattice_from_cell_parameters({a, a, c, 90, 90, 120}, &hex);
  // New Cartesian = Q old Cartesian, Q = L^T H^-T (L: new rows, H: old hexagonal rows).
  const Mat h_inv = inverse(h); // H^-1; H^-T = transpose
  Mat q{};
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j)
      for (int k = 0; k < 3; ++k) q[i][j] += hex[k][i] * h_inv[j][k];
  std::vector<AtomSite> sites;
  const Vec centerings[3] = {{0, 0, 0}, {2.0 / 3, 1.0 / 3, 1.0 / 3}, {1.0 / 3, 2.0 / 3, 2.0 / 3}};
  for (const auto& s : st->sites) {
    const Vec cart = cartesian(r, s.frac);
    Vec f{}; // f_h = H^-T r
    for (int i = 0; i < 3; ++i)
      for (int k = 0; k < 3; ++k) f[i] += h_inv[k][i] * cart[k];
    Vec m{};
    for (int i = 0; i < 3; ++i)
      for (int k = 0; k < 3; ++k) m[i] += q[i][k] * s.moment[k];
    for (const auto& t : centerings) {
      AtomSite n = s;
      for (int i = 0; i < 3; ++i) {
        const double v = f[i] + t[i];
        n.frac[i] = v - std::floor(v + 1e-9);
      }
      n.moment = m;
      sites.push_back(n);
    }
  }
  st->sites = sites;
  st->lattice = hex;
  // f_r = T^T f_h with T the integer rows above, so W_h = T^-T W_r T^T.
  const IMat tt{{{1, 0, 1}, {-1, 1, 1}, {0, -1, 1}}};
  Mat tt_inv = inverse({Vec{1, 0, 1}, Vec{-1, 1, 1}, Vec{0, -1, 1}});
  for (auto& part : st->stated_point_parts) {
    IMat w{};
    for (int i = 0; i < 3; ++i)
      for (int j = 0; j < 3; ++j) {
        double v = 0;
        for (int k = 0; k < 3; ++k)
          for (int l = 0; l < 3; ++l) v += tt_inv[i][k] * part.first[k][l] * tt[l][j];
        w[i][j] = static_cast<int>(std::lround(v));
      }
    part.first = w;
  }
  st->rhombohedral_axes = true;
  st->reading_notes.push_back("rhombohedral axes of the file turned into hexagonal axes (obverse, c along z, a = " +
                              number_text(a) + " A, c = " + number_text(c) + " A)");
}

CrystalStructure read_block(const gemmi::cif::Block& block, const std::string& name,
                            const std::vector<std::string>& lines, const StructureFileOptions& options) {
  Source src{name, block.name, &lines};
  refuse_incommensurate(block, src);
  CrystalStructure out;
  out.where = src.at(nullptr);
  out.symprec = options.symprec;
  out.lattice = read_cell(block, src);
  // gemmi's symbol lookup needs them to choose hexagonal or rhombohedral axes.
  const double alpha = cell_number(block, "_cell_angle_alpha", src, true);
  const double beta = cell_number(block, "_cell_angle_beta", src, true);
  const double gamma = cell_number(block, "_cell_angle_gamma", src, true);
  const gemmi::cif::Item* atoms_item = nullptr;
  std::vector<ListedSite> listed = read_sites(block, src, &atoms_item);
  const bool moments = read_moments(block, src, out.lattice, &listed);
  OperationList ops = read_operations(block, src, alpha, beta, gamma);

  std::string partial;
  for (const auto& s : listed)
    if (s.occupancy < 1 - 1e-6) partial += (partial.empty() ? "" : ", ") + s.label + " (" + number_text(s.occupancy) + ")";
  if (!partial.empty()) {
    if (options.occupancy == OccupancyPolicy::refuse)
      fail(ErrorKind::bad_file, "partial occupancy (a disordered crystal) at sites " + partial, src.at(atoms_item),
           "a fully ordered structure, or occupancy = \"ignore\" in [crystal] (--occupancy ignore) to take every "
           "listed atom as present");
    out.reading_notes.push_back("partial occupancy ignored: " + partial + " taken as fully present");
  }

  const std::vector<CellSite> cell = expand(listed, ops, out.lattice, options, src, &out.reading_notes);
  out.magnetic = moments || ops.magnetic;
  for (const auto& c : cell) {
    AtomSite a;
    a.species = c.species;
    a.frac = c.frac;
    a.moment = c.moment;
    out.sites.push_back(a);
  }
  std::set<std::pair<IMat, bool>> parts;
  std::size_t fractional = 0;
  for (const auto& op : ops.ops) {
    IMat w{};
    if (!integer_rotation(op, &w)) ++fractional;
    else if (parts.insert({w, op.primed}).second) out.stated_point_parts.push_back({w, op.primed});
  }
  if (fractional)
    ops.notes.push_back(std::to_string(fractional) + " stated operations have fractional entries in the file's axes "
                        "(a centred or super cell); the search finds their point parts in the lattice of the atoms");
  for (const char* tag : {"_space_group_magn_number_BNS"})
    if (const gemmi::cif::Item* p = block.find_pair_item(tag)) {
      out.stated_bns_number = gemmi::cif::as_string(p->pair[1]);
      break;
    }
  out.reading_notes.insert(out.reading_notes.begin(), "read " + std::to_string(listed.size()) + " listed site" +
                                                          (listed.size() == 1 ? "" : "s") + ", " +
                                                          std::to_string(cell.size()) + " atoms in the cell; " +
                                                          ops.how);
  out.reading_notes.insert(out.reading_notes.end(), ops.notes.begin(), ops.notes.end());
  if (is_rhombohedral_cell(out.lattice)) to_hexagonal_axes(&out);
  return out;
}

} // namespace

OccupancyPolicy parse_occupancy_policy(const std::string& text, const std::string& where, ErrorKind kind) {
  if (text == "refuse") return OccupancyPolicy::refuse;
  if (text == "ignore") return OccupancyPolicy::ignore;
  fail(kind, "unknown occupancy handling '" + text + "'", where,
       "refuse (partial occupancy is an error) or ignore (every listed atom taken as present)");
}

namespace {

// gemmi says "name:line:column: problem"; keep its location as ours.
void split_parse_error(const std::string& what, const std::string& name, std::string* where, std::string* message) {
  *message = what;
  *where = name;
  if (what.compare(0, name.size() + 1, name + ":") == 0) {
    const std::size_t end = what.find(": ", name.size());
    if (end != std::string::npos) {
      *where = what.substr(0, end);
      *message = what.substr(end + 2);
    }
  }
}

[[noreturn]] void refuse_syntax(const std::string& what, const std::string& name, const std::string& text) {
  std::string where, message;
  split_parse_error(what, name, &where, &message);
  const bool cif2 = text.compare(0, 10, "#\\#CIF_2.0") == 0;
  fail(ErrorKind::bad_file, "not a readable CIF: " + message, where,
       std::string("CIF 1.1 syntax: data_ blocks of _tag value pairs and loop_ lists whose value count is a "
                   "multiple of the tag count") +
           (cif2 ? "; of CIF 2 the dotted tag names are read, but not lists, tables or triple-quoted strings" : ""));
}

// The document without gemmi's check for duplicates, which are judged below
// with what they mean.
void parse_document(const std::string& text, const std::string& name, gemmi::cif::Document* doc) {
  gemmi::cif::pegtl::memory_input<> in(text.data(), text.size(), name);
  doc->source = name;
  gemmi::cif::parse_input(*doc, in);
}

std::vector<std::string> split_lines(const std::string& text) {
  std::vector<std::string> lines;
  std::size_t start = 0;
  while (start <= text.size()) {
    const std::size_t stop = std::min(text.find('\n', start), text.size());
    lines.push_back(text.substr(start, stop - start));
    start = stop + 1;
  }
  return lines;
}

bool looks_like_structure(const std::string& text) {
  const std::string t = lower(text);
  return t.find("_atom_site_fract") != std::string::npos || t.find("_atom_site.fract") != std::string::npos ||
         t.find("_cell_length_a") != std::string::npos || t.find("_cell.length_a") != std::string::npos;
}

// A file whose syntax fails in one data block (a powder pattern beside the
// structure, say) is read block by block, each at its own lines; a broken
// block that holds no structure is skipped with a note, a broken block that
// might hold one is the file's error.
void parse_blocks_apart(const std::string& text, const std::string& name, const std::vector<std::string>& lines,
                        const std::string& first_error, gemmi::cif::Document* doc, std::vector<std::string>* notes) {
  std::vector<std::size_t> starts;
  bool in_text_field = false;
  for (std::size_t l = 0; l < lines.size(); ++l) {
    if (!lines[l].empty() && lines[l][0] == ';') in_text_field = !in_text_field;
    else if (!in_text_field && lower(lines[l].substr(0, 5)) == "data_") starts.push_back(l);
  }
  if (starts.size() < 2) refuse_syntax(first_error, name, text);
  starts[0] = 0; // comments before the first block go with it
  *doc = gemmi::cif::Document{};
  doc->source = name;
  for (std::size_t k = 0; k < starts.size(); ++k) {
    std::size_t end = k + 1 < starts.size() ? starts[k + 1] : lines.size();
    std::string part(starts[k], '\n'); // keeps gemmi's line numbers those of the file
    for (std::size_t l = starts[k]; l < end; ++l) part += lines[l] + "\n";
    gemmi::cif::Document one;
    try {
      parse_document(part, name, &one);
    } catch (const std::exception& e) {
      if (looks_like_structure(part)) refuse_syntax(e.what(), name, text);
      std::string where, message;
      split_parse_error(e.what(), name, &where, &message);
      while (end > starts[k] + 1 && lines[end - 1].find_first_not_of(" \t\r") == std::string::npos) --end;
      notes->push_back("a data block without a structure (lines " + std::to_string(starts[k] + 1) + "-" +
                       std::to_string(end) + ") is not valid CIF and was skipped: " + where + ": " + message);
      continue;
    }
    for (auto& b : one.blocks) doc->blocks.push_back(std::move(b));
  }
}

std::string item_line(const gemmi::cif::Item& item) {
  return item.line_number > 0 ? "line " + std::to_string(item.line_number) : "an unknown line";
}

// Tags given twice in the block that is read: the same value twice is a
// harmless repetition (read once, noted); two different values of a tag
// the structure depends on cannot be read either way and are refused.
void settle_duplicate_tags(gemmi::cif::Block* block, const Source& src, std::vector<std::string>* notes) {
  std::map<std::string, std::size_t> first; // lower-case tag -> index of the item holding it
  std::vector<bool> drop(block->items.size(), false);
  const auto needed = [](const std::string& tag) {
    for (const char* p : {"_cell_", "_atom_site", "_space_group", "_symmetry_"})
      if (tag.compare(0, std::strlen(p), p) == 0) return true;
    return false;
  };
  for (std::size_t i = 0; i < block->items.size(); ++i) {
    const gemmi::cif::Item& item = block->items[i];
    std::vector<std::string> tags;
    if (item.type == gemmi::cif::ItemType::Pair) tags.push_back(item.pair[0]);
    if (item.type == gemmi::cif::ItemType::Loop) tags = item.loop.tags;
    for (const auto& tag : tags) {
      const std::string key = lower(tag);
      auto [it, fresh] = first.emplace(key, i);
      if (fresh) continue;
      const gemmi::cif::Item& earlier = block->items[it->second];
      const bool both_pairs = item.type == gemmi::cif::ItemType::Pair && earlier.type == gemmi::cif::ItemType::Pair;
      const bool same = both_pairs && gemmi::cif::as_string(item.pair[1]) == gemmi::cif::as_string(earlier.pair[1]);
      if (same || (!needed(key) && item.type == gemmi::cif::ItemType::Pair)) {
        drop[i] = true;
        notes->push_back(tag + " is given twice (" + item_line(earlier) + " and " + item_line(item) + ")" +
                         (same ? " with the same value; read once" : "; the first is read"));
      } else if (needed(key) || both_pairs) {
        fail(ErrorKind::bad_file,
             tag + " is given twice with different values (" + item_line(earlier) + " and " + item_line(item) +
                 "), so the file does not say which holds",
             src.at(&item), "each tag once in a data block");
      } else {
        notes->push_back(tag + " is given twice (" + item_line(earlier) + " and " + item_line(item) +
                         "); the first is read");
      }
    }
  }
  for (std::size_t i = block->items.size(); i-- > 0;)
    if (drop[i]) block->items.erase(block->items.begin() + static_cast<std::ptrdiff_t>(i));
}

} // namespace

CrystalStructure read_structure_text(const std::string& raw, const std::string& name,
                                     const StructureFileOptions& options) {
  const CifTextRepair repaired = repair_cif_text(raw);
  const std::string& text = repaired.text;
  const std::vector<std::string> lines = split_lines(text);
  std::vector<std::string> notes = repaired.notes;
  gemmi::cif::Document doc;
  try {
    parse_document(text, name, &doc);
  } catch (const std::exception& e) {
    parse_blocks_apart(text, name, lines, e.what(), &doc, &notes);
  }
  // DDLm (CIF 2) names separate category and attribute by a dot
  // (_cell.length_a, _atom_site_moment.label); the older names use an
  // underscore. One spelling is looked up below, so the dots become underscores.
  for (auto& block : doc.blocks)
    for (auto& item : block.items) {
      if (item.type == gemmi::cif::ItemType::Pair) std::replace(item.pair[0].begin(), item.pair[0].end(), '.', '_');
      if (item.type == gemmi::cif::ItemType::Loop)
        for (auto& tag : item.loop.tags) std::replace(tag.begin(), tag.end(), '.', '_');
    }
  for (auto& block : doc.blocks)
    if (block.find_pair_item("_cell_length_a") || block.find_loop_item("_atom_site_label")) {
      std::size_t same_name = 0;
      for (const auto& other : doc.blocks) same_name += lower(other.name) == lower(block.name) ? 1 : 0;
      if (same_name > 1)
        notes.push_back(std::to_string(same_name) + " data blocks are named data_" + block.name +
                        "; the first one with a structure is read");
      settle_duplicate_tags(&block, Source{name, block.name, &lines}, &notes);
      CrystalStructure out = read_block(block, name, lines, options);
      out.reading_notes.insert(out.reading_notes.end(), notes.begin(), notes.end());
      return out;
    }
  fail(ErrorKind::bad_file, "no data block with a unit cell or atom sites", name,
       "a data_ block with _cell_length_a ... _cell_angle_gamma and an _atom_site_ loop");
}

CrystalStructure read_structure_file(const std::string& path, const StructureFileOptions& options) {
  std::ifstream in(path, std::ios::binary);
  if (!in) fail(ErrorKind::bad_file, "cannot open the structure file", path, "a readable CIF or mCIF file");
  std::ostringstream buffer;
  buffer << in.rdbuf();
  return read_structure_text(buffer.str(), path, options);
}

std::vector<std::string> structure_symmetry_notes(const CrystalStructure& cell, const StructureSymmetry& sym) {
  std::vector<std::string> notes;
  if (cell.magnetic) {
    static const char* types[] = {"", "I (no time reversal in any operation)", "II (grey: time reversal itself is a symmetry)",
                                  "III (time reversal only combined with rotations)",
                                  "IV (time reversal combined with a translation)"};
    const int type = sym.magnetic_type >= 1 && sym.magnetic_type <= 4 ? sym.magnetic_type : 0;
    notes.push_back("magnetic space group BNS " + sym.bns_number + " (spglib UNI " +
                    std::to_string(sym.magnetic_uni_number) + "), type " + (type ? types[type] : "unknown"));
    if (type == 4)
      notes.push_back("type IV: an anti-translation (a lattice translation with time reversal) is a symmetry, so "
                      "every point operation comes with its primed partner and the magnetic point group is grey; "
                      "responses odd under time reversal, such as the anomalous Hall effect of this "
                      "antiferromagnet, are forbidden");
    if (!cell.stated_bns_number.empty() && !gemmi::cif::is_null(cell.stated_bns_number)) {
      if (cell.stated_bns_number == sym.bns_number)
        notes.push_back("the file states BNS " + cell.stated_bns_number + ", as found");
      else
        notes.push_back("the file states BNS " + cell.stated_bns_number + ", but its atoms and moments have BNS " +
                        sym.bns_number + " (within symprec " + number_text(sym.symprec) + " Angstrom)");
    }
  }
  if (sym.primitive_basis)
    notes.push_back("the cell's axes do not carry every operation as an integer matrix; the search used the "
                    "primitive cell of the same atoms");
  if (!cell.stated_point_parts.empty() && !sym.primitive_basis) {
    std::set<std::pair<IMat, bool>> found;
    for (const auto& op : sym.point_operations) found.insert({op.rotation_lattice, op.time_reversal});
    std::size_t missing = 0;
    for (const auto& p : cell.stated_point_parts) missing += found.count({p.first, cell.magnetic && p.second}) ? 0 : 1;
    if (missing)
      notes.push_back(std::to_string(missing) + " of the stated point operations are not found by the search; the "
                      "group below is the one the atoms have");
    else if (found.size() > cell.stated_point_parts.size())
      notes.push_back("the atoms have more symmetry than the file states (" + std::to_string(found.size()) +
                      " point operations found, " + std::to_string(cell.stated_point_parts.size()) + " stated)");
    else
      notes.push_back("all " + std::to_string(cell.stated_point_parts.size()) +
                      " stated point operations confirmed by the search");
  }
  if (sym.symprec < cell.symprec)
    notes.push_back("spglib found no symmetry at symprec " + number_text(cell.symprec) +
                    " Angstrom; the group is the one found at symprec " + number_text(sym.symprec) + " Angstrom");
  notes.insert(notes.end(), cell.reading_notes.begin(), cell.reading_notes.end());
  return notes;
}

} // namespace ts
