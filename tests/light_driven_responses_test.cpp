// The catalogue entries for light that drives magnetic order and currents,
// and for electro-optics, against published rules. Each check names its
// outside source and status tag (docs/responses.md); [computed] marks a
// statement derived here from the exact forms.
#include "group/group_catalogue.hpp"
#include "response/response_catalogue.hpp"

#include <catch2/catch.hpp>

#include <map>
#include <set>
#include <stdexcept>

using namespace ts;

namespace {

const GroupCatalogue& groups() { return GroupCatalogue::builtin(); }

const ResponsePart& part(const std::string& id, const std::string& spec_text) {
  for (const auto& p : ResponseCatalogue::builtin().get(id).parts)
    if (p.spec_text == spec_text) return p;
  FAIL("response " << id << " has no part with spec '" << spec_text << "'");
  throw std::logic_error("unreachable");
}

std::set<std::string> allowed_in(const ResponsePart& p, const std::vector<const NamedGroup*>& list) {
  std::set<std::string> out;
  for (const auto* g : list)
    if (independent_count(p, g->group) > 0) out.insert(g->symbol);
  return out;
}

int code(const std::string& idx) {
  int c = 0;
  for (char ch : idx) c = c * 3 + (ch - 'x');
  return c;
}

// value(a) == factor * value(b), parameter by parameter.
bool proportional(const AllowedForm& f, const std::string& a, const std::string& b, int factor) {
  std::map<int, Surd> m;
  for (const auto& t : f.value(code(a))) m[t.parameter] += t.coefficient;
  for (const auto& t : f.value(code(b))) m[t.parameter] += t.coefficient * Surd(Rational(-factor));
  for (const auto& [p, c] : m)
    if (!c.is_zero()) return false;
  return !f.is_zero(code(a));
}

const std::set<std::string> kCentrosymmetric{"-1", "2/m", "mmm", "4/m", "4/mmm", "-3", "-3m", "6/m", "6/mmm", "m-3", "m-3m"};

} // namespace

TEST_CASE("inverse Faraday effect: allowed in every group, one number in an isotropic medium", "[responses][light]") {
  // Pershan, van der Ziel & Malmstrom, Phys. Rev. 143, 574 (1966) [from memory]: H ∝ i(E × E*) in an
  // isotropic medium, with a scalar coefficient. The highest crystal symmetry m-3m1' stands for it.
  const ResponsePart& f = part("inverse-faraday", "F_ij: polar, time-even");
  CHECK(allowed_in(f, groups().types()).size() == 122);
  AllowedForm cubic = allowed_form(f.spec, groups().get("m-3m1'").group);
  CHECK(cubic.independent() == 1);
  CHECK(proportional(cubic, "yy", "xx", 1));
  CHECK(proportional(cubic, "zz", "xx", 1));
  for (const char* off : {"xy", "yx", "xz", "zx", "yz", "zy"}) CHECK(cubic.is_zero(code(off)));
  // The c-type parts vanish in every grey group: without magnetic order linear
  // polarisation exerts no effective field (Kimel et al., Nature 435, 655 (2005) [from memory]).
  for (const auto* g : groups().types()) {
    if (g->kind != MagneticKind::grey) continue;
    INFO(g->symbol);
    CHECK(independent_count(part("inverse-faraday", "F_ij: polar, time-odd"), g->group) == 0);
    CHECK(independent_count(part("inverse-faraday", "b_ijk: axial, time-odd, sym(jk)"), g->group) == 0);
  }
}

TEST_CASE("photogalvanic forms: linear = piezoelectric form, circular = the 18 gyrotropic classes", "[responses][light]") {
  // Sturman & Fridkin, The Photovoltaic and Photorefractive Effects in Noncentrosymmetric Materials (1992)
  // [from memory]: the linear photogalvanic tensor has the symmetry of the piezoelectric tensor; the circular one
  // is an axial rank-2 tensor, allowed in the gyrotropic classes.
  const auto classes = groups().crystallographic_types();
  const ResponsePart& lin = part("photogalvanic", "sigma_ijk: polar, time-even, sym(jk)");
  const ResponsePart& d = part("piezoelectric", "d_ijk: polar, time-even, sym(jk)");
  for (const auto* g : classes) {
    INFO(g->symbol);
    AllowedForm a = allowed_form(lin.spec, g->group), b = allowed_form(d.spec, g->group);
    CHECK(a.independent() == b.independent());
    for (int c = 0; c < 27; ++c) CHECK(a.value(c).size() == b.value(c).size());
  }
  const std::set<std::string> circular = allowed_in(part("photogalvanic", "gamma_ij: axial, time-even"), classes);
  CHECK(circular.size() == 18);
  // The same 18 as the full axial rank-2 tensor of the optical-activity entry; the symmetric gyration tensor
  // (optical rotation) is allowed in 15: 4mm, 3m and 6mm show the circular current without optical activity.
  CHECK(circular == allowed_in(part("optical-activity", "g_ij: axial, time-even"), classes));
  std::set<std::string> extra;
  for (const auto& s : circular)
    if (!allowed_in(part("optical-activity", "g_ij: axial, time-even, sym(ij)"), classes).count(s)) extra.insert(s);
  CHECK(extra == std::set<std::string>{"3m", "4mm", "6mm"});
  // Every gyrotropic class lacks inversion; -6, -6m2 and -43m lack it too but are not gyrotropic [common practice].
  for (const auto& s : kCentrosymmetric) CHECK_FALSE(circular.count(s));
  for (const char* s : {"-6", "-6m2", "-43m"}) CHECK_FALSE(circular.count(s));
  // Magnetic parts: zero in grey groups; the c-type linear current (magnetic injection current) appears in a
  // PT-symmetric antiferromagnet such as -3'm' (Cr2O3 type), where the i-type shift current is forbidden
  // [computed; cf. Zhang et al., Nat. Commun. 10, 3783 (2019), from memory].
  const ResponsePart& lin_c = part("photogalvanic", "sigma_ijk: polar, time-odd, sym(jk)");
  CHECK(independent_count(lin_c, groups().get("-3m1'").group) == 0);
  CHECK(independent_count(lin_c, groups().get("-3'm'").group) > 0);
  CHECK(independent_count(lin, groups().get("-3'm'").group) == 0);
}

TEST_CASE("Pockels tensor: the LiNbO3-type 3m form and zero in centrosymmetric classes", "[responses][light]") {
  // Yariv & Yeh, Optical Waves in Crystals (1984); Boyd, Nonlinear Optics (2008) [from memory]: for 3m with the
  // mirror normal to x, r13 = r23, r22 = -r12 = -r61, r33, r42 = r51: four numbers. Contracted indices
  // 1 = xx, 2 = yy, 3 = zz, 4 = yz, 5 = xz, 6 = xy; r_lk with k the field.
  const ResponsePart& r = part("pockels", "r_ijk: polar, time-even, sym(ij)");
  AllowedForm f = allowed_form(r.spec, groups().get("3m").group);
  CHECK(f.independent() == 4);
  CHECK(proportional(f, "yyz", "xxz", 1));     // r23 = r13
  CHECK(proportional(f, "xxy", "yyy", -1));    // r12 = -r22
  CHECK(proportional(f, "xyx", "yyy", -1));    // r61 = -r22
  CHECK(!f.is_zero(code("zzz")));              // r33
  CHECK(proportional(f, "yzy", "xzx", 1));     // r42 = r51
  for (const char* zero : {"xxx", "yyx", "zzx", "zzy", "yzx", "yzz", "xzy", "xzz", "xyy", "xyz"}) {
    INFO(zero);
    CHECK(f.is_zero(code(zero)));
  }
  const auto classes = groups().crystallographic_types();
  std::set<std::string> zero;
  for (const auto* g : classes)
    if (independent_count(r, g->group) == 0) zero.insert(g->symbol);
  std::set<std::string> expected = kCentrosymmetric;
  expected.insert("432"); // as for piezoelectricity (Nye 1957 [from memory])
  CHECK(zero == expected);
}

TEST_CASE("electrogyration, directional dichroism and field-induced SHG", "[responses][light]") {
  const auto classes = groups().crystallographic_types();
  // Electrogyration is an axial rank-3 tensor: even under inversion, so centrosymmetric crystals show it
  // (Vlokh, Ferroelectrics 75, 119 (1987) [from memory]: first seen in centrosymmetric crystals).
  const ResponsePart& eg = part("electrogyration", "gamma_ijk: axial, time-even, sym(ij)");
  for (const char* s : {"-1", "2/m", "mmm", "4/m", "-3"}) CHECK(independent_count(eg, groups().get(s).group) > 0);
  // Nonreciprocal directional dichroism for unpolarised light follows the toroidal vector: exactly where the
  // antisymmetric magnetoelectric tensor is allowed (Arima 2008; Szaller et al. 2013 [from memory]) - the same
  // transformation law, checked in all 122 types [computed].
  const ResponsePart& t = part("nonreciprocal-directional-dichroism", "T_i: polar, time-odd");
  const ResponsePart& a = part("linear-magnetoelectric", "alpha_ij: axial, time-odd, antisym(ij)");
  CHECK(allowed_in(t, groups().types()) == allowed_in(a, groups().types()));
  const ResponsePart& ndd = part("nonreciprocal-directional-dichroism", "gamma_ijl: polar, time-odd, sym(ij)");
  CHECK(independent_count(ndd, groups().get("-3'm'").group) > 0);
  for (const auto* g : groups().types())
    if (g->kind == MagneticKind::grey) CHECK(independent_count(ndd, g->group) == 0);
  // Every magnetoelectric group whose alpha is more than the isotropic pseudoscalar also allows the
  // polarisation-resolved dichroism; of the groups whose alpha is only the pseudoscalar (axion-like, with no bulk
  // optical effect of its own: Arima 2008 [from memory]) the ones with cubic 432-type rotations allow none, and
  // 23 and m'-3' allow it through a tensor of their own [computed].
  const ResponsePart& alpha = part("linear-magnetoelectric", "alpha_ij: axial, time-odd");
  const ResponsePart& trace = part("linear-magnetoelectric", "alpha_: axial, time-odd");
  std::set<std::string> isotropic_with, isotropic_without;
  for (const auto& s : allowed_in(alpha, groups().types())) {
    INFO(s);
    const auto& g = groups().get(s).group;
    const bool only_trace = independent_count(alpha, g) == independent_count(trace, g);
    const bool dichroic = independent_count(ndd, g) > 0;
    if (!only_trace) CHECK(dichroic);
    else (dichroic ? isotropic_with : isotropic_without).insert(s);
  }
  CHECK(isotropic_with == std::set<std::string>{"23", "m'-3'"});
  CHECK(isotropic_without.count("432"));
  CHECK(isotropic_without.count("m'-3'm'"));
  // EFISH: a polar rank-4 tensor, allowed in every class (Lee, Chang & Bloembergen 1967 [from memory]).
  CHECK(allowed_in(part("field-induced-shg", "chi_ijkl: polar, time-even, sym(kl)"), classes).size() == 32);
  // Magnetic-field-induced SHG: axial rank 4, odd under inversion, so zero in the 11 centrosymmetric classes and
  // allowed in the zinc-blende class -43m (Pavlov et al., PRL 94, 157404 (2005) [from memory]: GaAs, CdTe).
  const ResponsePart& mf = part("field-induced-shg", "chi_ijkl: axial, time-even, sym(jk)");
  for (const auto& s : kCentrosymmetric) CHECK(independent_count(mf, groups().get(s).group) == 0);
  CHECK(independent_count(mf, groups().get("-43m1'").group) > 0);
}
