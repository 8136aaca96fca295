// Magnetic point groups: which equilibrium and transport tensors the 122 types allow.
// References:
//   R. R. Birss, Symmetry and Magnetism, North-Holland 1964 (tables of magnetic
//     classes admitting a spontaneous moment, magnetoelectric and piezomagnetic
//     effects; counts from memory).
//   H. Schmid, "Some symmetry aspects of ferroics and single phase multiferroics",
//     J. Phys.: Condens. Matter 20, 434201 (2008) (31 ferromagnetic, 31 ferroelectric,
//     58 magnetoelectric types; title and counts from memory).
//   I. E. Dzyaloshinskii, "On the magneto-electrical effect in antiferromagnets", Sov.
//     Phys. JETP 10, 628 (1960): Cr2O3, magnetic class -3'm', alpha = diag(a_perp,
//     a_perp, a_par) (title and form from memory).
//   W. H. Kleiner, "Space-time symmetry of transport coefficients", Phys. Rev. 142, 318
//     (1966): Onsager reciprocity as a group statement.
//   F. Seitz, "Note on the theory of resistance of a cubic semiconductor in a magnetic
//     field", Phys. Rev. 79, 372 (1950): cubic magnetoresistance to second order in B has
//     one Hall constant and three even constants (from memory).
#include "group/group_catalogue.hpp"
#include "tensor/allowed_form.hpp"
#include "tensor/tensor_spec.hpp"

#include <catch2/catch.hpp>

#include <map>
#include <set>
#include <string>
#include <vector>

using namespace ts;

namespace {

const GroupCatalogue& cat() { return GroupCatalogue::builtin(); }
const PointGroup& group(const std::string& s) { return cat().get(s).group; }
int count(const std::string& spec, const PointGroup& g) { return independent_count(parse_tensor_spec(spec), g); }

int code_of(const std::string& idx) {
  int c = 0;
  for (char ch : idx) c = c * 3 + (ch - 'x');
  return c;
}

std::map<int, Surd> expr(const AllowedForm& f, const std::string& idx, int sign = 1) {
  std::map<int, Surd> e;
  for (const auto& t : f.value(code_of(idx)))
    e[t.parameter] = e[t.parameter] + (sign > 0 ? t.coefficient : -t.coefficient);
  return e;
}

std::set<std::string> nonzero_set(const AllowedForm& f) {
  std::set<std::string> s;
  for (int code = 0; code < f.symmetry->full_size(); ++code)
    if (!f.is_zero(code)) s.insert(index_string(code, f.spec.rank));
  return s;
}

// Types (standard representatives) for which the tensor has a nonzero allowed form.
std::set<int> allowing_types(const std::string& spec) {
  std::set<int> s;
  TensorSpec t = parse_tensor_spec(spec);
  for (const auto* g : cat().types())
    if (independent_count(t, g->group) > 0) s.insert(g->type_index);
  return s;
}

std::set<int> type_indices(const std::vector<const char*>& symbols) {
  std::set<int> s;
  for (const char* sym : symbols) s.insert(cat().get(sym).type_index);
  return s;
}

std::vector<const NamedGroup*> grey_types() {
  std::vector<const NamedGroup*> g;
  for (const auto* t : cat().types())
    if (t->kind == MagneticKind::grey) g.push_back(t);
  return g;
}

// The colourless group with the same operations, primes dropped (G for G1').
const PointGroup& family_of(const NamedGroup& g) { return cat().get(g.family).group; }

// Birss 1964; Schmid 2008 (from memory): the 31 types admitting a spontaneous magnetisation.
const std::vector<const char*> kFerromagnetic = {
    "1",    "-1",    "2",     "2'",     "m",     "m'",     "2/m",     "2'/m'", "2'2'2", "m'm2'", "m'm'2",
    "m'm'm", "4",    "-4",    "4/m",    "42'2'", "4m'm'",  "-42'm'",  "4/mm'm'", "3",   "-3",    "32'",
    "3m'",  "-3m'",  "6",     "-6",     "6/m",   "62'2'",  "6m'm'",   "-6m'2'", "6/mm'm'",
};

// Nye 1957 ch. IV (from memory): the ten polar crystal classes.
const std::set<std::string> kPolarClasses = {"1", "2", "m", "mm2", "4", "4mm", "3", "3m", "6", "6mm"};

} // namespace

TEST_CASE("the catalogue has the 122 magnetic point-group types: 32 + 32 + 58", "[magnetic]") {
  // Birss 1964.
  int colourless = 0, grey = 0, bw = 0;
  for (const auto* t : cat().types()) {
    colourless += t->kind == MagneticKind::colourless;
    grey += t->kind == MagneticKind::grey;
    bw += t->kind == MagneticKind::black_white;
  }
  CHECK(cat().types().size() == 122);
  CHECK(colourless == 32);
  CHECK(grey == 32);
  CHECK(bw == 58);
}

TEST_CASE("spontaneous magnetisation (aeV): exactly Birss' 31 ferromagnetic types", "[magnetic][ferromagnet]") {
  REQUIRE(kFerromagnetic.size() == 31);
  std::set<int> expected = type_indices(kFerromagnetic);
  REQUIRE(expected.size() == 31);
  CHECK(allowing_types("aeV") == expected);
  // The moment's direction: along the unique axis, or where the primes put it.
  const TensorSpec m = parse_tensor_spec("aeV");
  CHECK(nonzero_set(allowed_form(m, group("4m'm'"))) == std::set<std::string>{"z"});
  CHECK(nonzero_set(allowed_form(m, group("m'm'2"))) == std::set<std::string>{"z"});
  // m'm2' and mm'2' are one type but put M along different lab axes.
  CHECK(cat().get("m'm2'").type_index == cat().get("mm'2'").type_index);
  CHECK(nonzero_set(allowed_form(m, group("m'm2'"))) == std::set<std::string>{"y"});
  CHECK(nonzero_set(allowed_form(m, group("mm'2'"))) == std::set<std::string>{"x"});
  // In a plain mirror the moment is normal to it; in a primed mirror it lies in it.
  CHECK(nonzero_set(allowed_form(m, group("m"))) == std::set<std::string>{"y"});
  CHECK(nonzero_set(allowed_form(m, group("m'"))) == std::set<std::string>{"x", "z"});
}

TEST_CASE("spontaneous polarisation (V): 31 types, those of the 10 polar families", "[magnetic][ferroelectric]") {
  // Schmid 2008 (from memory): 31 ferroelectric magnetic types; an i-type polar vector
  // ignores primes, so these are the types whose family is one of Nye's 10 polar classes.
  std::set<int> expected;
  for (const auto* t : cat().types())
    if (kPolarClasses.count(t->family)) expected.insert(t->type_index);
  CHECK(expected.size() == 31);
  CHECK(allowing_types("V") == expected);
}

TEST_CASE("linear magnetoelectric tensor (aeV2): 58 types", "[magnetic][magnetoelectric]") {
  // Birss 1964; Schmid 2008 (from memory): 58 magnetoelectric types.
  std::set<int> me = allowing_types("aeV2");
  CHECK(me.size() == 58);
  // Necessary conditions: no 1' and no unprimed inversion.
  const Operation inversion{Mat3::identity().scaled(QSqrt3(-1)), false};
  for (const auto* t : cat().types())
    if (t->group.is_grey() || t->group.contains(inversion)) CHECK_FALSE(me.count(t->type_index));
  // Cr2O3, -3'm' (Dzyaloshinskii 1960): alpha = diag(a, a, b), unprimed 2 ∥ x.
  AllowedForm cr = allowed_form(parse_tensor_spec("alpha_ij: axial, time-odd"), group("-3'm'"));
  CHECK(cr.independent() == 2);
  CHECK(nonzero_set(cr) == std::set<std::string>{"xx", "yy", "zz"});
  CHECK(expr(cr, "yy") == expr(cr, "xx"));
  CHECK(expr(cr, "zz") != expr(cr, "xx"));
  // -3'm (primed 2-fold axes): only the antisymmetric (toroidal) part, alpha_xy = -alpha_yx.
  AllowedForm tor = allowed_form(parse_tensor_spec("alpha_ij: axial, time-odd"), group("-3'm"));
  CHECK(tor.independent() == 1);
  CHECK(nonzero_set(tor) == std::set<std::string>{"xy", "yx"});
  CHECK(expr(tor, "yx") == expr(tor, "xy", -1));
}

TEST_CASE("piezomagnetism (ae[V2]V): 66 types, independent of the index order", "[magnetic][piezomagnetic]") {
  // The tensor is written ae[V2]V (symmetric stress pair first); Birss 1964
  // (from memory) counts 66 piezomagnetic types. Putting the pair last must not matter.
  std::set<int> pm = allowing_types("ae[V2]V");
  CHECK(pm.size() == 66);
  for (const auto* t : cat().types()) {
    INFO(t->symbol);
    CHECK(count("ae[V2]V", t->group) == count("aeV[V2]", t->group));
  }
  for (const auto* t : grey_types()) CHECK_FALSE(pm.count(t->type_index));
}

TEST_CASE("every c-type tensor vanishes in every grey group; i-type ones ignore 1'", "[magnetic][grey]") {
  // Birss 1964: time reversal itself flips every c-type tensor.
  const char* c_type[] = {"aeV", "aV", "aeV2", "aV2", "a[V2]", "ae[V2]", "a{V2}", "aV[V2]", "ae[V2]V",
                          "a[[V2]2]", "aV3", "a[V2][V2]", "aeV[V3]", "phi_abc: time-odd, antisym(ab)"};
  const char* i_type[] = {"V", "eV", "[V2]", "V[V2]", "eV[V2]", "[[V2]2]", "[V2][V2]"};
  const auto grey = grey_types();
  REQUIRE(grey.size() == 32);
  for (const auto* g : grey) {
    INFO(g->symbol);
    for (const char* s : c_type) CHECK(count(s, g->group) == 0);
    for (const char* s : i_type) CHECK(count(s, g->group) == count(s, family_of(*g)));
  }
}

TEST_CASE("Onsager-Kleiner: transport tensors in grey groups", "[magnetic][onsager]") {
  const std::string xyz = "xyz";
  for (const auto* g : grey_types()) {
    INFO(g->symbol);
    const PointGroup& host = family_of(*g);
    // sigma_ab(B=0): symmetric, with the form of a symmetric polar tensor of the family.
    AllowedForm s = allowed_form(parse_tensor_spec("sigma_ab: onsager(a,b)"), g->group);
    CHECK(s.independent() == count("[V2]", host));
    for (char a : xyz)
      for (char b : xyz) CHECK(expr(s, {a, b}) == expr(s, {b, a}));
    // Coefficient of the term linear in B: antisymmetric in ab (a pure Hall term).
    AllowedForm h = allowed_form(parse_tensor_spec("sigma_abk: axial, time-odd, onsager(a,b)"), g->group);
    CHECK(h.independent() == count("t_abk: axial, antisym(ab)", host));
    for (char a : xyz)
      for (char b : xyz)
        for (char k : xyz) CHECK(expr(h, {a, b, k}) == expr(h, {b, a, k}, -1));
    // Quadratic in B: symmetric in ab (magnetoresistance, planar Hall).
    AllowedForm q = allowed_form(parse_tensor_spec("sigma_abkl: onsager(a,b), sym(kl)"), g->group);
    CHECK(q.independent() == count("[V2][V2]", host));
    for (char a : xyz)
      for (char b : xyz)
        for (char k : xyz)
          for (char l : xyz) CHECK(expr(q, {a, b, k, l}) == expr(q, {b, a, k, l}));
  }
}

TEST_CASE("Seitz: cubic magnetoresistance to second order in B", "[magnetic][onsager][seitz]") {
  // Seitz 1950: rho/rho0 = δ_ij + α ε_ijk B_k + β B² δ_ij + γ B_i B_j + δ δ_ij B_i² (no sum):
  // one linear (Hall) constant, three quadratic ones, for a nonmagnetic cubic crystal.
  for (const char* c : {"m-3m1'", "4321'", "-43m1'"}) {
    INFO(c);
    AllowedForm lin = allowed_form(parse_tensor_spec("rho_abk: axial, time-odd, onsager(a,b)"), group(c));
    CHECK(lin.independent() == 1);
    CHECK(nonzero_set(lin) == std::set<std::string>{"xyz", "yzx", "zxy", "yxz", "zyx", "xzy"});
    CHECK(expr(lin, "yzx") == expr(lin, "xyz"));
    CHECK(expr(lin, "zxy") == expr(lin, "xyz"));
    CHECK(expr(lin, "yxz") == expr(lin, "xyz", -1));
    CHECK(count("rho_abkl: onsager(a,b), sym(kl)", group(c)) == 3);
  }
}

TEST_CASE("anomalous Hall: 4m'm' allows sigma_xy = -sigma_yx, 4mm1' does not", "[magnetic][onsager][hall]") {
  const TensorSpec sigma = parse_tensor_spec("sigma_ab: onsager(a,b)");
  AllowedForm fm = allowed_form(sigma, group("4m'm'"));
  CHECK_FALSE(fm.is_zero(code_of("xy")));
  CHECK(expr(fm, "yx") == expr(fm, "xy", -1));
  CHECK(expr(fm, "yy") == expr(fm, "xx"));
  CHECK(fm.is_zero(code_of("xz")));
  CHECK(fm.independent() == 3);
  AllowedForm para = allowed_form(sigma, group("4mm1'"));
  CHECK(para.is_zero(code_of("xy")));
  CHECK(para.is_zero(code_of("yx")));
  CHECK(para.independent() == 2);
  // The symmetric part is an i-type [V2] of the magnetic group, the antisymmetric part
  // a c-type axial vector: a Hall term exists exactly where a
  // moment may, in every one of the 122 types, and the counts add up.
  for (const auto* t : cat().types()) {
    INFO(t->symbol);
    AllowedForm f = allowed_form(sigma, t->group);
    bool hall = false;
    for (const char* ab : {"xy", "yz", "xz"}) hall = hall || expr(f, ab) != expr(f, std::string{ab[1], ab[0]});
    CHECK(hall == (count("aeV", t->group) > 0));
    CHECK(f.independent() == count("[V2]", t->group) + count("aeV", t->group));
  }
}
