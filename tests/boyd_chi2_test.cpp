// Handbook check of second-order susceptibilities against
//   R. W. Boyd, Nonlinear Optics, 3rd ed., Academic Press 2008, section 1.5, the
//   table of the form of chi(2) for the 21 classes that lack inversion symmetry
//   (Table 1.5.2 there, number from memory).
// Boyd tabulates the general chi_ijk (no permutation symmetry assumed: V3), element
// by element as "xyz = -yxz, ...". Here that table is transcribed (from memory),
// checked against the library's V3 form element by element, and then the table's
// own content is specialised to SHG (intrinsic symmetry in jk, V[V2]) and to
// Kleinman symmetry (full permutation symmetry, [V3]; Boyd §1.5.5) by imposing the
// extra index symmetry on the table's relations, and checked again.
//
// Settings: Boyd's tables use the standard settings of the library: 2 ∥ y and
// m ⊥ y for the monoclinic classes, 2 ∥ z in mm2, 2 ∥ x in 32 and -42m, a mirror
// ⊥ x in 3m and -6m2 (the d22-type forms). Other settings are reached through the
// variants 31m, 312, -4m2 and through a change of frame.
#include "core/surd.hpp"
#include "group/group_catalogue.hpp"
#include "tensor/allowed_form.hpp"
#include "tensor/tensor_spec.hpp"

#include <catch2/catch.hpp>

#include <map>
#include <numeric>
#include <set>
#include <sstream>
#include <string>
#include <vector>

using namespace ts;

namespace {

const PointGroup& group(const std::string& s) { return GroupCatalogue::builtin().get(s).group; }

int code_of(const std::string& idx) {
  int c = 0;
  for (char ch : idx) c = c * 3 + (ch - 'x');
  return c;
}

// Boyd's table: one string per class; space-separated equality chains such as
// "xyz=-yxz", each chain one independent element. "*" stands for the 27 elements
// of class 1, all independent.
const std::map<std::string, std::string> kBoydTable = {
    {"1", "*"},
    {"2", "xyz xzy xxy xyx yxx yyy yzz yzx yxz zyz zzy zxy zyx"},
    {"m", "xxx xyy xzz xzx xxz yyz yzy yxy yyx zxx zyy zzz zzx zxz"},
    {"222", "xyz xzy yzx yxz zxy zyx"},
    {"mm2", "xzx xxz yyz yzy zxx zyy zzz"},
    {"4", "xyz=-yxz xzy=-yzx xzx=yzy xxz=yyz zxx=zyy zzz zxy=-zyx"},
    {"-4", "xyz=yxz xzy=yzx xzx=-yzy xxz=-yyz zxx=-zyy zxy=zyx"},
    {"422", "xyz=-yxz xzy=-yzx zxy=-zyx"},
    {"4mm", "xzx=yzy xxz=yyz zxx=zyy zzz"},
    {"-42m", "xyz=yxz xzy=yzx zxy=zyx"},
    {"3", "xxx=-xyy=-yyx=-yxy xyz=-yxz xzy=-yzx xzx=yzy xxz=yyz yyy=-yxx=-xxy=-xyx zxx=zyy zzz zxy=-zyx"},
    {"32", "xxx=-xyy=-yyx=-yxy xyz=-yxz xzy=-yzx zxy=-zyx"},
    {"3m", "xzx=yzy xxz=yyz zxx=zyy zzz yyy=-yxx=-xxy=-xyx"},
    {"6", "xyz=-yxz xzy=-yzx xzx=yzy xxz=yyz zxx=zyy zzz zxy=-zyx"},
    {"-6", "xxx=-xyy=-yxy=-yyx yyy=-yxx=-xyx=-xxy"},
    {"622", "xyz=-yxz xzy=-yzx zxy=-zyx"},
    {"6mm", "xzx=yzy xxz=yyz zxx=zyy zzz"},
    {"-6m2", "yyy=-yxx=-xxy=-xyx"},
    {"23", "xyz=yzx=zxy xzy=yxz=zyx"},
    {"432", "xyz=-xzy=yzx=-yxz=zxy=-zyx"},
    {"-43m", "xyz=xzy=yzx=yxz=zxy=zyx"},
};

// The eleven centrosymmetric classes: chi(2) vanishes (Boyd §1.5.10).
const char* const kCentrosymmetric[] = {"-1", "2/m", "mmm", "4/m", "4/mmm", "-3", "-3m", "6/m", "6/mmm", "m-3", "m-3m"};

// The table as a linear space: component -> (chain, sign); absent components vanish.
struct TableForm {
  int chains = 0;
  std::map<int, std::pair<int, int>> member; // code -> (chain, ±1)
};

TableForm parse_table(const std::string& text) {
  TableForm t;
  if (text == "*") {
    for (int c = 0; c < 27; ++c) t.member[c] = {t.chains++, 1};
    return t;
  }
  std::istringstream in(text);
  std::string chain;
  while (in >> chain) {
    std::size_t pos = 0;
    bool first = true;
    while (pos <= chain.size()) {
      std::size_t eq = chain.find('=', pos);
      std::string item = chain.substr(pos, eq == std::string::npos ? std::string::npos : eq - pos);
      int sign = 1;
      if (!item.empty() && item[0] == '-') {
        sign = -1;
        item = item.substr(1);
      }
      REQUIRE(item.size() == 3);
      REQUIRE_FALSE(t.member.count(code_of(item)));
      if (first) REQUIRE(sign == 1);
      t.member[code_of(item)] = {t.chains, sign};
      first = false;
      if (eq == std::string::npos) break;
      pos = eq + 1;
    }
    ++t.chains;
  }
  return t;
}

// Impose T[perm(I)] = T[I] for the given position permutations on a table form:
// chains become tied (p_a = ±p_b) or forced to zero. Signed union-find.
struct Reduced {
  std::vector<int> parent, parity; // parity: sign of p_chain relative to its root
  std::vector<bool> zero;          // at roots
  explicit Reduced(int n) : parent(n), parity(n, 1), zero(n, false) { std::iota(parent.begin(), parent.end(), 0); }
  std::pair<int, int> find(int a) {
    int s = 1;
    while (parent[a] != a) {
      s *= parity[a];
      a = parent[a];
    }
    return {a, s};
  }
  // p_a = rel · p_b
  void unite(int a, int b, int rel) {
    auto [ra, sa] = find(a);
    auto [rb, sb] = find(b);
    if (ra == rb) {
      if (sa != rel * sb) zero[ra] = true;
      return;
    }
    // p_a = sa p_ra, p_b = sb p_rb -> p_ra = sa·rel·sb p_rb
    parent[ra] = rb;
    parity[ra] = sa * rel * sb;
    if (zero[ra]) zero[rb] = true;
  }
  void kill(int a) { zero[find(a).first] = true; }
};

TableForm impose(const TableForm& t, const std::vector<std::vector<int>>& perms) {
  Reduced r(t.chains);
  for (const auto& [code, cs] : t.member)
    for (const auto& perm : perms) {
      int d[3] = {code / 9, (code / 3) % 3, code % 3};
      int image = d[perm[0]] * 9 + d[perm[1]] * 3 + d[perm[2]];
      auto it = t.member.find(image);
      if (it == t.member.end()) {
        r.kill(cs.first);
        continue;
      }
      // s_c p_a = s_image p_b  ->  p_a = s_c s_image p_b
      r.unite(cs.first, it->second.first, cs.second * it->second.second);
    }
  TableForm out;
  std::map<int, int> root_chain;
  for (const auto& [code, cs] : t.member) {
    auto [root, s] = r.find(cs.first);
    if (r.zero[root]) continue;
    auto it = root_chain.find(root);
    if (it == root_chain.end()) it = root_chain.emplace(root, out.chains++).first;
    out.member[code] = {it->second, s * cs.second};
  }
  return out;
}

// The library's form must be exactly the table's: same nonzero elements, every
// element of a chain equal to ± the chain's first element, one parameter per chain.
void check_against_table(const TableForm& t, const TensorSpec& spec, const PointGroup& g, const std::string& label) {
  AllowedForm f = allowed_form(spec, g);
  INFO(label << " (" << spec.canonical_text() << ")");
  CHECK(f.independent() == t.chains);
  std::map<int, int> first_of_chain;
  for (const auto& [code, cs] : t.member)
    if (!first_of_chain.count(cs.first)) first_of_chain[cs.first] = code;
  for (int code = 0; code < 27; ++code) {
    INFO("element " << index_string(code, 3));
    auto it = t.member.find(code);
    if (it == t.member.end()) {
      CHECK(f.is_zero(code));
      continue;
    }
    REQUIRE_FALSE(f.is_zero(code));
    // s_c·T_c is the same for every member c of a chain.
    int ref = first_of_chain[it->second.first];
    int sa = it->second.second, sb = t.member.at(ref).second;
    std::map<int, Surd> av, bv;
    for (const auto& x : f.value(code)) av[x.parameter] = av[x.parameter] + (sa > 0 ? x.coefficient : -x.coefficient);
    for (const auto& x : f.value(ref)) bv[x.parameter] = bv[x.parameter] + (sb > 0 ? x.coefficient : -x.coefficient);
    CHECK(av == bv);
  }
  // Distinct chains are independent: their leading elements are distinct parameters.
  std::set<int> params;
  for (const auto& [chain, code] : first_of_chain) {
    std::vector<LinearTerm> v = f.value(code);
    if (v.size() == 1) params.insert(v[0].parameter);
  }
  CHECK(static_cast<int>(params.size()) == t.chains);
}

const std::vector<std::vector<int>> kSwapJK = {{0, 2, 1}};
const std::vector<std::vector<int>> kAllPerms = {{0, 2, 1}, {1, 0, 2}, {1, 2, 0}, {2, 0, 1}, {2, 1, 0}};

int count(const char* spec, const char* g) { return independent_count(parse_tensor_spec(spec), group(g)); }

// d_il in Boyd's contracted notation (§1.5.6): l = 1..6 for jk = xx, yy, zz, yz(=zy), xz, xy.
std::vector<LinearTerm> d(const AllowedForm& f, int i, int l) {
  static const char* jk[] = {"xx", "yy", "zz", "yz", "xz", "xy"};
  return f.value(code_of(std::string(1, "xyz"[i - 1]) + jk[l - 1]));
}
bool same(const std::vector<LinearTerm>& a, const std::vector<LinearTerm>& b, int sign = 1) {
  std::map<int, Surd> av, bv;
  for (const auto& x : a) av[x.parameter] = av[x.parameter] + x.coefficient;
  for (const auto& x : b) bv[x.parameter] = bv[x.parameter] + (sign > 0 ? x.coefficient : -x.coefficient);
  return !av.empty() && av == bv;
}

} // namespace

TEST_CASE("Boyd: general chi_ijk (V3) in all 21 noncentrosymmetric classes", "[boyd]") {
  const TensorSpec v3 = parse_tensor_spec("chi_ijk: polar");
  CHECK(kBoydTable.size() == 21);
  for (const auto& [cls, text] : kBoydTable) check_against_table(parse_table(text), v3, group(cls), "class " + cls);
  for (const char* c : kCentrosymmetric) {
    INFO("class " << c);
    CHECK(count("V3", c) == 0);
  }
}

TEST_CASE("Boyd: SHG tensor (jk symmetric, V[V2]) from the same table", "[boyd][shg]") {
  const TensorSpec shg = parse_tensor_spec("d_ijk: sym(jk)");
  for (const auto& [cls, text] : kBoydTable)
    check_against_table(impose(parse_table(text), kSwapJK), shg, group(cls), "class " + cls);
  // Explicit d-matrix statements (Boyd §1.5.6 contracted notation).
  AllowedForm f43 = allowed_form(shg, group("-43m"));
  CHECK(same(d(f43, 2, 5), d(f43, 1, 4)));
  CHECK(same(d(f43, 3, 6), d(f43, 1, 4)));
  AllowedForm f4mm = allowed_form(shg, group("4mm"));
  CHECK(same(d(f4mm, 2, 4), d(f4mm, 1, 5)));
  CHECK(same(d(f4mm, 3, 2), d(f4mm, 3, 1)));
  CHECK_FALSE(same(d(f4mm, 3, 1), d(f4mm, 1, 5))); // equal only under Kleinman
  AllowedForm f3m = allowed_form(shg, group("3m"));
  CHECK(same(d(f3m, 2, 4), d(f3m, 1, 5)));
  CHECK(same(d(f3m, 1, 6), d(f3m, 2, 2), -1));
  CHECK(same(d(f3m, 2, 1), d(f3m, 2, 2), -1));
  CHECK(same(d(f3m, 3, 2), d(f3m, 3, 1)));
  CHECK(f3m.is_zero(code_of("xxx")));
  AllowedForm f32 = allowed_form(shg, group("32"));
  CHECK(same(d(f32, 1, 2), d(f32, 1, 1), -1));
  CHECK(same(d(f32, 2, 6), d(f32, 1, 1), -1)); // SHG d26 = -d11 (no factor 2, unlike Nye's piezo d)
  CHECK(same(d(f32, 2, 5), d(f32, 1, 4), -1));
  AllowedForm f422 = allowed_form(shg, group("422"));
  CHECK(same(d(f422, 2, 5), d(f422, 1, 4), -1));
  CHECK(f422.independent() == 1);
}

TEST_CASE("Boyd: Kleinman symmetry (full permutation symmetry, [V3])", "[boyd][kleinman]") {
  const TensorSpec kl = parse_tensor_spec("[V3]");
  for (const auto& [cls, text] : kBoydTable)
    check_against_table(impose(parse_table(text), kAllPerms), kl, group(cls), "class " + cls + " (Kleinman)");
  // Boyd §1.5.5: 422 and 622 vanish, so do 432 and the centrosymmetric classes.
  for (const char* c : {"422", "622", "432"}) {
    INFO("class " << c);
    CHECK(count("[V3]", c) == 0);
  }
  int survivors = 0;
  for (const auto& [cls, text] : kBoydTable) survivors += count("[V3]", cls.c_str()) > 0;
  CHECK(survivors == 18);
  // -43m: d14 = d25 = d36, a single constant.
  AllowedForm f = allowed_form(kl, group("-43m"));
  CHECK(f.independent() == 1);
  CHECK(same(d(f, 2, 5), d(f, 1, 4)));
  CHECK(same(d(f, 3, 6), d(f, 1, 4)));
  // 4mm and 6mm under Kleinman: d15 = d24 = d31 = d32, and d33.
  for (const char* c : {"4mm", "6mm"}) {
    AllowedForm k = allowed_form(kl, group(c));
    CHECK(k.independent() == 2);
    CHECK(same(d(k, 3, 1), d(k, 1, 5)));
    CHECK(same(d(k, 2, 4), d(k, 1, 5)));
  }
  // 32 under Kleinman: d11 = -d12 = -d26 survive, d14 = -d25 dies.
  AllowedForm k32 = allowed_form(kl, group("32"));
  CHECK(k32.independent() == 1);
  CHECK(k32.is_zero(code_of("xyz")));
  // -42m under Kleinman: d14 = d25 = d36.
  AllowedForm k42 = allowed_form(kl, group("-42m"));
  CHECK(k42.independent() == 1);
  CHECK(same(d(k42, 3, 6), d(k42, 1, 4)));
}

TEST_CASE("Boyd's tables in other settings: variants and changes of frame", "[boyd][settings]") {
  const TensorSpec shg = parse_tensor_spec("d_ijk: sym(jk)");
  // 31m (a mirror ⊥ y) and 312 (2 ∥ y) give the d11-type and d22-type forms that
  // 3m and 32 give with x and y exchanged.
  AllowedForm f31m = allowed_form(shg, group("31m"));
  CHECK(f31m.independent() == 4);
  CHECK(f31m.is_zero(code_of("yyy")));
  CHECK(same(f31m.value(code_of("xyy")), f31m.value(code_of("xxx")), -1));
  CHECK(same(f31m.value(code_of("yxy")), f31m.value(code_of("xxx")), -1));
  AllowedForm f312 = allowed_form(shg, group("312"));
  CHECK(f312.independent() == 2);
  CHECK(f312.is_zero(code_of("xxx")));
  CHECK(same(f312.value(code_of("yxx")), f312.value(code_of("yyy")), -1));
  // -4m2 (mirrors ⊥ x, y): Boyd's -42m form seen with x, y along [110], [-110]:
  // d15 = -d24 and d31 = -d32.
  AllowedForm f4m2 = allowed_form(shg, group("-4m2"));
  CHECK(f4m2.independent() == 2);
  CHECK(same(f4m2.value(code_of("yyz")), f4m2.value(code_of("xxz")), -1));
  CHECK(same(f4m2.value(code_of("zyy")), f4m2.value(code_of("zxx")), -1));
  CHECK(f4m2.is_zero(code_of("xyz")));
  // The same through an explicit frame: -42m with x' ∥ [110], y' ∥ [-110].
  Frame diag;
  diag.axes = {Vec3{QSqrt3(1), QSqrt3(1), QSqrt3(0)}, Vec3{QSqrt3(-1), QSqrt3(1), QSqrt3(0)},
               Vec3{QSqrt3(0), QSqrt3(0), QSqrt3(1)}};
  AllowedForm rotated = allowed_form(shg, group("-42m"), diag);
  CHECK(rotated.independent() == 2);
  for (int code = 0; code < 27; ++code) CHECK(rotated.is_zero(code) == f4m2.is_zero(code));
  CHECK(same(rotated.value(code_of("yyz")), rotated.value(code_of("xxz")), -1));
  CHECK(same(rotated.value(code_of("zyy")), rotated.value(code_of("zxx")), -1));
  // And 3m seen from a frame turned 90° about z (x' = y, y' = -x) is 31m's d11 type.
  Frame quarter;
  quarter.axes = {Vec3{QSqrt3(0), QSqrt3(1), QSqrt3(0)}, Vec3{QSqrt3(-1), QSqrt3(0), QSqrt3(0)},
                  Vec3{QSqrt3(0), QSqrt3(0), QSqrt3(1)}};
  AllowedForm q3m = allowed_form(shg, group("3m"), quarter);
  for (int code = 0; code < 27; ++code) CHECK(q3m.is_zero(code) == f31m.is_zero(code));
}
