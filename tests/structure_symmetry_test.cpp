// Structure -> point operations through spglib, and the [structure] TOML block.
#include "core/error.hpp"
#include "lowering/structure_table.hpp"

#include <catch2/catch.hpp>
#include <spglib.h>

#include <cmath>
#include <fstream>
#include <set>
#include <sstream>

using namespace ts;

namespace {

using Mat = std::array<std::array<double, 3>, 3>;

CrystalStructure parse_text(const std::string& text, const std::string& file = "cell.toml") {
  const toml::table doc = toml::parse(text, file);
  const toml::table* block = doc["structure"].as_table();
  REQUIRE(block);
  return parse_structure(*block, file + ":[structure]");
}

// A cubic perovskite ABO3 (KTaO3 type, a = 3.989 A, from memory), B at the cube centre.
const char* const kPerovskiteSites = R"(
sites = [ { species = "K", at = [0, 0, 0] },
          { species = "Ta", at = [0.5, 0.5, 0.5] },
          { species = "O",  at = [0.5, 0.5, 0] },
          { species = "O",  at = [0.5, 0, 0.5] },
          { species = "O",  at = [0, 0.5, 0.5] } ]
)";

std::string perovskite(const std::string& lattice) { return "[structure]\n" + lattice + "\n" + kPerovskiteSites; }

Mat mul(const Mat& a, const Mat& b) {
  Mat c{};
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j)
      for (int k = 0; k < 3; ++k) c[i][j] += a[i][k] * b[k][j];
  return c;
}

Mat transpose(const Mat& a) {
  Mat t{};
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) t[i][j] = a[j][i];
  return t;
}

double max_diff(const Mat& a, const Mat& b) {
  double d = 0;
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) d = std::max(d, std::fabs(a[i][j] - b[i][j]));
  return d;
}

const Mat kIdentity{{{1, 0, 0}, {0, 1, 0}, {0, 0, 1}}};

double det(const Mat& m) {
  return m[0][0] * (m[1][1] * m[2][2] - m[1][2] * m[2][1]) - m[0][1] * (m[1][0] * m[2][2] - m[1][2] * m[2][0]) +
         m[0][2] * (m[1][0] * m[2][1] - m[1][1] * m[2][0]);
}

std::array<double, 3> transform(const Mat& m, const std::array<double, 3>& v) {
  std::array<double, 3> r{};
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) r[i] += m[i][j] * v[j];
  return r;
}

// A proper rotation: 30 degrees about z, then 20 degrees about x.
Mat some_rotation() {
  const double a = M_PI / 6, b = M_PI / 9;
  const Mat rz{{{std::cos(a), -std::sin(a), 0}, {std::sin(a), std::cos(a), 0}, {0, 0, 1}}};
  const Mat rx{{{1, 0, 0}, {0, std::cos(b), -std::sin(b)}, {0, std::sin(b), std::cos(b)}}};
  return mul(rx, rz);
}

std::string row(const std::array<double, 3>& v) {
  std::ostringstream s;
  s.precision(17);
  s << "[" << v[0] << ", " << v[1] << ", " << v[2] << "]";
  return s.str();
}

// Rounds a Cartesian matrix known to be a signed permutation.
std::array<std::array<int, 3>, 3> rounded(const Mat& m) {
  std::array<std::array<int, 3>, 3> r{};
  for (int i = 0; i < 3; ++i)
    for (int j = 0; j < 3; ++j) {
      r[i][j] = static_cast<int>(std::lround(m[i][j]));
      CHECK(std::fabs(m[i][j] - r[i][j]) < 1e-12);
    }
  return r;
}

Error parse_error(const std::string& text) {
  try {
    parse_text(text);
  } catch (const Error& e) {
    CHECK(e.kind() == ErrorKind::bad_file);
    CHECK(e.location().find("cell.toml") == 0); // file:line:col, or the section when no position is known
    CHECK_FALSE(e.valid().empty());
    return e;
  }
  FAIL("no error for:\n" << text);
  return Error(ErrorKind::internal, "unreachable");
}

} // namespace

TEST_CASE("cubic perovskite: Pm-3m with 48 point operations", "[structure][spglib]") {
  // Common practice: KTaO3 stays cubic Pm-3m (No. 221) down to low temperature (from memory), point group
  // m-3m of order 48.
  const CrystalStructure c = parse_text(perovskite("lattice = [[3.989, 0, 0], [0, 3.989, 0], [0, 0, 3.989]]"));
  CHECK_FALSE(c.magnetic);
  CHECK(c.sites.size() == 5);
  CHECK(c.symprec == 1e-5);
  const StructureSymmetry s = find_structure_symmetry(c);
  CHECK(s.space_group_number == 221);
  CHECK(s.space_group_symbol == "Pm-3m");
  CHECK(s.point_group_symbol == "m-3m");
  CHECK(s.magnetic_uni_number == 0);
  REQUIRE(s.point_operations.size() == 48);
  std::set<std::array<std::array<int, 3>, 3>> distinct;
  int proper = 0;
  for (const PointOperation& op : s.point_operations) {
    CHECK_FALSE(op.time_reversal);
    distinct.insert(rounded(op.rotation_cartesian));
    proper += det(op.rotation_cartesian) > 0;
  }
  CHECK(distinct.size() == 48);
  CHECK(proper == 24);
  CHECK(max_diff(s.point_operations[0].rotation_cartesian, kIdentity) == 0);
}

TEST_CASE("cell parameters give a along x and b in the xy plane", "[structure]") {
  const CrystalStructure c =
      parse_text(perovskite("a = 3.989\nb = 3.989\nc = 3.989\nalpha = 90\nbeta = 90\ngamma = 90"));
  const Mat cubic{{{3.989, 0, 0}, {0, 3.989, 0}, {0, 0, 3.989}}};
  CHECK(max_diff(c.lattice, cubic) == 0);
  CHECK(find_structure_symmetry(c).space_group_number == 221);

  const CrystalStructure h = parse_text(
      "[structure]\na = 2\nb = 2\nc = 5\nalpha = 90\nbeta = 90\ngamma = 120\nsites = [{species = \"X\", at = [0,0,0]}]");
  CHECK(h.lattice[1][0] == Approx(-1.0));
  CHECK(h.lattice[1][1] == Approx(std::sqrt(3.0)));
  CHECK(h.lattice[1][2] == 0);
  CHECK(h.lattice[2][2] == Approx(5.0));
}

TEST_CASE("Cartesian rotations R = M^T W M^-T on a hexagonal lattice", "[structure][spglib]") {
  // hcp magnesium, P6_3/mmc (No. 194), point group 6/mmm of order 24
  // (common practice); atoms at 2c, (1/3, 2/3, 1/4) and (2/3, 1/3, 3/4).
  const CrystalStructure c = parse_text(R"(
[structure]
a = 3.209
b = 3.209
c = 5.211
alpha = 90
beta = 90
gamma = 120
sites = [ { species = "Mg", at = [0.3333333333333333, 0.6666666666666667, 0.25] },
          { species = "Mg", at = [0.6666666666666667, 0.3333333333333333, 0.75] } ]
)");
  const StructureSymmetry s = find_structure_symmetry(c);
  CHECK(s.space_group_number == 194);
  CHECK(s.space_group_symbol == "P6_3/mmc");
  CHECK(s.point_group_symbol == "6/mmm");
  REQUIRE(s.point_operations.size() == 24);

  const double h = std::sqrt(3.0) / 2;
  const Mat six_z{{{0.5, -h, 0}, {h, 0.5, 0}, {0, 0, 1}}}; // 60 degrees counterclockwise about z
  bool found_six = false;
  for (const PointOperation& op : s.point_operations) {
    const Mat& r = op.rotation_cartesian;
    // A wrong basis change (M W M^-1, or a missing transpose) is not orthogonal here.
    CHECK(max_diff(mul(r, transpose(r)), kIdentity) < 1e-12);
    int dw = 0;
    {
      const auto& w = op.rotation_lattice;
      dw = w[0][0] * (w[1][1] * w[2][2] - w[1][2] * w[2][1]) - w[0][1] * (w[1][0] * w[2][2] - w[1][2] * w[2][0]) +
           w[0][2] * (w[1][0] * w[2][1] - w[1][1] * w[2][0]);
    }
    CHECK(det(r) == Approx(dw));
    // R maps each lattice vector onto the lattice vector that W names: R (M^T e_j) = M^T (W e_j).
    for (int j = 0; j < 3; ++j) {
      std::array<double, 3> ej{}, wj{};
      ej[j] = 1;
      for (int i = 0; i < 3; ++i) wj[i] = op.rotation_lattice[i][j];
      const auto lhs = transform(r, fractional_to_cartesian(c, ej));
      const auto rhs = fractional_to_cartesian(c, wj);
      for (int i = 0; i < 3; ++i) CHECK(lhs[i] == Approx(rhs[i]).margin(1e-12));
    }
    found_six |= max_diff(r, six_z) < 1e-12;
  }
  CHECK(found_six);
}

TEST_CASE("a rotated cell gives the point group conjugated by the rotation", "[structure][spglib]") {
  const Mat q = some_rotation();
  const double a = 3.989;
  std::string lattice = "lattice = [";
  for (int i = 0; i < 3; ++i) {
    std::array<double, 3> v{};
    for (int k = 0; k < 3; ++k) v[k] = a * q[k][i]; // row i = Q (a e_i)
    lattice += row(v) + (i < 2 ? ", " : "]");
  }
  const StructureSymmetry rotated = find_structure_symmetry(parse_text(perovskite(lattice)));
  const StructureSymmetry plain =
      find_structure_symmetry(parse_text(perovskite("lattice = [[3.989, 0, 0], [0, 3.989, 0], [0, 0, 3.989]]")));
  CHECK(rotated.space_group_number == 221);
  REQUIRE(rotated.point_operations.size() == 48);
  REQUIRE(plain.point_operations.size() == 48);
  for (const PointOperation& op : plain.point_operations) {
    const Mat expected = mul(mul(q, op.rotation_cartesian), transpose(q));
    bool found = false;
    for (const PointOperation& r : rotated.point_operations) found |= max_diff(r.rotation_cartesian, expected) < 1e-9;
    CHECK(found);
  }
}

TEST_CASE("ferromagnetic perovskite with moments along [001]: 4/mm'm'", "[structure][spglib][magnetic]") {
  // Common practice: a ferromagnet on a cubic perovskite with M along [001]
  // has magnetic point group 4/mm'm' (16 operations); the 8 primed ones are
  // exactly those that reverse an axial vector along z. Its magnetic space
  // group is P4/mm'm', BNS number 123.345 (from memory).
  const std::string text = R"(
[structure]
lattice = [[3.9, 0, 0], [0, 3.9, 0], [0, 0, 3.9]]
sites = [ { species = "K", at = [0, 0, 0] },
          { species = "Ta", at = [0.5, 0.5, 0.5], moment = [0, 0, 1.0] },
          { species = "O",  at = [0.5, 0.5, 0] },
          { species = "O",  at = [0.5, 0, 0.5] },
          { species = "O",  at = [0, 0.5, 0.5] } ]
)";
  const CrystalStructure c = parse_text(text);
  CHECK(c.magnetic);
  const StructureSymmetry s = find_structure_symmetry(c);
  REQUIRE(s.point_operations.size() == 16);
  int primed = 0;
  for (const PointOperation& op : s.point_operations) {
    const auto m = transform(op.rotation_cartesian, {0, 0, 1});
    const double mz = det(op.rotation_cartesian) * m[2]; // axial: det(R) R m
    CHECK(std::fabs(std::fabs(mz) - 1) < 1e-12);
    CHECK(op.time_reversal == (mz < 0));
    primed += op.time_reversal;
  }
  CHECK(primed == 8);
  CHECK(s.magnetic_uni_number > 0);
  const SpglibMagneticSpacegroupType t = spg_get_magnetic_spacegroup_type(s.magnetic_uni_number);
  CHECK(std::string(t.bns_number) == "123.345");
  CHECK(t.type == 3);
  CHECK(s.space_group_number == 123); // the family group P4/mmm
  CHECK(s.space_group_symbol == "P4/mmm");
  CHECK(s.point_group_symbol == "4/mmm");
}

TEST_CASE("moments are Cartesian: a rotated ferromagnet keeps its primed set", "[structure][spglib][magnetic]") {
  const Mat q = some_rotation();
  const double a = 3.9;
  CrystalStructure c;
  for (int i = 0; i < 3; ++i)
    for (int k = 0; k < 3; ++k) c.lattice[i][k] = a * q[k][i];
  const std::array<double, 3> m = transform(q, {0, 0, 1});
  c.sites = {{"K", {0, 0, 0}}, {"Ta", {0.5, 0.5, 0.5}, m}, {"O", {0.5, 0.5, 0}}, {"O", {0.5, 0, 0.5}},
             {"O", {0, 0.5, 0.5}}};
  c.magnetic = true;
  const StructureSymmetry s = find_structure_symmetry(c);
  REQUIRE(s.point_operations.size() == 16);
  for (const PointOperation& op : s.point_operations) {
    const auto r = transform(op.rotation_cartesian, m);
    const double sign = det(op.rotation_cartesian) * (r[0] * m[0] + r[1] * m[1] + r[2] * m[2]);
    CHECK(std::fabs(std::fabs(sign) - 1) < 1e-9);
    CHECK(op.time_reversal == (sign < 0));
  }
}

TEST_CASE("an antiferromagnet with an anti-translation has a grey point group", "[structure][spglib][magnetic]") {
  // Simple cubic magnetic atoms, moments +z, -z alternating along z: the
  // translation by one cubic cell combined with time reversal is a symmetry,
  // so every point part comes both plain and primed (common practice):
  // 4/mmm1', 32 operations.
  const CrystalStructure c = parse_text(R"(
[structure]
lattice = [[3, 0, 0], [0, 3, 0], [0, 0, 6]]
sites = [ { species = "Fe", at = [0, 0, 0],   moment = [0, 0, 2] },
          { species = "Fe", at = [0, 0, 0.5], moment = [0, 0, -2] } ]
)");
  const StructureSymmetry s = find_structure_symmetry(c);
  REQUIRE(s.point_operations.size() == 32);
  std::set<std::pair<std::array<std::array<int, 3>, 3>, bool>> ops;
  for (const PointOperation& op : s.point_operations) ops.insert({op.rotation_lattice, op.time_reversal});
  for (const PointOperation& op : s.point_operations) CHECK(ops.count({op.rotation_lattice, !op.time_reversal}) == 1);
  CHECK(spg_get_magnetic_spacegroup_type(s.magnetic_uni_number).type == 4);
}

TEST_CASE("symprec from the file and from the caller", "[structure][spglib]") {
  // Ta pushed 0.002 A off centre: polar P4mm (No. 99) at a tight tolerance, Pm-3m at a loose one.
  const std::string text = R"(
[structure]
lattice = [[4, 0, 0], [0, 4, 0], [0, 0, 4]]
sites = [ { species = "K", at = [0, 0, 0] },
          { species = "Ta", at = [0.5, 0.5, 0.5005] },
          { species = "O",  at = [0.5, 0.5, 0] },
          { species = "O",  at = [0.5, 0, 0.5] },
          { species = "O",  at = [0, 0.5, 0.5] } ]
)";
  const CrystalStructure tight = parse_text(text);
  CHECK(find_structure_symmetry(tight).space_group_number == 99);
  CHECK(find_structure_symmetry(tight, 0.01).space_group_number == 221);
  const CrystalStructure loose = parse_text(text + "symprec = 0.01\n");
  CHECK(loose.symprec == 0.01);
  const StructureSymmetry s = find_structure_symmetry(loose);
  CHECK(s.space_group_number == 221);
  CHECK(s.symprec == 0.01);
}

TEST_CASE("sites may also be written as an array of tables", "[structure]") {
  const CrystalStructure c = parse_text(R"(
[structure]
lattice = [[3.989, 0, 0], [0, 3.989, 0], [0, 0, 3.989]]
[[structure.sites]]
species = "K"
at = [0, 0, 0]
[[structure.sites]]
species = "Ta"
at = [0.5, 0.5, 0.5]
[[structure.sites]]
species = "O"
at = [0.5, 0.5, 0]
[[structure.sites]]
species = "O"
at = [0.5, 0, 0.5]
[[structure.sites]]
species = "O"
at = [0, 0.5, 0.5]
)");
  CHECK(find_structure_symmetry(c).space_group_number == 221);
}

TEST_CASE("the example in docs/structures.md runs", "[structure][spglib][docs]") {
  std::ifstream in(std::string(TENSORSIEVE_SOURCE_DIR) + "/docs/structures.md");
  REQUIRE(in);
  std::stringstream all;
  all << in.rdbuf();
  const std::string doc = all.str();
  const auto start = doc.find("```toml\n");
  REQUIRE(start != std::string::npos);
  const auto end = doc.find("```", start + 8);
  REQUIRE(end != std::string::npos);
  const CrystalStructure c = parse_text(doc.substr(start + 8, end - start - 8), "example.toml");
  CHECK(c.magnetic);
  const StructureSymmetry s = find_structure_symmetry(c);
  CHECK(s.point_operations.size() == 16); // the doc says 4/mm'm'
}

TEST_CASE("malformed [structure] blocks are refused with the field named", "[structure][errors]") {
  SECTION("missing lattice") {
    const Error e = parse_error("[structure]\nsites = [{ species = \"X\", at = [0, 0, 0] }]\n");
    CHECK(e.problem().find("lattice") != std::string::npos);
    CHECK(e.problem().find("missing") != std::string::npos);
  }
  SECTION("a site without at, with its line") {
    const Error f = parse_error(R"([structure]
lattice = [[4, 0, 0], [0, 4, 0], [0, 0, 4]]
sites = [ { species = "K", at = [0, 0, 0] },
          { species = "Ta" } ]
)");
    CHECK(f.problem().find("sites[2].at") != std::string::npos);
    CHECK(f.problem().find("missing") != std::string::npos);
    CHECK(f.location().find("cell.toml:4:") != std::string::npos); // file:line:col, as every file error
  }
  SECTION("a non-number, with line and column") {
    const Error e = parse_error(R"([structure]
lattice = [[4, 0, 0], [0, 4, 0], [0, 0, 4]]
sites = [ { species = "K", at = [0, "half", 0] } ]
)");
    CHECK(e.problem().find("sites[1].at[2]") != std::string::npos);
    CHECK(e.problem().find("expected a number, got a string") != std::string::npos);
    CHECK(e.location().find("cell.toml:3:37") != std::string::npos);
  }
  SECTION("lattice shape") {
    CHECK(parse_error(perovskite("lattice = [[4, 0, 0], [0, 4, 0]]")).problem().find("3 rows") != std::string::npos);
    CHECK(parse_error(perovskite("lattice = [[4, 0], [0, 4, 0], [0, 0, 4]]")).problem().find("lattice[1]") !=
          std::string::npos);
    CHECK(parse_error(perovskite("lattice = [[4, 0, 0], [8, 0, 0], [0, 0, 4]]")).problem().find("coplanar") !=
          std::string::npos);
    CHECK(parse_error(perovskite("lattice = [[4, 0, 0], [0, 4, 0], [0, 0, inf]]")).problem().find("finite") !=
          std::string::npos);
    CHECK(parse_error(perovskite("lattice = \"cubic\"")).problem().find("got a string") != std::string::npos);
  }
  SECTION("cell parameters") {
    CHECK(parse_error(perovskite("a = 4\nb = 4\nc = 4\nalpha = 90\nbeta = 90")).problem().find("gamma") !=
          std::string::npos);
    CHECK(parse_error(perovskite("a = -4\nb = 4\nc = 4\nalpha = 90\nbeta = 90\ngamma = 90"))
              .problem()
              .find("positive") != std::string::npos);
    CHECK(parse_error(perovskite("a = 4\nb = 4\nc = 4\nalpha = 200\nbeta = 90\ngamma = 90"))
              .problem()
              .find("alpha") != std::string::npos);
    CHECK(parse_error(perovskite("a = 4\nb = 4\nc = 4\nalpha = 170\nbeta = 10\ngamma = 10"))
              .problem()
              .find("do not form a cell") != std::string::npos);
    CHECK(parse_error(perovskite("lattice = [[4, 0, 0], [0, 4, 0], [0, 0, 4]]\na = 4"))
              .problem()
              .find("together") != std::string::npos);
  }
  SECTION("sites") {
    const std::string lat = "[structure]\nlattice = [[4, 0, 0], [0, 4, 0], [0, 0, 4]]\n";
    CHECK(parse_error(lat).problem().find("sites") != std::string::npos);
    CHECK(parse_error(lat + "sites = []").problem().find("empty") != std::string::npos);
    CHECK(parse_error(lat + "sites = [1]").problem().find("sites[1]") != std::string::npos);
    CHECK(parse_error(lat + "sites = [{ at = [0, 0, 0] }]").problem().find("sites[1].species") != std::string::npos);
    CHECK(parse_error(lat + "sites = [{ species = 3, at = [0, 0, 0] }]").problem().find("expected a string") !=
          std::string::npos);
    CHECK(parse_error(lat + "sites = [{ species = \"X\", at = [0, 0, 0], moment = [0, 1] }]")
              .problem()
              .find("sites[1].moment") != std::string::npos);
    CHECK(parse_error(lat + "sites = [{ species = \"X\", at = [0, 0, 0], spin = [0, 0, 1] }]")
              .problem()
              .find("unknown key 'spin' in sites[1]") != std::string::npos);
    const Error twice =
        parse_error(lat + "sites = [{ species = \"X\", at = [0, 0, 0] }, { species = \"Y\", at = [1, 0, 1] }]");
    CHECK(twice.problem().find("sites[2].at") != std::string::npos);
    CHECK(twice.problem().find("sites[1]") != std::string::npos);
  }
  SECTION("symprec and unknown fields") {
    const std::string base = perovskite("lattice = [[4, 0, 0], [0, 4, 0], [0, 0, 4]]");
    CHECK(parse_error(base + "symprec = -1").problem().find("symprec") != std::string::npos);
    CHECK(parse_error(base + "symprec = \"tight\"").problem().find("symprec") != std::string::npos);
    const Error e = parse_error(base + "latice = 4");
    CHECK(e.problem().find("latice") != std::string::npos);
    CHECK(e.problem().find("unknown") != std::string::npos);
  }
}

TEST_CASE("spglib failures come back as ts::Error naming the structure", "[structure][spglib][errors]") {
  CrystalStructure c;
  c.lattice = {{{4, 0, 0}, {0, 4, 0}, {0, 0, 4}}};
  // 4e-6 A apart: within symprec and within the tenth and hundredth of it that
  // the search tries next.
  c.sites = {{"X", {0, 0, 0}}, {"X", {0.000001, 0, 0}}};
  c.where = "crowded.toml:[structure]";
  try {
    find_structure_symmetry(c, 0.01);
    FAIL("no error");
  } catch (const Error& e) {
    CHECK(e.kind() == ErrorKind::bad_file);
    CHECK(e.location() == "crowded.toml:[structure]");
    CHECK(e.problem().find("spglib") != std::string::npos);
    CHECK(e.problem().find("tried at symprec 0.01, 0.001, 0.0001 Angstrom") != std::string::npos);
  }
  CHECK_THROWS_AS(find_structure_symmetry(c, -1), Error);
  CrystalStructure empty;
  empty.lattice = c.lattice;
  CHECK_THROWS_AS(find_structure_symmetry(empty), Error);
}

namespace {

// An n x n x n supercell of the cubic perovskite above, listed atom by atom.
std::string perovskite_supercell(int n, double a, const std::string& extra_site = "") {
  std::ostringstream s;
  s.precision(17);
  s << "[structure]\nlattice = [[" << n * a << ", 0, 0], [0, " << n * a << ", 0], [0, 0, " << n * a << "]]\nsites = [\n";
  const std::array<std::pair<const char*, std::array<double, 3>>, 5> basis{
      {{"K", {0, 0, 0}}, {"Ta", {0.5, 0.5, 0.5}}, {"O", {0.5, 0.5, 0}}, {"O", {0.5, 0, 0.5}}, {"O", {0, 0.5, 0.5}}}};
  for (int i = 0; i < n; ++i)
    for (int j = 0; j < n; ++j)
      for (int k = 0; k < n; ++k)
        for (const auto& [species, f] : basis)
          s << "  { species = \"" << species << "\", at = [" << (i + f[0]) / n << ", " << (j + f[1]) / n << ", "
            << (k + f[2]) / n << "] },\n";
  s << extra_site << "]\n";
  return s.str();
}

} // namespace

TEST_CASE("a supercell of many atoms keeps the point group of its cell", "[structure][spglib]") {
  // The point group of a crystal does not depend on the cell chosen to describe it (common practice):
  // a 6 x 6 x 6 supercell (1080 atoms, neighbours 1.99 A apart) is still m-3m.
  const CrystalStructure c = parse_text(perovskite_supercell(6, 3.989));
  CHECK(c.sites.size() == 1080);
  const StructureSymmetry s = find_structure_symmetry(c);
  CHECK(s.point_group_symbol == "m-3m");
  CHECK(s.point_operations.size() == 48);
}

TEST_CASE("two atoms on one spot are found across the cell boundary in a large cell", "[structure][errors]") {
  // sites[1] is at the origin; an atom at x = 1 - 1e-9 of a 23.9 A cell lies 2e-8 A from it.
  const Error e = parse_error(perovskite_supercell(6, 3.989, "  { species = \"K\", at = [0.999999999, 0, 0] },\n"));
  CHECK(e.problem().find("sites[1081].at") != std::string::npos);
  CHECK(e.problem().find("same point as sites[1]") != std::string::npos);
}
