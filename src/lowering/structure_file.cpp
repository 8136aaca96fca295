#include "lowering/structure_file.hpp"

#include "core/error.hpp"
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
#include <fstream>
#include <map>
#include <set>
#include <sstream>

namespace ts {

namespace {

using IMat = std::array<std::array<int, 3>, 3>;
using Vec = std::array<double, 3>;
using Mat = std::array<Vec, 3>;

constexpr int kDen = gemmi::Op::DEN; // translations are kept in 24ths, exactly as gemmi parses them

// One operation of a magnetic space group on fractional coordinates:
// f -> W f + t, moment reversed once more when primed.
struct SpaceOperation {
  IMat w{};
  std::array<int, 3> t{}; // in 1/24, wrapped into [0, 24)
  bool primed = false;
  std::string text; // as written in the file (or expanded from the symbol)
  bool operator<(const SpaceOperation& o) const { return std::tie(w, t, primed) < std::tie(o.w, o.t, o.primed); }
  bool operator==(const SpaceOperation& o) const { return w == o.w && t == o.t && primed == o.primed; }
};

int wrap24(int v) { return ((v % kDen) + kDen) % kDen; }

SpaceOperation compose(const SpaceOperation& a, const SpaceOperation& b) { // a after b
  SpaceOperation c;
  for (int i = 0; i < 3; ++i) {
    int t = a.t[i];
    for (int k = 0; k < 3; ++k) {
      t += a.w[i][k] * b.t[k];
      for (int j = 0; j < 3; ++j) c.w[i][j] += a.w[i][k] * b.w[k][j];
    }
    c.t[i] = wrap24(t);
  }
  c.primed = a.primed != b.primed;
  return c;
}

int det(const IMat& m) {
  return m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) - m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0]) +
         m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0]);
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

std::string operation_text(const SpaceOperation& op) {
  gemmi::Op g;
  for (int i = 0; i < 3; ++i) {
    for (int j = 0; j < 3; ++j) g.rot[i][j] = op.w[i][j] * kDen;
    g.tran[i] = op.t[i];
  }
  return g.triplet() + (op.primed ? ",-1" : ",+1");
}

// What reading one file needs to say where things are.
struct Source {
  std::string name;
  std::string block;
  std::string at(const gemmi::cif::Item* item) const {
    std::string s = name;
    if (item && item->line_number > 0) s += ":" + std::to_string(item->line_number);
    return s + " (data_" + block + ")";
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
         "each angle smaller than the sum of the other two");
  return m;
}

SpaceOperation parse_operation(const std::string& raw, bool magnetic, const Source& src,
                               const gemmi::cif::Item* item, const std::string& tag) {
  const std::string text = gemmi::cif::as_string(raw);
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
      fail(ErrorKind::bad_file, tag + " '" + text + "' has no time-reversal sign", src.at(item), valid);
    xyz = text.substr(0, comma);
  }
  gemmi::Op g;
  try {
    g = gemmi::parse_triplet(xyz);
  } catch (const std::exception& e) {
    fail(ErrorKind::bad_file, tag + " '" + text + "' is not an operation (" + e.what() + ")", src.at(item), valid);
  }
  SpaceOperation op;
  for (int i = 0; i < 3; ++i) {
    for (int j = 0; j < 3; ++j) {
      if (g.rot[i][j] % kDen != 0)
        fail(ErrorKind::bad_file, tag + " '" + text + "' has a fractional rotation part", src.at(item), valid);
      op.w[i][j] = g.rot[i][j] / kDen;
    }
    op.t[i] = wrap24(g.tran[i]);
  }
  if (std::abs(det(op.w)) != 1)
    fail(ErrorKind::bad_file, tag + " '" + text + "' is not invertible on the lattice (determinant " +
                                  std::to_string(det(op.w)) + ")",
         src.at(item), "a rotation or rotoinversion, determinant +1 or -1");
  op.primed = primed;
  op.text = text;
  return op;
}

struct OperationList {
  std::vector<SpaceOperation> ops; // the whole group modulo lattice translations, identity first
  const gemmi::cif::Item* item = nullptr;
  bool magnetic = false;
  std::string how; // "12 magnetic operations stated", "expanded from R -3 c", ...
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

// Products of the stated operations must be stated too (modulo lattice
// translations): a list that does not close is not a group, and atoms
// generated from it would depend on the order of the list.
void check_closure(const std::vector<SpaceOperation>& ops, const Source& src, const gemmi::cif::Item* item) {
  std::set<SpaceOperation> all(ops.begin(), ops.end());
  SpaceOperation identity;
  for (int i = 0; i < 3; ++i) identity.w[i][i] = 1;
  if (!all.count(identity))
    fail(ErrorKind::bad_file, "the stated operations do not include the identity x,y,z", src.at(item),
         "a complete list of the space group's operations (x,y,z first)");
  for (std::size_t i = 0; i < ops.size(); ++i)
    for (std::size_t j = 0; j < ops.size(); ++j) {
      const SpaceOperation p = compose(ops[i], ops[j]);
      if (!all.count(p))
        fail(ErrorKind::bad_file,
             "the stated operations do not close: " + ops[i].text + " after " + ops[j].text + " gives " +
                 operation_text(p) + ", which is not listed",
             src.at(item), "the complete list of the group's operations (and centerings), each once");
    }
}

OperationList read_operations(const gemmi::cif::Block& b, const Source& src, double alpha, double gamma) {
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
    if (centerings.empty()) {
      SpaceOperation identity;
      for (int i = 0; i < 3; ++i) identity.w[i][i] = 1;
      identity.text = "x,y,z,+1";
      centerings.push_back(identity);
    }
    for (const auto& c : centerings) {
      bool pure_translation = true;
      for (int i = 0; i < 3; ++i)
        for (int j = 0; j < 3; ++j) pure_translation &= c.w[i][j] == (i == j ? 1 : 0);
      if (!pure_translation)
        fail(ErrorKind::bad_file, "centering '" + c.text + "' is not a translation", src.at(centering_item),
             "x+t1,y+t2,z+t3,+1 or ,-1 (an anti-translation)");
    }
    std::set<SpaceOperation> seen;
    for (const auto& c : centerings)
      for (const auto& o : ops) {
        SpaceOperation p = compose(c, o);
        p.text = centerings.size() == 1 ? o.text : "(" + o.text + ") with centering (" + c.text + ")";
        if (seen.insert(p).second) list.ops.push_back(p);
      }
    list.how = std::to_string(list.ops.size()) + " magnetic operations stated (" + std::to_string(ops.size()) +
               " times " + std::to_string(centerings.size()) + " centering" + (centerings.size() == 1 ? "" : "s") +
               ")";
  } else {
    ops = read_operation_column(
        b, {"_space_group_symop_operation_xyz", "_symmetry_equiv_pos_as_xyz"},
        false, src, &item);
    list.item = item;
    if (!ops.empty()) {
      std::set<SpaceOperation> seen;
      for (const auto& o : ops)
        if (seen.insert(o).second) list.ops.push_back(o);
      list.how = std::to_string(list.ops.size()) + " operations stated";
    } else {
      std::string hm;
      for (const char* tag : {"_space_group_name_H-M_alt", "_symmetry_space_group_name_H-M"})
        if (const gemmi::cif::Item* p = b.find_pair_item(tag)) {
          hm = gemmi::cif::as_string(p->pair[1]);
          list.item = p;
          break;
        }
      if (hm.empty() || gemmi::cif::is_null(hm)) {
        SpaceOperation identity;
        for (int i = 0; i < 3; ++i) identity.w[i][i] = 1;
        identity.text = "x,y,z";
        list.ops.push_back(identity);
        list.how = "no operations or space-group symbol given: the listed atoms are taken as the whole cell (P1)";
        return list;
      }
      const gemmi::SpaceGroup* sg = gemmi::find_spacegroup_by_name(hm, alpha, gamma);
      if (!sg)
        fail(ErrorKind::bad_file, "unknown space-group symbol '" + hm + "'", src.at(list.item),
             "a Hermann-Mauguin symbol such as 'P 21/c', 'R -3 c' or 'F m -3 m', or the operations as a "
             "_space_group_symop_operation_xyz loop");
      for (const gemmi::Op& g : sg->operations()) {
        SpaceOperation op;
        for (int i = 0; i < 3; ++i) {
          for (int j = 0; j < 3; ++j) op.w[i][j] = g.rot[i][j] / kDen;
          op.t[i] = wrap24(g.tran[i]);
        }
        op.text = g.triplet();
        list.ops.push_back(op);
      }
      list.how = std::to_string(list.ops.size()) + " operations expanded from the symbol " + hm;
      return list; // gemmi's tables are groups by construction
    }
  }
  check_closure(list.ops, src, list.item);
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
      fail(ErrorKind::bad_file, "site label '" + s.label + "' is listed twice", src.at(*atoms_item),
           "a distinct _atom_site_label for every site");
    site.frac = {s.fract.x, s.fract.y, s.fract.z};
    for (double v : site.frac)
      if (!std::isfinite(v))
        fail(ErrorKind::bad_file, "site '" + s.label + "' has a coordinate that is not a number", src.at(*atoms_item),
             "numbers such as 0.3475(2) for _atom_site_fract_x, _y and _z");
    site.occupancy = s.occ;
    if (!std::isfinite(site.occupancy) || site.occupancy <= 0 || site.occupancy > 1 + 1e-6)
      fail(ErrorKind::bad_file, "site '" + s.label + "' has occupancy " + number_text(site.occupancy),
           src.at(*atoms_item), "an occupancy in (0, 1]");
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
             src.at(item), "a label of the atom-site list: " + listed);
      Vec m{};
      for (int k = 0; k < 3; ++k) {
        const double v = gemmi::cif::as_number(row[k + 1]);
        if (!std::isfinite(v))
          fail(ErrorKind::bad_file, "the moment of site '" + label + "' has a component '" + row[k + 1] +
                                        "' that is not a number",
               src.at(item), "numbers in Bohr magnetons, e.g. 0.0 or 2.48(3)");
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
Mat cartesian_rotation(const Mat& m, const IMat& w) {
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
                             double tolerance, OccupancyPolicy occupancy, const Source& src,
                             std::vector<std::string>* notes) {
  std::vector<Mat> rotations;
  for (const auto& op : ops.ops) rotations.push_back(cartesian_rotation(lattice, op.w));
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
        for (int j = 0; j < 3; ++j) f += op.w[i][j] * site.frac[j];
        image.frac[i] = f - std::floor(f + 1e-9);
      }
      const double sign = (det(op.w) > 0 ? 1.0 : -1.0) * (op.primed ? -1.0 : 1.0);
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
                 src.at(ops.item), "moments allowed by the site symmetry, or the operations of this structure");
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
               src.at(ops.item), "operations and sites of one structure: each listed site in its own orbit");
        merged_notes.insert("=" + other.label + " and " + site.label);
        break;
      }
      if (!placed) {
        grid.insert(image.frac, cell.size());
        cell.push_back(image);
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
  st->reading_notes.push_back("rhombohedral axes of the file turned into hexagonal axes (obverse, c along z, a = " +
                              number_text(a) + " A, c = " + number_text(c) + " A)");
}

CrystalStructure read_block(const gemmi::cif::Block& block, const std::string& name,
                            const StructureFileOptions& options) {
  Source src{name, block.name};
  refuse_incommensurate(block, src);
  CrystalStructure out;
  out.where = src.at(nullptr);
  out.symprec = options.symprec;
  out.lattice = read_cell(block, src);
  // gemmi's symbol lookup needs them to choose hexagonal or rhombohedral axes.
  const double alpha = cell_number(block, "_cell_angle_alpha", src, true);
  const double gamma = cell_number(block, "_cell_angle_gamma", src, true);
  const gemmi::cif::Item* atoms_item = nullptr;
  std::vector<ListedSite> listed = read_sites(block, src, &atoms_item);
  const bool moments = read_moments(block, src, out.lattice, &listed);
  OperationList ops = read_operations(block, src, alpha, gamma);

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

  const std::vector<CellSite> cell = expand(listed, ops, out.lattice, options.symprec, options.occupancy, src,
                                            &out.reading_notes);
  out.magnetic = moments || ops.magnetic;
  for (const auto& c : cell) {
    AtomSite a;
    a.species = c.species;
    a.frac = c.frac;
    a.moment = c.moment;
    out.sites.push_back(a);
  }
  std::set<std::pair<IMat, bool>> parts;
  for (const auto& op : ops.ops)
    if (parts.insert({op.w, op.primed}).second) out.stated_point_parts.push_back({op.w, op.primed});
  for (const char* tag : {"_space_group_magn_number_BNS"})
    if (const gemmi::cif::Item* p = block.find_pair_item(tag)) {
      out.stated_bns_number = gemmi::cif::as_string(p->pair[1]);
      break;
    }
  out.reading_notes.insert(out.reading_notes.begin(), "read " + std::to_string(listed.size()) + " listed site" +
                                                          (listed.size() == 1 ? "" : "s") + ", " +
                                                          std::to_string(cell.size()) + " atoms in the cell; " +
                                                          ops.how);
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

CrystalStructure read_structure_text(const std::string& text, const std::string& name,
                                     const StructureFileOptions& options) {
  gemmi::cif::Document doc;
  try {
    doc = gemmi::cif::read_memory(text.data(), text.size(), name.c_str());
  } catch (const std::exception& e) {
    // gemmi says "name:line:column: problem"; keep its location as ours.
    std::string message = e.what();
    std::string where = name;
    if (message.compare(0, name.size() + 1, name + ":") == 0) {
      std::size_t end = message.find(": ", name.size());
      if (end != std::string::npos) {
        where = message.substr(0, end);
        message = message.substr(end + 2);
      }
    }
    const bool cif2 = text.compare(0, 10, "#\\#CIF_2.0") == 0;
    fail(ErrorKind::bad_file, "not a readable CIF: " + message, where,
         std::string("CIF 1.1 syntax: data_ blocks of _tag value pairs and loop_ lists whose value count is a "
                     "multiple of the tag count") +
             (cif2 ? "; of CIF 2 the dotted tag names are read, but not lists, tables or triple-quoted strings"
                   : ""));
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
  for (const auto& block : doc.blocks)
    if (block.find_pair_item("_cell_length_a") || block.find_loop_item("_atom_site_label"))
      return read_block(block, name, options);
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
  if (!cell.stated_point_parts.empty()) {
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
  notes.insert(notes.end(), cell.reading_notes.begin(), cell.reading_notes.end());
  return notes;
}

} // namespace ts
