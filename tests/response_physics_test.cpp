// Physics through the response catalogue: the tensors the catalogue names for
// each effect, projected in the crystallographic and magnetic point groups,
// against published rules and tables. Each check names its outside source and
// its status tag (docs/responses.md): [checked], [title
// checked], [from memory], or [common practice]. Checks that rest only on the
// project's own derivations say so ([computed], derived here).
#include "group/group_catalogue.hpp"
#include "response/response_catalogue.hpp"

#include <catch2/catch.hpp>

#include <array>
#include <iterator>
#include <map>
#include <set>
#include <stdexcept>

using namespace ts;

namespace {

const GroupCatalogue& groups() { return GroupCatalogue::builtin(); }
const ResponseCatalogue& responses() { return ResponseCatalogue::builtin(); }

// The part of a response whose spec is written exactly so in the catalogue.
const ResponsePart& part(const std::string& id, const std::string& spec_text) {
  const Response& r = responses().get(id);
  for (const auto& p : r.parts)
    if (p.spec_text == spec_text) return p;
  FAIL("response " << id << " has no part with spec '" << spec_text << "'");
  throw std::logic_error("unreachable");
}

std::vector<const NamedGroup*> grey_types() {
  std::vector<const NamedGroup*> out;
  for (const auto* g : groups().types())
    if (g->kind == MagneticKind::grey) out.push_back(g);
  return out;
}

// Symbols of the groups in the list where the part is allowed.
std::set<std::string> allowed_in(const ResponsePart& p, const std::vector<const NamedGroup*>& list) {
  std::set<std::string> out;
  for (const auto* g : list)
    if (independent_count(p, g->group) > 0) out.insert(g->symbol);
  return out;
}

std::set<std::string> all_symbols(const std::vector<const NamedGroup*>& list) {
  std::set<std::string> out;
  for (const auto* g : list) out.insert(g->symbol);
  return out;
}

std::set<std::string> minus(std::set<std::string> a, const std::set<std::string>& b) {
  for (const auto& s : b) a.erase(s);
  return a;
}

// Exact sum of two component values, parameter by parameter.
std::map<int, Surd> sum(const std::vector<LinearTerm>& a, const std::vector<LinearTerm>& b) {
  std::map<int, Surd> m;
  for (const auto& t : a) m[t.parameter] += t.coefficient;
  for (const auto& t : b) m[t.parameter] += t.coefficient;
  for (auto it = m.begin(); it != m.end();) it = it->second.is_zero() ? m.erase(it) : std::next(it);
  return m;
}

bool equal(const std::vector<LinearTerm>& a, const std::vector<LinearTerm>& b) {
  std::vector<LinearTerm> nb;
  for (const auto& t : b) nb.push_back({t.parameter, -t.coefficient});
  return sum(a, nb).empty();
}

int code(const std::string& idx) {
  int c = 0;
  for (char ch : idx) c = c * 3 + (ch - 'x');
  return c;
}

// The 11 centrosymmetric (Laue) classes [common practice].
const std::set<std::string> kCentrosymmetric{"-1", "2/m", "mmm", "4/m", "4/mmm", "-3", "-3m", "6/m", "6/mmm", "m-3", "m-3m"};

} // namespace

TEST_CASE("Onsager-Kleiner: in every grey group the linear-in-B conductivity is antisymmetric, the quadratic symmetric",
          "[responses][physics]") {
  // Onsager, Phys. Rev. 37, 405 and 38, 2265 (1931); Kleiner, Phys. Rev. 142, 318 (1966) [from memory]:
  // sigma_ab(B) = sigma_ba(-B), so with time reversal in the group the odd orders are antisymmetric in ab.
  const ResponsePart& lin = part("magnetoconductivity-linear", "sigma_abk: axial, time-odd, onsager(a,b)");
  const ResponsePart& quad = part("magnetoconductivity-quadratic", "sigma_abkl: polar, time-even, sym(kl), onsager(a,b)");
  const ResponsePart& zero = part("conductivity", "sigma_ab: onsager(a,b)");
  const auto grey = grey_types();
  REQUIRE(grey.size() == 32);
  for (const auto* g : grey) {
    INFO("group " << g->symbol);
    AllowedForm f1 = allowed_form(lin.spec, g->group);
    AllowedForm f2 = allowed_form(quad.spec, g->group);
    AllowedForm f0 = allowed_form(zero.spec, g->group);
    for (int a = 0; a < 3; ++a)
      for (int b = 0; b < 3; ++b) {
        CHECK(equal(f0.value(a * 3 + b), f0.value(b * 3 + a)));
        for (int k = 0; k < 3; ++k) {
          CHECK(sum(f1.value((a * 3 + b) * 3 + k), f1.value((b * 3 + a) * 3 + k)).empty());
          for (int l = 0; l < 3; ++l)
            CHECK(equal(f2.value(((a * 3 + b) * 3 + k) * 3 + l), f2.value(((b * 3 + a) * 3 + k) * 3 + l)));
        }
      }
    // The split parts carry the same content: the full form equals Hall part plus the symmetric part.
    CHECK(independent_count(lin, g->group) ==
          independent_count(part("magnetoconductivity-linear", "sigma_abk: axial, time-even, antisym(ab)"), g->group));
    CHECK(independent_count(part("magnetoconductivity-linear", "sigma_abk: axial, time-odd, sym(ab)"), g->group) == 0);
    CHECK(independent_count(part("magnetoconductivity-quadratic", "sigma_abkl: polar, time-odd, antisym(ab), sym(kl)"),
                            g->group) == 0);
  }
  // The ordinary Hall effect of an isotropic (cubic) metal: one Hall constant, rho_xy,z = -rho_yx,z.
  AllowedForm cubic = allowed_form(lin.spec, groups().get("m-3m1'").group);
  CHECK(cubic.independent() == 1);
  CHECK_FALSE(cubic.is_zero(code("xyz")));
  CHECK(sum(cubic.value(code("xyz")), cubic.value(code("yxz"))).empty());
}

TEST_CASE("Onsager-Kleiner for every Onsager part: the full form is the symmetric plus the Hall part",
          "[responses][physics]") {
  // Seemann, Ködderitzsch, Wimmer & Ebert, PRB 92, 155138 (2015) [title checked]: the symmetric part of a linear
  // response tensor is i-type, the antisymmetric part c-type; counts must add up in all 122 types.
  const std::vector<std::array<std::string, 4>> splits{
      {"conductivity", "sigma_ab: onsager(a,b)", "sigma_ab: polar, time-even, sym(ab)", "sigma_ab: polar, time-odd, antisym(ab)"},
      {"resistivity", "rho_ab: onsager(a,b)", "rho_ab: polar, time-even, sym(ab)", "rho_ab: polar, time-odd, antisym(ab)"},
      {"thermal-conductivity", "kappa_ab: onsager(a,b)", "kappa_ab: polar, time-even, sym(ab)", "kappa_ab: polar, time-odd, antisym(ab)"},
      {"magnetoconductivity-linear", "sigma_abk: axial, time-odd, onsager(a,b)", "sigma_abk: axial, time-odd, sym(ab)",
       "sigma_abk: axial, time-even, antisym(ab)"},
      {"magnetoconductivity-quadratic", "sigma_abkl: polar, time-even, sym(kl), onsager(a,b)",
       "sigma_abkl: polar, time-even, sym(ab), sym(kl)", "sigma_abkl: polar, time-odd, antisym(ab), sym(kl)"}};
  for (const auto& s : splits)
    for (const auto* g : groups().types()) {
      INFO(s[0] << " in " << g->symbol);
      CHECK(independent_count(part(s[0], s[1]), g->group) ==
            independent_count(part(s[0], s[2]), g->group) + independent_count(part(s[0], s[3]), g->group));
    }
}

TEST_CASE("c-type parts without an Onsager exchange vanish in every grey group", "[responses][physics]") {
  // Birss, Symmetry and Magnetism (North-Holland, 1964) [from memory]: with 1' in the group, T = -T.
  const auto grey = grey_types();
  for (const auto& r : responses().responses())
    for (const auto& p : r.parts) {
      if (!p.spec.time_odd || !p.spec.onsager.empty()) continue;
      for (const auto* g : grey) {
        INFO(r.id << ": " << p.spec_text << " in " << g->symbol);
        CHECK(independent_count(p, g->group) == 0);
      }
    }
}

TEST_CASE("anomalous Hall: exactly the 31 ferromagnetic types", "[responses][physics]") {
  // Birss 1964 [from memory]. The 31 types that admit a ferromagnetic moment.
  const std::set<std::string> ferromagnetic{"1", "-1", "2", "2'", "m", "m'", "2/m", "2'/m'", "2'2'2", "m'm2'", "m'm'2",
                                            "m'm'm", "4", "-4", "4/m", "42'2'", "4m'm'", "-42'm'", "4/mm'm'", "3", "-3",
                                            "32'", "3m'", "-3m'", "6", "-6", "6/m", "62'2'", "6m'm'", "-6m'2'",
                                            "6/mm'm'"};
  REQUIRE(ferromagnetic.size() == 31);
  const auto types = groups().types();
  REQUIRE(types.size() == 122);
  const Response& ahe = responses().get("anomalous-hall");
  for (const auto& p : ahe.parts) {
    INFO(p.spec_text);
    CHECK(allowed_in(p, types) == ferromagnetic);
  }
  // The same symmetry for the spontaneous moment and the Kerr gyration vector.
  CHECK(allowed_in(part("spontaneous-magnetization", "M_i: axial, time-odd"), types) == ferromagnetic);
  CHECK(allowed_in(part("magneto-optic-kerr", "g_a: axial, time-odd"), types) == ferromagnetic);
}

TEST_CASE("anomalous Hall: 4mm1' forbids it, 4m'm' allows sigma_xy = -sigma_yx", "[responses][physics]") {
  // Nagaosa et al., RMP 82, 1539 (2010) [from memory]: a magnetisation along the fourfold axis (4m'm') gives a Hall
  // conductivity in the plane normal to it; the nonmagnetic 4mm1' has none.
  const Response& ahe = responses().get("anomalous-hall");
  for (const auto& pf : response_forms(ahe, groups().get("4mm1'").group)) CHECK_FALSE(pf.allowed());

  const auto& g = groups().get("4m'm'").group;
  AllowedForm h = allowed_form(part("anomalous-hall", "h_a: axial, time-odd").spec, g);
  CHECK(h.independent() == 1);
  CHECK(h.is_zero(code("x")));
  CHECK(h.is_zero(code("y")));
  CHECK_FALSE(h.is_zero(code("z")));
  AllowedForm s = allowed_form(part("anomalous-hall", "sigma_ab: polar, time-odd, antisym(ab)").spec, g);
  CHECK(s.independent() == 1);
  CHECK_FALSE(s.is_zero(code("xy")));
  CHECK(sum(s.value(code("xy")), s.value(code("yx"))).empty());
  CHECK(s.is_zero(code("xz")));
  CHECK(s.is_zero(code("yz")));
  // The full Onsager-Kleiner conductivity in 4m'm': sigma_xx = sigma_yy, sigma_zz, and a Hall pair.
  AllowedForm full = allowed_form(part("conductivity", "sigma_ab: onsager(a,b)").spec, g);
  CHECK(full.independent() == 3);
  CHECK(equal(full.value(code("xx")), full.value(code("yy"))));
  CHECK_FALSE(full.is_zero(code("xy")));
  CHECK(sum(full.value(code("xy")), full.value(code("yx"))).empty());
  CHECK(full.is_zero(code("xz")));
}

TEST_CASE("Berry-curvature dipole: exactly the 16 classes", "[responses][physics]") {
  // Sodemann & Fu, PRL 115, 216806 (2015) [checked]; class list [computed: an independent group-projection count]: zero in 23 and 432
  // (D ∝ δ, whose trace does not enter), in -6, -6m2, -43m and all centrosymmetric classes.
  const std::set<std::string> bcd{"1",   "2",    "m",  "222", "mm2", "4",  "-4",  "422",
                                  "4mm", "-42m", "3",  "32",  "3m",  "6",  "622", "6mm"};
  const auto classes = groups().crystallographic_types();
  REQUIRE(classes.size() == 32);
  const ResponsePart& d = part("berry-curvature-dipole", "D_ab: axial, time-even");
  CHECK(allowed_in(d, classes) == bcd);
  CHECK(allowed_in(part("second-order-conductivity", "D_ab: axial, time-even"), classes) == bcd);
  // A nonmagnetic crystal is its grey group: the same 16, as G1'.
  std::set<std::string> grey_bcd;
  for (const auto& s : bcd) grey_bcd.insert(s + "1'");
  CHECK(allowed_in(d, grey_types()) == grey_bcd);
  // In 23 and 432 the dipole itself is allowed, but only as its trace.
  for (const char* g : {"23", "432"}) {
    INFO(g);
    CHECK(independent_count(d.spec, groups().get(g).group) == 1);
    CHECK(independent_count(d, groups().get(g).group) == 0);
  }
}

TEST_CASE("exact Hall split of the nonlinear conductivities in all 122 types", "[responses][physics]") {
  // 18 = 10 + 8 at second order (Nandy & Sodemann, PRB 100, 195117 (2019) [title checked]);
  // 30 = 15 + 15 at third order [computed]. The decomposition is O(3)-invariant, so in every group the count of the
  // whole tensor is the symmetric count plus the Hall count (derived here); this also checks the excluded pieces.
  struct Split {
    std::string id, whole, sym, hall;
  };
  const std::vector<Split> splits{
      {"second-order-conductivity", "chi_abc: polar, time-even, sym(bc)", "chi_abc: polar, time-even, sym(abc)", "D_ab: axial, time-even"},
      {"second-order-conductivity", "chi_abc: polar, time-odd, sym(bc)", "chi_abc: polar, time-odd, sym(abc)", "D_ab: axial, time-odd"},
      {"third-order-conductivity", "chi_abcd: polar, time-even, sym(bcd)", "chi_abcd: polar, time-even, sym(abcd)", "Q_abc: axial, time-even, sym(bc)"},
      {"third-order-conductivity", "chi_abcd: polar, time-odd, sym(bcd)", "chi_abcd: polar, time-odd, sym(abcd)", "Q_abc: axial, time-odd, sym(bc)"}};
  const auto& triclinic = groups().get("1").group;
  CHECK(independent_count(part(splits[0].id, splits[0].sym), triclinic) == 10);
  CHECK(independent_count(part(splits[0].id, splits[0].hall), triclinic) == 8);
  CHECK(independent_count(part(splits[2].id, splits[2].sym), triclinic) == 15);
  CHECK(independent_count(part(splits[2].id, splits[2].hall), triclinic) == 15);
  for (const auto& s : splits) {
    TensorSpec whole = parse_tensor_spec(s.whole);
    for (const auto* g : groups().types()) {
      INFO(s.whole << " in " << g->symbol);
      CHECK(independent_count(whole, g->group) ==
            independent_count(part(s.id, s.sym), g->group) + independent_count(part(s.id, s.hall), g->group));
    }
  }
}

TEST_CASE("third-order Hall part: forbidden only in 432, -43m and m-3m", "[responses][physics]") {
  // Lai et al., Nat. Nanotechnol. 16, 869 (2021) [title checked] for the
  // effect itself. One component in 23 and m-3.
  const ResponsePart& hall = part("third-order-conductivity", "Q_abc: axial, time-even, sym(bc)");
  const auto classes = groups().crystallographic_types();
  CHECK(minus(all_symbols(classes), allowed_in(hall, classes)) == std::set<std::string>{"432", "-43m", "m-3m"});
  CHECK(independent_count(hall, groups().get("23").group) == 1);
  CHECK(independent_count(hall, groups().get("m-3").group) == 1);
}

TEST_CASE("electrical magnetochiral anisotropy: the 21 noncentrosymmetric classes", "[responses][physics]") {
  // Rikken, Fölling & Wyder, PRL 87, 236602 (2001) [checked] for the effect; the count of 21 classes is
  // common practice. Component counts [computed: an independent group-projection count].
  const ResponsePart& g = part("magnetochiral-anisotropy", "gamma_abcd: axial, time-even, sym(bc)");
  const auto classes = groups().crystallographic_types();
  CHECK(allowed_in(g, classes) == minus(all_symbols(classes), kCentrosymmetric));
  CHECK(allowed_in(g, classes).size() == 21);
  const std::map<std::string, int> counts{{"432", 3}, {"-43m", 2}, {"23", 5}, {"6mm", 5}, {"4mm", 6},
                                          {"3m", 8},  {"32", 10},  {"mm2", 13}, {"1", 54}};
  for (const auto& [sym, n] : counts) {
    INFO(sym);
    CHECK(independent_count(g, groups().get(sym + "1'").group) == n);
  }
}

TEST_CASE("linear magnetoelectric effect: 58 types; Cr2O3", "[responses][physics]") {
  // Birss 1964; ITC Vol. D ch. 1.5 [from memory]: 58 magnetic point groups allow the linear ME effect.
  const ResponsePart& alpha = part("linear-magnetoelectric", "alpha_ij: axial, time-odd");
  CHECK(allowed_in(alpha, groups().types()).size() == 58);
  // Cr2O3, -3'm' (Dzyaloshinskii, Sov. Phys. JETP 10, 628 (1960) [from memory]): alpha = diag(a, a, b).
  AllowedForm f = allowed_form(alpha.spec, groups().get("-3'm'").group);
  CHECK(f.independent() == 2);
  CHECK(equal(f.value(code("xx")), f.value(code("yy"))));
  CHECK_FALSE(f.is_zero(code("zz")));
  CHECK_FALSE(equal(f.value(code("xx")), f.value(code("zz"))));
  for (const char* off : {"xy", "yx", "xz", "zx", "yz", "zy"}) CHECK(f.is_zero(code(off)));
  // -3'm with primed 2-fold axes: only the antisymmetric (toroidal) part.
  const auto& g2 = groups().get("-3'm").group;
  CHECK(independent_count(part("linear-magnetoelectric", "alpha_ij: axial, time-odd, sym(ij)"), g2) == 0);
  CHECK(independent_count(part("linear-magnetoelectric", "alpha_ij: axial, time-odd, antisym(ij)"), g2) == 1);
  // Piezomagnetism, 66 types (Birss 1964 [from memory]).
  CHECK(allowed_in(part("piezomagnetic", "Lambda_ijk: axial, time-odd, sym(jk)"), groups().types()).size() == 66);
}

TEST_CASE("electric-dipole SHG: zero in the 11 centrosymmetric classes and in 432", "[responses][physics]") {
  // Boyd, Nonlinear Optics, 3rd ed. (2008) [from memory]; Nye 1957 [from memory].
  const ResponsePart& chi = part("electric-dipole-shg", "chi_ijk: polar, time-even, sym(jk)");
  const auto classes = groups().crystallographic_types();
  std::set<std::string> forbidden = kCentrosymmetric;
  forbidden.insert("432");
  CHECK(minus(all_symbols(classes), allowed_in(chi, classes)) == forbidden);
  // Nonmagnetic crystals (grey groups) give the same, and their c-type part vanishes.
  for (const auto* g : grey_types())
    CHECK(independent_count(part("electric-dipole-shg", "chi_ijk: polar, time-odd, sym(jk)"), g->group) == 0);
  // GaAs-type -43m: d14 = d25 = d36, one component (Boyd Table 1.5 [from memory]).
  AllowedForm gaas = allowed_form(chi.spec, groups().get("-43m").group);
  CHECK(gaas.independent() == 1);
  CHECK(equal(gaas.value(code("xyz")), gaas.value(code("yxz"))));
  CHECK(equal(gaas.value(code("xyz")), gaas.value(code("zxy"))));
  // Kleinman symmetry also removes 422 and 622: 18 classes.
  CHECK(allowed_in(part("electric-dipole-shg", "chi_ijk: polar, time-even, sym(ijk)"), classes).size() == 18);
}

TEST_CASE("piezoelectric counts, pyroelectric classes and elastic counts", "[responses][physics]") {
  // Nye, Physical Properties of Crystals (1957) [from memory].
  const std::map<std::string, int> piezo{{"1", 18}, {"2", 8},   {"m", 10},  {"222", 3}, {"mm2", 5},  {"4", 4},
                                         {"-4", 4}, {"422", 1}, {"4mm", 3}, {"-42m", 2}, {"3", 6},   {"32", 2},
                                         {"3m", 4}, {"6", 4},   {"-6", 2},  {"622", 1}, {"6mm", 3},  {"-6m2", 1},
                                         {"23", 1}, {"-43m", 1}, {"432", 0}};
  const ResponsePart& d = part("piezoelectric", "d_ijk: polar, time-even, sym(jk)");
  for (const auto& [sym, n] : piezo) {
    INFO(sym);
    CHECK(independent_count(d, groups().get(sym).group) == n);
  }
  const auto classes = groups().crystallographic_types();
  CHECK(allowed_in(d, classes).size() == 20);
  CHECK(allowed_in(part("pyroelectric", "p_i: polar, time-even"), classes) ==
        std::set<std::string>{"1", "2", "m", "mm2", "4", "4mm", "3", "3m", "6", "6mm"});
  const std::map<std::string, int> elastic{{"1", 21},   {"2", 13},  {"mmm", 9},   {"4", 7},  {"-4", 7},  {"4/m", 7},
                                           {"422", 6},  {"4mm", 6}, {"-42m", 6},  {"4/mmm", 6}, {"3", 7}, {"-3", 7},
                                           {"32", 6},   {"3m", 6},  {"-3m", 6},   {"6", 5},  {"6/mmm", 5}, {"23", 3},
                                           {"m-3m", 3}};
  const ResponsePart& c = part("elastic", "c_ijkl: polar, time-even, sym(ij), sym(kl), sym(ij,kl)");
  for (const auto& [sym, n] : elastic) {
    INFO(sym);
    CHECK(independent_count(c, groups().get(sym).group) == n);
  }
}

TEST_CASE("magnetoresistance of a cubic crystal (Seitz)", "[responses][physics]") {
  // Seitz, Phys. Rev. 79, 372 (1950) [from memory]: three B² coefficients in 432, -43m, m-3m; four in 23, m-3.
  const ResponsePart& mr = part("magnetoconductivity-quadratic", "sigma_abkl: polar, time-even, sym(ab), sym(kl)");
  for (const char* g : {"432", "-43m", "m-3m"}) CHECK(independent_count(mr, groups().get(std::string(g) + "1'").group) == 3);
  for (const char* g : {"23", "m-3"}) CHECK(independent_count(mr, groups().get(std::string(g) + "1'").group) == 4);
  // Triclinic maximum, 36.
  CHECK(independent_count(mr, groups().get("11'").group) == 36);
}

TEST_CASE("optical activity: 15 classes; the full axial tensor and the Edelstein effect: 18", "[responses][physics]") {
  // Nye 1957 [from memory]: optical activity in 1, 2, m, 222, mm2, 4, -4, 422, -42m, 3, 32, 6, 622, 23, 432.
  const std::set<std::string> active{"1", "2", "m", "222", "mm2", "4", "-4", "422", "-42m", "3", "32", "6", "622", "23", "432"};
  const auto classes = groups().crystallographic_types();
  CHECK(allowed_in(part("optical-activity", "g_ij: axial, time-even, sym(ij)"), classes) == active);
  // With the antisymmetric part: adds 4mm, 3m, 6mm; the current-induced spin
  // polarisation of a nonmagnetic crystal has the same 18 classes.
  std::set<std::string> gyrotropic = active;
  gyrotropic.insert({"4mm", "3m", "6mm"});
  CHECK(allowed_in(part("optical-activity", "g_ij: axial, time-even"), classes) == gyrotropic);
  std::set<std::string> grey_gyrotropic;
  for (const auto& s : gyrotropic) grey_gyrotropic.insert(s + "1'");
  CHECK(allowed_in(part("current-induced-spin-polarization", "K_ij: axial, time-even"), grey_types()) == grey_gyrotropic);
}

TEST_CASE("Hall signal from an in-plane field on polar surfaces", "[responses][physics]") {
  // Kurumaji, Phys. Rev. Research 5, 023138 (2023) [checked]: the symmetry requirement for a Hall signal n·h from an
  // in-plane field. Values [computed: an independent group-projection count]: 4mm, mm2 (2 ∥ n): zero at first and third order;
  // m (mirror normal y, n = z): n·h ∝ B_x; 3m (mirror normal x): first order zero, third order ∝ sin 3φ_B.
  const ResponsePart& c1 = part("in-plane-hall", "c_ia: polar, time-even");
  const ResponsePart& c3 = part("in-plane-hall", "c_iabc: polar, time-even, sym(abc)");
  auto normal_first = [&](const std::string& g) {
    AllowedForm f = allowed_form(c1.spec, groups().get(g).group);
    return std::make_pair(!f.is_zero(code("zx")), !f.is_zero(code("zy")));
  };
  auto normal_third_in_plane = [&](const std::string& g) {
    AllowedForm f = allowed_form(c3.spec, groups().get(g).group);
    int n = 0;
    for (const char* idx : {"zxxx", "zxxy", "zxyy", "zyyy"}) n += !f.is_zero(code(idx));
    return n;
  };
  for (const char* g : {"4mm1'", "mm21'", "6mm1'"}) {
    INFO(g);
    CHECK(normal_first(g) == std::make_pair(false, false));
    CHECK(normal_third_in_plane(g) == 0);
  }
  CHECK(normal_first("m1'") == std::make_pair(true, false));
  CHECK(normal_first("3m1'") == std::make_pair(false, false));
  AllowedForm trig = allowed_form(c3.spec, groups().get("3m1'").group);
  CHECK(trig.is_zero(code("zxxx")));
  CHECK(trig.is_zero(code("zxyy")));
  REQUIRE_FALSE(trig.is_zero(code("zyyy")));
  // n·h = c_zyyy sin³φ + 3 c_zxxy cos²φ sin φ must be ∝ sin 3φ = 3 cos²φ sin φ - sin³φ: c_zxxy = -c_zyyy.
  CHECK(sum(trig.value(code("zxxy")), trig.value(code("zyyy"))).empty());
  // The even order needs a magnetic host.
  CHECK(independent_count(part("in-plane-hall", "c_iab: axial, time-odd, sym(ab)"), groups().get("11'").group) == 0);
}

TEST_CASE("spin Hall conductivity of a cubic metal: one number, eps_abc", "[responses][physics]") {
  // common practice: a cubic, nonmagnetic metal has a single spin Hall conductivity, J_ac = sigma_SH eps_abc E_b
  // (spin current along a, field along b, spin along c), with no c-type (magnetic) part.
  const ResponsePart& she = part("spin-hall", "sigma_abc: axial, time-even");
  AllowedForm f = allowed_form(she.spec, groups().get("m-3m1'").group);
  REQUIRE(f.independent() == 1);
  const std::vector<LinearTerm> unit = f.value(code("xyz"));
  REQUIRE_FALSE(unit.empty());
  for (const char* even : {"yzx", "zxy"}) CHECK(equal(f.value(code(even)), unit));
  for (const char* odd : {"yxz", "xzy", "zyx"}) CHECK(sum(f.value(code(odd)), unit).empty());
  CHECK(f.nonzero_components() == 6);
  CHECK(independent_count(part("spin-hall", "sigma_abc: axial, time-odd"), groups().get("m-3m1'").group) == 0);
}
