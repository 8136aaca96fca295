// Handbook check of the tensor projection against
//   J. F. Nye, Physical Properties of Crystals: their Representation by Tensors and
//   Matrices, Oxford (Clarendon Press) 1957, reissued 1985.
// Chapter and table are named beside each check. Table numbers and the exact
// layout of Nye's schemes are quoted from memory (`from memory`); the counts
// are the check values of this file.
//
// Frames: the library's standard settings, which are Nye's for these classes:
// monoclinic with 2 ∥ y (Nye's "2 ∥ x2"), trigonal/hexagonal with x ∥ a, z ∥ c,
// 32 with 2 ∥ x, 3m with the mirror ⊥ x, -6m2 with a mirror ⊥ x, -42m with 2 ∥ x
// (Nye, Appendix B conventions, from memory).
#include "core/surd.hpp"
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

const PointGroup& group(const std::string& s) { return GroupCatalogue::builtin().get(s).group; }

int count(const char* spec, const std::string& g) { return independent_count(parse_tensor_spec(spec), group(g)); }

int code_of(const std::string& idx) {
  int c = 0;
  for (char ch : idx) c = c * 3 + (ch - 'x');
  return c;
}

// A component as its vector of coefficients over the free parameters.
using Expr = std::vector<Surd>;

Expr comp(const AllowedForm& f, const std::string& idx) {
  Expr e(f.independent());
  for (const auto& t : f.value(code_of(idx))) e[t.parameter] = e[t.parameter] + t.coefficient;
  return e;
}
Expr operator-(const Expr& a) {
  Expr r = a;
  for (auto& x : r) x = -x;
  return r;
}
Expr operator-(const Expr& a, const Expr& b) {
  Expr r = a;
  for (std::size_t i = 0; i < r.size(); ++i) r[i] = r[i] - b[i];
  return r;
}
Expr scaled(const Expr& a, const Rational& q) {
  Expr r = a;
  for (auto& x : r) x = x * Surd(q);
  return r;
}
bool is_zero(const Expr& e) {
  for (const auto& x : e)
    if (!x.is_zero()) return false;
  return true;
}

std::set<std::string> nonzero_set(const AllowedForm& f) {
  std::set<std::string> s;
  for (int code = 0; code < f.symmetry->full_size(); ++code)
    if (!f.is_zero(code)) s.insert(index_string(code, f.spec.rank));
  return s;
}

// Voigt pair index 1..6 -> xx, yy, zz, yz, xz, xy [common practice].
std::string voigt(int m) {
  static const char* pairs[] = {"xx", "yy", "zz", "yz", "xz", "xy"};
  return pairs[m - 1];
}
Expr c_voigt(const AllowedForm& f, int m, int n) { return comp(f, voigt(m) + voigt(n)); }

struct ClassRow {
  const char* name;
  int dielectric; // [V2]
  int piezo;      // V[V2]
  int elastic;    // [[V2]2]
};

// Nye ch. IV §2 / Table 3 (second-rank tensors by system), ch. VII Table 8
// (piezoelectric moduli), ch. VIII Table 9 (elastic stiffnesses), from memory;
// piezo and elastic counts (Nye 1957, from memory).
const ClassRow kClasses[] = {
    {"1", 6, 18, 21},    {"-1", 6, 0, 21},   {"2", 4, 8, 13},     {"m", 4, 10, 13},    {"2/m", 4, 0, 13},
    {"222", 3, 3, 9},    {"mm2", 3, 5, 9},   {"mmm", 3, 0, 9},    {"4", 2, 4, 7},      {"-4", 2, 4, 7},
    {"4/m", 2, 0, 7},    {"422", 2, 1, 6},   {"4mm", 2, 3, 6},    {"-42m", 2, 2, 6},   {"4/mmm", 2, 0, 6},
    {"3", 2, 6, 7},      {"-3", 2, 0, 7},    {"32", 2, 2, 6},     {"3m", 2, 4, 6},     {"-3m", 2, 0, 6},
    {"6", 2, 4, 5},      {"-6", 2, 2, 5},    {"6/m", 2, 0, 5},    {"622", 2, 1, 5},    {"6mm", 2, 3, 5},
    {"-6m2", 2, 1, 5},   {"6/mmm", 2, 0, 5}, {"23", 1, 1, 3},     {"m-3", 1, 0, 3},    {"432", 1, 0, 3},
    {"-43m", 1, 1, 3},   {"m-3m", 1, 0, 3},
};

// Nye ch. IV §4 (pyroelectricity), from memory: the ten polar classes.
const std::set<std::string> kPyroelectric = {"1", "2", "m", "mm2", "4", "4mm", "3", "3m", "6", "6mm"};

// Nye ch. XIV (optical activity), table of the gyration tensor, from memory: the
// fifteen optically active classes and the number of independent g_ij.
const std::map<std::string, int> kOpticallyActive = {
    {"1", 6},  {"2", 4},  {"m", 2},   {"222", 3}, {"mm2", 1}, {"4", 2},   {"-4", 2},  {"422", 2},
    {"-42m", 1}, {"3", 2}, {"32", 2}, {"6", 2},   {"622", 2}, {"23", 1},  {"432", 1},
};

} // namespace

TEST_CASE("Nye: every one of the 32 classes is tabulated here once", "[nye]") {
  std::set<std::string> ours;
  for (const auto& r : kClasses) ours.insert(GroupCatalogue::builtin().get(r.name).type_symbol);
  std::set<std::string> library;
  for (const auto* t : GroupCatalogue::builtin().crystallographic_types()) library.insert(t->type_symbol);
  CHECK(ours.size() == 32);
  CHECK(ours == library);
}

TEST_CASE("Nye: dielectric, piezoelectric and elastic counts in all 32 classes", "[nye]") {
  for (const auto& r : kClasses) {
    INFO("class " << r.name);
    // Nye ch. IV, Table 3 (from memory): 1 cubic, 2 uniaxial, 3 orthorhombic, 4 monoclinic, 6 triclinic.
    CHECK(count("[V2]", r.name) == r.dielectric);
    // Nye ch. VII, Table 8 (from memory).
    CHECK(count("V[V2]", r.name) == r.piezo);
    // Nye ch. VIII, Table 9 (from memory).
    CHECK(count("[[V2]2]", r.name) == r.elastic);
  }
}

TEST_CASE("Nye: pyroelectric classes", "[nye][pyro]") {
  // Nye ch. IV §4 (from memory): p allowed exactly in the 10 polar classes; along the
  // polar axis where there is one, anywhere in the mirror plane for m, anywhere for 1.
  for (const auto& r : kClasses) {
    INFO("class " << r.name);
    int n = count("V", r.name);
    CHECK((n > 0) == (kPyroelectric.count(r.name) > 0));
  }
  CHECK(count("V", "1") == 3);
  CHECK(count("V", "m") == 2);
  for (const char* g : {"2", "mm2", "4", "4mm", "3", "3m", "6", "6mm"}) CHECK(count("V", g) == 1);
  AllowedForm p2 = allowed_form(parse_tensor_spec("V"), group("2")); // 2 ∥ y
  CHECK(nonzero_set(p2) == std::set<std::string>{"y"});
  AllowedForm pm = allowed_form(parse_tensor_spec("V"), group("m")); // mirror ⊥ y
  CHECK(nonzero_set(pm) == std::set<std::string>{"x", "z"});
  for (const char* g : {"mm2", "4mm", "3m", "6mm", "4", "3", "6"})
    CHECK(nonzero_set(allowed_form(parse_tensor_spec("V"), group(g))) == std::set<std::string>{"z"});
}

TEST_CASE("Nye: optical activity (gyration tensor, symmetric axial rank 2)", "[nye][optical-activity]") {
  // Nye ch. XIV (from memory): allowed exactly in the 15 classes of kOpticallyActive.
  for (const auto& r : kClasses) {
    INFO("class " << r.name);
    auto it = kOpticallyActive.find(r.name);
    CHECK(count("e[V2]", r.name) == (it == kOpticallyActive.end() ? 0 : it->second));
  }
  const TensorSpec g = parse_tensor_spec("g_ij: axial, sym(ij)");
  // -4 and -42m (2 ∥ x): g11 = -g22, and g12 only in -4 (Nye ch. XIV, from memory).
  AllowedForm s4 = allowed_form(g, group("-4"));
  CHECK(comp(s4, "yy") == -comp(s4, "xx"));
  CHECK_FALSE(is_zero(comp(s4, "xx")));
  CHECK_FALSE(is_zero(comp(s4, "xy")));
  CHECK(is_zero(comp(s4, "zz")));
  AllowedForm d2d = allowed_form(g, group("-42m"));
  CHECK(nonzero_set(d2d) == std::set<std::string>{"xx", "yy"});
  CHECK(comp(d2d, "yy") == -comp(d2d, "xx"));
  // mm2: only g12; 222: diagonal; cubic 23, 432: isotropic.
  CHECK(nonzero_set(allowed_form(g, group("mm2"))) == std::set<std::string>{"xy", "yx"});
  CHECK(nonzero_set(allowed_form(g, group("222"))) == std::set<std::string>{"xx", "yy", "zz"});
  for (const char* c : {"23", "432"}) {
    AllowedForm iso = allowed_form(g, group(c));
    CHECK(nonzero_set(iso) == std::set<std::string>{"xx", "yy", "zz"});
    CHECK(comp(iso, "yy") == comp(iso, "xx"));
    CHECK(comp(iso, "zz") == comp(iso, "xx"));
  }
  // m (mirror ⊥ y): g12 and g23 (Nye: g12, g23 with the mirror ⊥ x2).
  CHECK(nonzero_set(allowed_form(g, group("m"))) == std::set<std::string>{"xy", "yx", "yz", "zy"});
}

TEST_CASE("Nye: second-rank symmetric tensor schemes by system", "[nye][dielectric]") {
  // Nye ch. I §5 / ch. IV, Table 3 (from memory).
  const TensorSpec e = parse_tensor_spec("eps_ij: sym(ij)");
  for (const char* u : {"4", "-4", "4/mmm", "3", "-3m", "6", "-6m2", "6/mmm", "32", "3m", "422", "-42m"}) {
    INFO("uniaxial class " << u);
    AllowedForm f = allowed_form(e, group(u));
    CHECK(nonzero_set(f) == std::set<std::string>{"xx", "yy", "zz"});
    CHECK(comp(f, "yy") == comp(f, "xx"));
    CHECK(comp(f, "zz") != comp(f, "xx"));
  }
  for (const char* m : {"2", "m", "2/m"}) { // unique axis y: ε13 free, ε12 = ε23 = 0
    AllowedForm f = allowed_form(e, group(m));
    CHECK(nonzero_set(f) == std::set<std::string>{"xx", "yy", "zz", "xz", "zx"});
  }
  for (const char* o : {"222", "mm2", "mmm"})
    CHECK(nonzero_set(allowed_form(e, group(o))) == std::set<std::string>{"xx", "yy", "zz"});
  AllowedForm cubic = allowed_form(e, group("m-3m"));
  CHECK(comp(cubic, "zz") == comp(cubic, "xx"));
}

TEST_CASE("Nye: explicit piezoelectric schemes", "[nye][piezo]") {
  const TensorSpec d = parse_tensor_spec("d_ijk: polar, sym(jk)");
  SECTION("32 (alpha-quartz type, 2 ∥ x): d11, d12 = -d11, d14, d25 = -d14, d26 = -2 d11") {
    // Nye ch. VII, Table 8, class 32 (from memory); tensor components with Nye's
    // factor 2 for the shear columns: d26 = 2 d_yxy.
    AllowedForm f = allowed_form(d, group("32"));
    CHECK(f.independent() == 2);
    CHECK(nonzero_set(f) == std::set<std::string>{"xxx", "xyy", "yxy", "yyx", "xyz", "xzy", "yxz", "yzx"});
    CHECK(comp(f, "xyy") == -comp(f, "xxx"));
    CHECK(comp(f, "yxy") == -comp(f, "xxx"));
    CHECK(comp(f, "yxz") == -comp(f, "xyz"));
    CHECK(scaled(comp(f, "yxy"), 2) == scaled(comp(f, "xxx"), -2)); // d26 = -2 d11
    CHECK(comp(f, "xxx") != comp(f, "xyz"));
  }
  SECTION("4mm and 6mm: d31 = d32, d33, d15 = d24") {
    for (const char* c : {"4mm", "6mm"}) {
      INFO("class " << c);
      AllowedForm f = allowed_form(d, group(c));
      CHECK(f.independent() == 3);
      CHECK(nonzero_set(f) == std::set<std::string>{"zxx", "zyy", "zzz", "xxz", "xzx", "yyz", "yzy"});
      CHECK(comp(f, "zyy") == comp(f, "zxx"));
      CHECK(comp(f, "yyz") == comp(f, "xxz"));
      CHECK(comp(f, "yzy") == comp(f, "xzx"));
    }
  }
  SECTION("-43m and 23: d14 = d25 = d36") {
    for (const char* c : {"-43m", "23"}) {
      AllowedForm f = allowed_form(d, group(c));
      CHECK(f.independent() == 1);
      CHECK(nonzero_set(f) == std::set<std::string>{"xyz", "xzy", "yxz", "yzx", "zxy", "zyx"});
      CHECK(comp(f, "yzx") == comp(f, "xyz"));
      CHECK(comp(f, "zxy") == comp(f, "xyz"));
    }
  }
  SECTION("-6m2 (mirror ⊥ x): d22 = -d21, d16 = -2 d22") {
    AllowedForm f = allowed_form(d, group("-6m2"));
    CHECK(nonzero_set(f) == std::set<std::string>{"yyy", "yxx", "xxy", "xyx"});
    CHECK(comp(f, "yxx") == -comp(f, "yyy"));
    CHECK(comp(f, "xxy") == -comp(f, "yyy"));
  }
  SECTION("422 and 622: d14 = -d25 only") {
    for (const char* c : {"422", "622"}) {
      AllowedForm f = allowed_form(d, group(c));
      CHECK(nonzero_set(f) == std::set<std::string>{"xyz", "xzy", "yxz", "yzx"});
      CHECK(comp(f, "yxz") == -comp(f, "xyz"));
    }
  }
  SECTION("432: every piezoelectric modulus vanishes") { CHECK(nonzero_set(allowed_form(d, group("432"))).empty()); }
}

TEST_CASE("Nye: explicit elastic schemes in Voigt terms", "[nye][elastic]") {
  const TensorSpec c = parse_tensor_spec("[[V2]2]");
  SECTION("hexagonal (all seven classes) and trigonal: c66 = (c11 - c12)/2") {
    // Nye ch. VIII, Table 9 (from memory): xyxy = (xxxx - xxyy)/2.
    for (const char* g : {"6", "-6", "6/m", "622", "6mm", "-6m2", "6/mmm", "3", "-3", "32", "3m", "-3m"}) {
      INFO("class " << g);
      AllowedForm f = allowed_form(c, group(g));
      CHECK(c_voigt(f, 6, 6) == scaled(c_voigt(f, 1, 1) - c_voigt(f, 1, 2), Rational(1, 2)));
      CHECK(c_voigt(f, 2, 2) == c_voigt(f, 1, 1));
      CHECK(c_voigt(f, 5, 5) == c_voigt(f, 4, 4));
      CHECK(c_voigt(f, 2, 3) == c_voigt(f, 1, 3));
    }
    for (const char* g : {"6", "6/mmm", "-6m2"}) {
      AllowedForm f = allowed_form(c, group(g));
      CHECK(is_zero(c_voigt(f, 1, 4)));
      CHECK(is_zero(c_voigt(f, 1, 6)));
    }
  }
  SECTION("trigonal 32, 3m, -3m: c14 = -c24 = c56, c15 = 0") {
    for (const char* g : {"32", "3m", "-3m"}) {
      INFO("class " << g);
      AllowedForm f = allowed_form(c, group(g));
      CHECK_FALSE(is_zero(c_voigt(f, 1, 4)));
      CHECK(c_voigt(f, 2, 4) == -c_voigt(f, 1, 4));
      CHECK(c_voigt(f, 5, 6) == c_voigt(f, 1, 4));
      CHECK(is_zero(c_voigt(f, 1, 5)));
      CHECK(is_zero(c_voigt(f, 3, 4)));
    }
  }
  SECTION("tetragonal 4, -4, 4/m: c16 = -c26; 4mm, 422, -42m, 4/mmm: c16 = 0") {
    for (const char* g : {"4", "-4", "4/m"}) {
      AllowedForm f = allowed_form(c, group(g));
      CHECK_FALSE(is_zero(c_voigt(f, 1, 6)));
      CHECK(c_voigt(f, 2, 6) == -c_voigt(f, 1, 6));
      CHECK(c_voigt(f, 5, 5) == c_voigt(f, 4, 4));
    }
    for (const char* g : {"4mm", "422", "-42m", "4/mmm"}) CHECK(is_zero(c_voigt(allowed_form(c, group(g)), 1, 6)));
  }
  SECTION("cubic: c11 = c22 = c33, c12 = c13 = c23, c44 = c55 = c66, three independent") {
    for (const char* g : {"23", "m-3", "432", "-43m", "m-3m"}) {
      AllowedForm f = allowed_form(c, group(g));
      CHECK(f.independent() == 3);
      CHECK(c_voigt(f, 3, 3) == c_voigt(f, 1, 1));
      CHECK(c_voigt(f, 2, 3) == c_voigt(f, 1, 2));
      CHECK(c_voigt(f, 6, 6) == c_voigt(f, 4, 4));
      CHECK(c_voigt(f, 4, 4) != scaled(c_voigt(f, 1, 1) - c_voigt(f, 1, 2), Rational(1, 2))); // not isotropic
    }
  }
}
