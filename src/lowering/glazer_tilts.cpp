#include "lowering/glazer_tilts.hpp"

#include "core/error.hpp"

#include <cmath>

namespace ts {

namespace {

using Vec = std::array<double, 3>;
using Mat = std::array<Vec, 3>;

const char* const kValidSymbol =
    "three pairs (letter, tilt) for the axes x, y, z: the letter is the axis's own (a, b, c) or that of an "
    "earlier axis with the same tilt magnitude, the tilt is 0, + or -; e.g. a0a0c-, a-a-a-, a+b-b-, a0b+c-";

// One decoded character of the symbol: its code point and its 1-based position.
struct Glyph {
  char32_t code;
  int position;
};

std::vector<Glyph> decode(const std::string& text) {
  std::vector<Glyph> out;
  int position = 0;
  for (std::size_t i = 0; i < text.size();) {
    const unsigned char c = static_cast<unsigned char>(text[i]);
    char32_t code = c;
    std::size_t len = 1;
    if (c >= 0xF0) len = 4, code = c & 0x07;
    else if (c >= 0xE0) len = 3, code = c & 0x0F;
    else if (c >= 0xC0) len = 2, code = c & 0x1F;
    if (i + len > text.size()) len = text.size() - i;
    for (std::size_t k = 1; k < len; ++k) code = (code << 6) | (static_cast<unsigned char>(text[i + k]) & 0x3F);
    out.push_back({code, ++position});
    i += len;
  }
  return out;
}

std::string encode(char32_t c) {
  std::string s;
  if (c < 0x80) {
    s += static_cast<char>(c);
  } else if (c < 0x800) {
    s += static_cast<char>(0xC0 | (c >> 6));
    s += static_cast<char>(0x80 | (c & 0x3F));
  } else if (c < 0x10000) {
    s += static_cast<char>(0xE0 | (c >> 12));
    s += static_cast<char>(0x80 | ((c >> 6) & 0x3F));
    s += static_cast<char>(0x80 | (c & 0x3F));
  } else {
    s += static_cast<char>(0xF0 | (c >> 18));
    s += static_cast<char>(0x80 | ((c >> 12) & 0x3F));
    s += static_cast<char>(0x80 | ((c >> 6) & 0x3F));
    s += static_cast<char>(0x80 | (c & 0x3F));
  }
  return s;
}

char tilt_of(char32_t c) {
  switch (c) {
  case U'0': case U'\u2070': return '0';
  case U'+': case U'\u207A': return '+';
  case U'-': case U'\u207B': case U'\u2212': return '-';
  default: return 0;
  }
}

[[noreturn]] void bad_symbol(const std::string& text, int position, const std::string& problem) {
  fail(ErrorKind::bad_spec, problem, "Glazer symbol \"" + text + "\", character " + std::to_string(position),
       kValidSymbol);
}

// Rotation by the angle |v| (radians) about v (Rodrigues). Using the rotation
// vector, not a product of three axis rotations, keeps the construction
// covariant: a parent operation maps the tilt pattern and the structure alike,
// so the structure has exactly the symmetry of the pattern.
Mat rotation(const Vec& v) {
  const double phi = std::sqrt(v[0] * v[0] + v[1] * v[1] + v[2] * v[2]);
  Mat r{{{1, 0, 0}, {0, 1, 0}, {0, 0, 1}}};
  if (phi == 0) return r;
  const Vec u{v[0] / phi, v[1] / phi, v[2] / phi};
  const double s = std::sin(phi), c = 1 - std::cos(phi);
  const Mat k{{{0, -u[2], u[1]}, {u[2], 0, -u[0]}, {-u[1], u[0], 0}}};
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) {
      double kk = 0;
      for (int l = 0; l < 3; ++l) kk += k[i][l] * k[l][j];
      r[i][j] += s * k[i][j] + c * kk;
    }
  return r;
}

Vec rotate(const Mat& r, const Vec& v) {
  Vec out{};
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) out[i] += r[i][j] * v[j];
  return out;
}

void check_tilt_system(const TiltSystem& t) {
  const std::string where = "tilt system \"" + t.glazer + "\"";
  for (int i = 0; i < 3; ++i) {
    if (t.sense[i] != '0' && t.sense[i] != '+' && t.sense[i] != '-')
      fail(ErrorKind::bad_spec, "axis " + std::to_string(i + 1) + " has tilt sense '" + std::string(1, t.sense[i]) + "'",
           where, "'0', '+' or '-' per axis (build it with parse_glazer_symbol)");
    const int m = t.magnitude_class[i];
    if (m < 0 || m > i || t.magnitude_class[m] != m || (t.sense[m] == '0') != (t.sense[i] == '0'))
      fail(ErrorKind::bad_spec, "axis " + std::to_string(i + 1) + " has an inconsistent magnitude class " +
                                    std::to_string(m), where,
           "the index of the first axis with the same letter, whose tilt is zero exactly when this one's is "
           "(build it with parse_glazer_symbol)");
  }
}

} // namespace

TiltSystem parse_glazer_symbol(const std::string& text) {
  std::vector<Glyph> g = decode(text);
  std::size_t i = 0, end = g.size();
  while (i < end && (g[i].code == U' ' || g[i].code == U'\t')) ++i;
  while (end > i && (g[end - 1].code == U' ' || g[end - 1].code == U'\t')) --end;
  if (i == end) fail(ErrorKind::bad_spec, "empty Glazer symbol", "Glazer symbol \"" + text + "\"", kValidSymbol);

  static const char* axis_name[3] = {"x", "y", "z"};
  TiltSystem t;
  char letters[3] = {0, 0, 0};
  for (int axis = 0; axis < 3; ++axis) {
    const char own = static_cast<char>('a' + axis);
    std::string allowed = std::string(1, own);
    for (int k = 0; k < axis; ++k)
      if (allowed.find(letters[k]) == std::string::npos) allowed += std::string(", ") + letters[k];
    if (i == end)
      bad_symbol(text, g[end - 1].position + 1,
                 "ends early: the letter for the " + std::string(axis_name[axis]) + " axis is missing (" +
                     (axis == 0 ? "" : "one of ") + allowed + ")");
    const char32_t c = g[i].code;
    const char letter = (c >= U'a' && c <= U'c') ? static_cast<char>(c) : (c >= U'A' && c <= U'C') ? static_cast<char>(c - U'A' + U'a') : 0;
    if (!letter || allowed.find(letter) == std::string::npos)
      bad_symbol(text, g[i].position,
                 "unexpected '" + encode(c) + "' where the letter for the " + axis_name[axis] +
                     " axis belongs (" + (axis == 0 ? "" : "one of ") + allowed + ")");
    letters[axis] = letter;
    ++i;
    if (i < end && g[i].code == U'^') ++i;
    if (i == end)
      bad_symbol(text, g[end - 1].position + 1,
                 "ends early: the tilt (0, + or -) for the " + std::string(axis_name[axis]) + " axis is missing");
    const char sense = tilt_of(g[i].code);
    if (!sense)
      bad_symbol(text, g[i].position,
                 "unexpected '" + encode(g[i].code) + "' where the tilt (0, + or -) for the " + axis_name[axis] +
                     " axis belongs");
    t.sense[axis] = sense;
    t.magnitude_class[axis] = axis;
    for (int k = 0; k < axis; ++k)
      if (letters[k] == letter) {
        t.magnitude_class[axis] = t.magnitude_class[k];
        if ((t.sense[k] == '0') != (sense == '0'))
          bad_symbol(text, g[i].position,
                     std::string("the ") + axis_name[k] + " and " + axis_name[axis] + " axes share the letter " +
                         letter + " (equal tilt magnitude) but only one of them is untilted");
        break;
      }
    ++i;
  }
  if (i != end)
    bad_symbol(text, g[i].position, "unexpected '" + encode(g[i].code) + "' after the three axis tilts");
  for (int axis = 0; axis < 3; ++axis) {
    t.glazer += letters[axis];
    t.glazer += t.sense[axis];
  }
  return t;
}

TiltedPerovskite build_tilted_perovskite(const TiltSystem& tilts) {
  check_tilt_system(tilts);
  // Degrees per magnitude class: distinct so that only the letters make tilts equal.
  static const double angle_deg[3] = {5, 7, 9};
  const double a0 = 3.9; // pseudocubic B-B distance in Angstrom, a typical perovskite value

  // Tilt rotation vector (radians) of the octahedron at B site n in {0,1}^3.
  // About axis k it alternates along the two perpendicular axes (corner
  // sharing) and also along k itself for an anti-phase tilt.
  auto tilt = [&](const std::array<int, 3>& n) {
    Vec v{};
    for (int k = 0; k < 3; ++k) {
      if (tilts.sense[k] == '0') continue;
      int parity = n[(k + 1) % 3] + n[(k + 2) % 3];
      if (tilts.sense[k] == '-') parity += n[k];
      v[k] = (parity % 2 ? -1 : 1) * angle_deg[tilts.magnitude_class[k]] * M_PI / 180;
    }
    return v;
  };

  // Every octahedron has the same |tilt| and the same squared direction
  // components, so a rigid one spans the same length along each axis; the
  // lattice shrinks accordingly and stays consistent with the symmetry.
  const Vec v0 = tilt({0, 0, 0});
  const Mat r0 = rotation(v0);
  Vec pitch{}; // B-B distance along each axis
  for (int k = 0; k < 3; ++k) pitch[k] = a0 * r0[k][k];

  TiltedPerovskite out;
  out.tilts = tilts;
  CrystalStructure& cell = out.cell;
  cell.where = "tilted perovskite " + tilts.glazer;
  cell.lattice = {{{2 * pitch[0], 0, 0}, {0, 2 * pitch[1], 0}, {0, 0, 2 * pitch[2]}}};
  auto add = [&](const char* species, const Vec& cart) {
    AtomSite s;
    s.species = species;
    for (int k = 0; k < 3; ++k) s.frac[k] = cart[k] / (2 * pitch[k]);
    cell.sites.push_back(s);
  };
  for (int nx = 0; nx < 2; ++nx)
    for (int ny = 0; ny < 2; ++ny)
      for (int nz = 0; nz < 2; ++nz) {
        const std::array<int, 3> n{nx, ny, nz};
        const Vec b{nx * pitch[0], ny * pitch[1], nz * pitch[2]};
        add("B", b);
        add("A", {b[0] + pitch[0] / 2, b[1] + pitch[1] / 2, b[2] + pitch[2] / 2});
        const Mat r = rotation(tilt(n));
        for (int k = 0; k < 3; ++k) {
          // The corner between this octahedron and its neighbour along +k, as
          // each of the two rigid octahedra would place it; the two agree to
          // first order in the angles, and one shared atom at their mean keeps
          // the corners shared exactly.
          std::array<int, 3> m = n;
          m[k] = (m[k] + 1) % 2;
          const Mat rm = rotation(tilt(m));
          Vec half{};
          half[k] = a0 / 2;
          const Vec from_this = rotate(r, half);
          const Vec from_next = rotate(rm, half);
          Vec o{};
          for (int j = 0; j < 3; ++j) o[j] = b[j] + 0.5 * (from_this[j] - from_next[j]);
          o[k] += pitch[k] / 2;
          add("O", o);
        }
      }

  try {
    out.symmetry = find_structure_symmetry(cell, 1e-5);
  } catch (const Error& e) {
    fail(ErrorKind::internal, "symmetry search failed for a built tilted perovskite: " + e.problem(), cell.where);
  }

  for (const PointOperation& op : out.symmetry.point_operations) {
    std::array<std::array<int, 3>, 3> m{};
    for (int i = 0; i < 3; ++i) {
      int nonzero = 0;
      for (int j = 0; j < 3; ++j) {
        const double x = op.rotation_cartesian[i][j];
        const long r = std::lround(x);
        if (std::fabs(x - static_cast<double>(r)) > 1e-9 || r < -1 || r > 1)
          fail(ErrorKind::internal,
               "a point operation is not a signed permutation in the pseudocubic frame (entry " +
                   std::to_string(x) + ")",
               cell.where, "operations of the parent m-3m");
        m[i][j] = static_cast<int>(r);
        nonzero += r != 0;
      }
      if (nonzero != 1)
        fail(ErrorKind::internal, "a point operation is not a signed permutation in the pseudocubic frame",
             cell.where, "operations of the parent m-3m");
    }
    for (int j = 0; j < 3; ++j)
      if (std::abs(m[0][j]) + std::abs(m[1][j]) + std::abs(m[2][j]) != 1)
        fail(ErrorKind::internal, "a point operation is not a signed permutation in the pseudocubic frame",
             cell.where, "operations of the parent m-3m");
    out.point_rotations_pseudocubic.push_back(m);
  }
  return out;
}

std::vector<std::string> all_glazer_tilt_systems() {
  return {"a0a0a0", "a0a0c+", "a0a0c-", "a0b+b+", "a0b-b-", "a0b+c-", "a0b-c-", "a+a+a+",
          "a+b+c+", "a-a-a-", "a-b-b-", "a-b-c-", "a+b-b-", "a+b-c-", "a+a+c-"};
}

} // namespace ts
