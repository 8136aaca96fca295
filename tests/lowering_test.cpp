// Symmetry lowering by cut, distortion, order and field (Curie principle),
// and orientation domains, against facts of the trade and published tables.
#include "group/identify.hpp"
#include "lowering/curie.hpp"
#include "geometry/sample_frame.hpp"
#include "lowering/domains.hpp"
#include "tensor/allowed_form.hpp"

#include <catch2/catch.hpp>

using namespace ts;

namespace {

const GroupCatalogue& cat() { return GroupCatalogue::builtin(); }

Vec3 v(long a, long b, long c) { return {QSqrt3(a), QSqrt3(b), QSqrt3(c)}; }

PointGroup interface_group(const std::string& parent, const std::string& cut) {
  const NamedGroup& g = cat().get(parent);
  CutNormal n = parse_cut(cut, g.crystal->system, g.group.lattice(), {}, "test");
  return stabiliser(g.group, {QuantityKind::polar_even, n.normal, Mat3::identity()});
}

int mirror_count(const PointGroup& g) {
  int n = 0;
  for (const auto& op : g.operations()) {
    OperationKind k = op.kind();
    if (!k.proper && k.order == 2 && !op.primed) ++n;
  }
  return n;
}

std::string type_of(const PointGroup& g) { return identify(g, cat()).type->symbol; }

} // namespace

TEST_CASE("cubic m-3m cut along (001), (110), (111) gives 4mm, mm2, 3m", "[lowering][cut]") {
  // International Tables Vol. A (site symmetries of the cube faces, edges and corners);
  // common practice.
  CHECK(type_of(interface_group("m-3m", "(001)")) == "4mm");
  CHECK(type_of(interface_group("m-3m", "(110)")) == "mm2");
  PointGroup g111 = interface_group("m-3m", "(111)");
  CHECK(type_of(g111) == "3m");
  CHECK(mirror_count(g111) == 3); // the (1-10), (01-1), (-101) mirror lines
  // Sample frames of the trade: (110) with x ∥ [001]: 2 ∥ z, mirrors ⊥ x and ⊥ y -> written mm2.
  PointGroup g110 = interface_group("m-3m", "(110)");
  std::array<Vec3, 3> frame110{v(0, 0, 1), v(1, -1, 0), v(1, 1, 0)};
  CHECK(frame_carries(frame110, g110, cat().get("mm2").group));
  // (111) with x ∥ [1-10], y ∥ [11-2]: mirror ⊥ x, the 3m1 setting (common practice).
  std::array<Vec3, 3> frame111{v(1, -1, 0), v(1, 1, -2), v(1, 1, 1)};
  CHECK(frame_carries(frame111, g111, cat().get("3m").group));
  CHECK_FALSE(frame_carries(frame111, g111, cat().get("31m").group));
}

TEST_CASE("a tetragonal distortion along one cubic axis leaves one mirror line on (111)", "[lowering][strain]") {
  // A tetragonal crystal with c ∥ [100]: (111) -> m; common practice.
  PointGroup g = interface_group("m-3m", "(111)");
  PointGroup h = stabiliser(g, {QuantityKind::strain, {}, uniaxial_strain(v(1, 0, 0))});
  CHECK(type_of(h) == "m");
  CHECK(mirror_count(h) == 1);
  // Polar displacement ∥ [1-10] on (110) leaves only the mirror (001) (same table, row P ∥ [1-10]).
  PointGroup p = stabiliser(interface_group("m-3m", "(110)"), {QuantityKind::polar_even, v(1, -1, 0), Mat3::identity()});
  CHECK(type_of(p) == "m");
}

TEST_CASE("a moment or field lowers a grey group to the magnetic groups of the tables", "[lowering][magnetic]") {
  // Birss, Symmetry and Magnetism (1964).
  PointGroup grey = cat().get("4mm1'").group;
  PointGroup mz = stabiliser(grey, {QuantityKind::axial_odd, v(0, 0, 1), Mat3::identity()});
  CHECK(identify(mz, cat()).same_setting->symbol == "4m'm'");
  PointGroup mx = stabiliser(grey, {QuantityKind::axial_odd, v(1, 0, 0), Mat3::identity()});
  CHECK(identify(mx, cat()).same_setting->symbol == "mm'2'"); // {1, m_x, m'_y, 2'_z}
  CHECK(mx.contains(parse_operation("m [100]", LatticeKind::orthogonal)));
  CHECK(mx.contains(parse_operation("m' [010]", LatticeKind::orthogonal)));
  CHECK(mx.contains(parse_operation("2' [001]", LatticeKind::orthogonal)));
  // The Hall vector along z (sigma_xy) needs a ferromagnetic group: allowed for B ∥ z, not for in-plane B.
  TensorSpec hall = parse_tensor_spec("h_a: axial, time-odd");
  AllowedForm fz = allowed_form(hall, mz), fx = allowed_form(hall, mx);
  CHECK_FALSE(fz.is_zero(2));
  CHECK(fx.is_zero(2));
}

TEST_CASE("3m1' with an in-plane field: in a mirror plane gives m', normal to it gives m", "[lowering][magnetic]") {
  // Birss's method; Battilomo et al., Phys. Rev. Research 3, L012006 (2021).
  PointGroup grey = cat().get("3m1'").group; // mirror normal ∥ x
  PointGroup in_plane = stabiliser(grey, {QuantityKind::axial_odd, v(0, 1, 0), Mat3::identity()}); // B ∥ y lies in the mirror
  PointGroup normal = stabiliser(grey, {QuantityKind::axial_odd, v(1, 0, 0), Mat3::identity()});   // B ⊥ mirror
  CHECK(type_of(in_plane) == "m'");
  CHECK(type_of(normal) == "m");
  TensorSpec hall = parse_tensor_spec("h_a: axial, time-odd");
  CHECK_FALSE(allowed_form(hall, in_plane).is_zero(2)); // n·h = sigma_xy allowed
  CHECK(allowed_form(hall, normal).is_zero(2));
}

TEST_CASE("plane normals come from the reciprocal metric", "[lowering][cut]") {
  // (hkl) normal ∝ h a* + k b* + l c* (common practice): in a tetragonal crystal (101) is not ∥ [101].
  LatticeMetric m;
  m.a = Rational(4);
  m.c = Rational(8);
  CutNormal n = parse_cut("(101)", "tetragonal", LatticeKind::orthogonal, m, "test");
  CHECK(parallel(n.normal, v(2, 0, 1))); // (1/a, 0, 1/c) ∝ (2, 0, 1)
  REQUIRE_THROWS_AS(parse_cut("(101)", "tetragonal", LatticeKind::orthogonal, {}, "test"), Error);
  try {
    parse_cut("(101)", "tetragonal", LatticeKind::orthogonal, {}, "scenario.toml: cut");
  } catch (const Error& e) {
    CHECK(e.kind() == ErrorKind::bad_geometry);
    CHECK(std::string(e.what()).find("lattice parameters") != std::string::npos);
  }
  // Miller-Bravais (11-20) of a hexagonal crystal is normal to a2 - ... i.e. along [110] (common practice).
  CutNormal h = parse_cut("(11-20)", "hexagonal", LatticeKind::hexagonal, {}, "test");
  CHECK(parallel(h.normal, lattice_to_cartesian(v(1, 1, 0), LatticeKind::hexagonal)));
  CHECK_THROWS_AS(parse_cut("(11-10)", "hexagonal", LatticeKind::hexagonal, {}, "test"), Error); // i != -(h+k)
  CHECK_THROWS_AS(parse_cut("(11-20)", "cubic", LatticeKind::orthogonal, {}, "test"), Error);
}

TEST_CASE("domain averages keep only what the parent allows", "[lowering][domains]") {
  // Janovec & Přívratská, International Tables Vol. D ch. 3.4; common practice.
  PointGroup parent = cat().get("m-3m").group;
  PointGroup polar = stabiliser(parent, {QuantityKind::polar_even, v(0, 0, 1), Mat3::identity()}); // 4mm
  REQUIRE(type_of(polar) == "4mm");
  Frame crystal;
  AllowedForm p = allowed_form(parse_tensor_spec("V"), polar, crystal);
  REQUIRE(p.independent() == 1);
  DomainAnalysis d = domain_variants(parent, polar, p, crystal);
  CHECK(d.variants.size() == 6); // ±x, ±y, ±z
  for (int c = 0; c < 3; ++c) CHECK(d.average.is_zero(c));
  // A tetragonal domain of the elastic tensor averages to a cubic-invariant form.
  PointGroup tet = stabiliser(parent, {QuantityKind::strain, {}, uniaxial_strain(v(0, 0, 1))}); // 4/mmm
  TensorSpec elastic = parse_tensor_spec("[[V2]2]");
  AllowedForm e = allowed_form(elastic, tet, crystal);
  REQUIRE(e.independent() == 6);
  DomainAnalysis de = domain_variants(parent, tet, e, crystal);
  CHECK(de.variants.size() == 3);
  auto comp = [](int i, int j, int k, int l) { return ((i * 3 + j) * 3 + k) * 3 + l; };
  const auto& avg = de.average.components;
  // cubic: c11 = c22 = c33, c12 = c13 = c23, c44 = c55 = c66
  CHECK(avg[comp(0, 0, 0, 0)].size() == 2); // (2 c11 + c33)/3 in the tetragonal parameters
  auto same = [](const Combination& a, const Combination& b) {
    if (a.size() != b.size()) return false;
    for (std::size_t i = 0; i < a.size(); ++i)
      if (a[i].parameter != b[i].parameter || a[i].coefficient != b[i].coefficient) return false;
    return true;
  };
  CHECK(same(avg[comp(0, 0, 0, 0)], avg[comp(2, 2, 2, 2)]));
  CHECK(same(avg[comp(0, 0, 1, 1)], avg[comp(1, 1, 2, 2)]));
  CHECK(same(avg[comp(1, 2, 1, 2)], avg[comp(0, 1, 0, 1)]));
}

TEST_CASE("one mirror line allows an in-plane Berry-curvature dipole perpendicular to it", "[lowering][bcd]") {
  // Sodemann & Fu, PRL 115, 216806 (2015): in 2D, D = 0 with more than one mirror line; with one mirror
  // line the in-plane dipole D_a = D_az is perpendicular to it.
  TensorSpec dipole = parse_tensor_spec("D_ab: axial, time-even");
  auto in_plane = [&](const PointGroup& g) {
    AllowedForm f = allowed_form(dipole, g);
    return std::make_pair(!f.is_zero(0 * 3 + 2), !f.is_zero(1 * 3 + 2)); // D_xz, D_yz
  };
  PointGroup c3v = cat().get("3m").group, c4v = cat().get("4mm").group, c2v = cat().get("mm2").group;
  for (const auto& g : {c3v, c4v, c2v}) CHECK(in_plane(g) == std::make_pair(false, false));
  // One mirror line, normal ∥ x (the group m with mirror ⊥ x, 2D: the "m11" setting).
  PointGroup mx = cat().get("m11").group;
  CHECK(in_plane(mx) == std::make_pair(true, false)); // D ∥ x, perpendicular to the mirror line (the y axis)
}
