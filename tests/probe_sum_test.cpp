// What a probe reads with every mechanism together (probe sums), expansions in
// the magnetisation to third order, and measurement plans over the union of
// unknowns, checked against the harmonic-Hall analysis of the trade and
// against exact derivations.
#include "device/surd_echelon.hpp"
#include "response/response_expansion.hpp"
#include "scenario/scenario_run.hpp"
#include "support/cli_run.hpp"
#include "support/film_scenario.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <set>

using namespace ts;
using ts::test::film;
using ts::test::run_cli;

namespace {

std::set<std::string> functions(const std::vector<FourierTerm>& terms) {
  std::set<std::string> s;
  for (const auto& t : terms) s.insert(angle_function_text(t));
  return s;
}

const ProbeReading* reading(const ProbeSum& s, Probe p, int harmonic) {
  for (const auto& r : s.readings)
    if (r.probe == p && r.harmonic == harmonic) return &r;
  return nullptr;
}

// The term of the mechanism whose label contains `label` in a reading.
const SumTerm* term_of(const ProbeSum& s, const ProbeReading& r, const std::string& label) {
  for (const auto& t : r.terms)
    if (s.mechanisms[t.mechanism].label.find(label) != std::string::npos) return &t;
  return nullptr;
}

const Separation* separation_of(const ProbeSum& s, const ProbeReading& r, const std::string& a, const std::string& b) {
  for (const auto& x : r.separations) {
    const std::string& la = s.mechanisms[x.a].label;
    const std::string& lb = s.mechanisms[x.b].label;
    if ((la.find(a) != std::string::npos && lb.find(b) != std::string::npos) ||
        (la.find(b) != std::string::npos && lb.find(a) != std::string::npos))
      return &x;
  }
  return nullptr;
}

} // namespace

TEST_CASE("surd inverses and exact echelon forms", "[device][exact]") {
  const Surd r2 = Surd::sqrt_of(Rational(2)), r3 = Surd::sqrt_of(Rational(3)), r6 = Surd::sqrt_of(Rational(6));
  for (const Surd& a : {Surd(Rational(3, 7)), r2 + Surd(Rational(1)), r2 + r3 + r6, r3 - Surd(Rational(2)) * r6}) {
    CHECK(a * surd_inverse(a) == Surd(Rational(1)));
  }
  // Rows (1, √2), (√2, 2) are dependent; (1, √3) is not (computed by hand).
  CHECK(surd_rank({{Surd(Rational(1)), r2}, {r2, Surd(Rational(2))}}, 2) == 1);
  CHECK(surd_rank({{Surd(Rational(1)), r2}, {Surd(Rational(1)), r3}}, 2) == 2);
  SurdEchelon e(3);
  e.add({Surd(Rational(1)), r2, Surd()});
  e.add({Surd(), Surd(), Surd(Rational(1))});
  auto null = e.null_space();
  REQUIRE(null.size() == 1);
  CHECK(null[0][0] == -r2);
  CHECK(null[0][1] == Surd(Rational(1)));
}

TEST_CASE("expansion parts: symmetric field indices, parity from the order, Onsager for linear responses", "[device][catalogue]") {
  const Response& r = ResponseCatalogue::builtin().get("harmonic-hall-torques");
  REQUIRE(r.expansion);
  CHECK(r.parts.size() == 6); // orders 1..3, i- and c-type (default order 3)
  auto parts = expansion_parts(*r.expansion, 2, "test", ErrorKind::usage);
  REQUIRE(parts.size() == 4);
  CHECK(parts[0].spec_text == "c_abcd: axial, time-even, sym(bc)");
  CHECK(parts[2].spec_text == "c_abcde: polar, time-even, sym(bc), sym(de)");
  CHECK_THROWS_AS(expansion_parts(*r.expansion, 4, "test", ErrorKind::usage), Error); // rank 7
  // A linear response: ρ_ab(m) = ρ_ba(-m) (Onsager 1931; Kleiner 1966, from memory): the i-type
  // coefficient of m is antisymmetric (the anomalous Hall effect), of m² symmetric (AMR).
  ResponseExpansion lin;
  lin.field = "M";
  lin.indices = {"E", "j"};
  lin.harmonic = 1;
  auto amr = expansion_parts(lin, 2, "test", ErrorKind::usage);
  CHECK(amr[0].spec_text == "c_abc: axial, time-even, antisym(ab)");
  CHECK(amr[2].spec_text == "c_abcd: polar, time-even, sym(ab), sym(cd)");
  // The generated AMR forms count like the catalogue's written anisotropic-magnetoresistance parts.
  const Response& written = ResponseCatalogue::builtin().get("anisotropic-magnetoresistance");
  const auto& g = GroupCatalogue::builtin().get("4mm1'").group;
  CHECK(independent_count(amr[2].spec, g) == independent_count(written.parts[0].spec, g));
  CHECK(independent_count(amr[0].spec, g) == independent_count(written.parts[1].spec, g));
}

TEST_CASE("harmonic Hall of a 4mm1' interface: cos phi_M at first order, cos 2phi_M cos phi_M at third", "[device][physics]") {
  // Hayashi, Kim, Yamanouchi & Ohno, PRB 89, 144425 (2014); Avci et al., PRB 90, 224427 (2014) (both title
  // checked): for an in-plane magnetisation at φ_M from the current, V_2ω,⊥ = A cos φ_M + B cos 2φ_M cos φ_M,
  // and cos 2φ_M cos φ_M = (cos φ_M + cos 3φ_M)/2 first appears at third order in m.
  ScenarioResult r = run_scenario(film("m-3m", "(001)", {"harmonic-hall-torques"}, "[100]", "in-plane"));
  REQUIRE(r.bars.size() == 1);
  const ProbeSum& s = r.bars[0].sum;
  const ProbeReading* t = reading(s, Probe::transverse, 2);
  REQUIRE(t);
  const SumTerm* first = term_of(s, *t, "first order in m, i-type");
  const SumTerm* third = term_of(s, *t, "third order in m, i-type");
  REQUIRE(first);
  REQUIRE(third);
  CHECK(functions(first->terms) == std::set<std::string>{"cos(phiB)"});
  CHECK(functions(third->terms) == std::set<std::string>{"cos(phiB)", "cos(3*phiB)"});
  CHECK(term_of(s, *t, "second order in m") == nullptr); // forbidden by the twofold axis along the normal
  CHECK(term_of(s, *t, "c-type") == nullptr);            // a grey host: no c-type coefficient
  // Both terms are odd in m and land in Y for a sine drive (2ω: Y = -R_2 I_rms²/√2).
  CHECK(s.mechanisms[first->mechanism].magnetisation_parity == Parity::odd);
  CHECK(first->quadrature == Quadrature::y);
  // The named terms of the trade are in the labels.
  CHECK(s.mechanisms[first->mechanism].mechanism.find("damping-like") != std::string::npos);
  CHECK(s.mechanisms[third->mechanism].mechanism.find("field-like") != std::string::npos);
  // The third order has two free parameters, so its cos φ_M part is free as well: cos 3φ_M reveals the
  // third order, but the angles cannot split the cos φ_M amplitude between the two orders (computed).
  const Separation* x = separation_of(s, *t, "first order in m, i-type", "third order in m, i-type");
  REQUIRE(x);
  CHECK(x->handle == Handle::none);
  CHECK(x->angles_overlap_partly);
  CHECK(x->other_handle.find("field") != std::string::npos);
}

TEST_CASE("unidirectional magnetoresistance and the anomalous Nernst background share parities and angles", "[device][physics]") {
  // Avci et al., "Unidirectional spin Hall magnetoresistance in ferromagnet/normal metal bilayers", Nat. Phys.
  // 11, 570 (2015) (from memory): ΔR ∝ (z × M)·j, odd in M and in j; the anomalous Nernst voltage of the
  // Joule gradient has the same symmetry (Avci et al., PRB 90, 224427 (2014), title checked).
  ScenarioResult r = run_scenario(film("m-3m", "(001)", {"unidirectional-magnetoresistance"}, "[100]", "in-plane"));
  const ProbeSum& s = r.bars[0].sum;
  const ProbeReading* l = reading(s, Probe::longitudinal, 2);
  REQUIRE(l);
  const SumTerm* umr = term_of(s, *l, "unidirectional-magnetoresistance: gamma, i-type");
  const SumTerm* ane = term_of(s, *l, "anomalous Nernst of the magnetisation, i-type");
  REQUIRE(umr);
  REQUIRE(ane);
  CHECK(s.mechanisms[ane->mechanism].background);
  CHECK(functions(umr->terms) == std::set<std::string>{"sin(phiB)"}); // (z × m)·x = -m_y
  CHECK(functions(ane->terms) == functions(umr->terms));
  const Separation* x = separation_of(s, *l, "unidirectional", "anomalous Nernst of the magnetisation, i-type");
  REQUIRE(x);
  CHECK(x->handle == Handle::none);
  CHECK(x->same_parities);
  CHECK(x->same_angle_functions);
  CHECK(x->other_handle.find("drive frequency") != std::string::npos);
}

TEST_CASE("Berry-curvature dipole and skew scattering are indistinguishable by symmetry", "[device][physics]") {
  // Du et al., Nat. Commun. 10, 3047 (2019) (title checked): both give the same 2ω Hall form; they are
  // told apart by their scaling with σ_xx. A (001) interface with a polar distortion along [100] keeps
  // one mirror and allows D·û (docs/hall-bars.md).
  Scenario sc = film("m-3m", "(001)", {"berry-curvature-dipole", "second-order-conductivity"}, "rotating", "none");
  LoweringStep polar;
  polar.kind = LoweringKind::polar;
  polar.along = "[100]";
  sc.steps.push_back(polar);
  ScenarioResult r = run_scenario(sc);
  const ProbeSum& s = r.bars[0].sum;
  const ProbeReading* t = reading(s, Probe::transverse, 2);
  REQUIRE(t);
  const Separation* x = separation_of(s, *t, "berry-curvature-dipole", "second-order-conductivity: Hall part, i-type");
  REQUIRE(x);
  CHECK(x->handle == Handle::none);
  CHECK(x->other_handle.find("Du et al.") != std::string::npos);
}

TEST_CASE("the 45 degree bar alone cannot separate chi from D_xz in the strained film; a plan can", "[device][plan]") {
  // Computed: with the field along [100] the c-type parts of the second-order conductivity are
  // allowed; at φ = 45° the transverse probe reads a fully symmetric χ term and -(√2/2) D_xz from the
  // Hall part, both odd in B. One bar therefore fixes only a combination; bars at other angles
  // separate them (their angle functions differ).
  Scenario sc = load_scenario(std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/strained-film.toml");
  sc.layouts.clear();
  LayoutSpec one;
  one.harmonic = 2;
  one.rosette = {45};
  LayoutSpec rosette = one;
  rosette.rosette = {0, 45, 90, 135};
  sc.layouts = {one, rosette};
  ScenarioResult r = run_scenario(sc);
  auto has = [](const MeasurementPlan& p, const std::vector<std::size_t>& list, const std::string& label) {
    return std::any_of(list.begin(), list.end(), [&](std::size_t i) { return p.mechanisms[i].label.find(label) != std::string::npos; });
  };
  const MeasurementPlan& alone = r.layouts[0].plan;
  CHECK(has(alone, alone.not_separated, "fully symmetric (dissipative) part, c-type"));
  CHECK(has(alone, alone.not_separated, "Hall part, c-type"));
  const MeasurementPlan& plan = r.layouts[1].plan;
  CHECK(has(plan, plan.separated, "fully symmetric (dissipative) part, c-type"));
  CHECK(has(plan, plan.separated, "Hall part, c-type"));
  CHECK(plan.chosen.size() >= 2);
  CHECK(plan.rank_chosen == plan.rank_all);
}

TEST_CASE("run prints the probe sums, the separation table and the plan", "[device][cli]") {
  auto out = run_cli({"run", std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/magnetised-film-harmonic-hall.toml"});
  CHECK(out.exit_code == 0);
  CHECK(out.out.find("what each probe reads: every mechanism together") != std::string::npos);
  CHECK(out.out.find("what separates them") != std::string::npos);
  CHECK(out.out.find("indistinguishable by symmetry") != std::string::npos);
  CHECK(out.out.find("plan at 2ω") != std::string::npos);
  auto order = run_cli({"sample", "m-3m", "--cut", "(001)", "--response", "harmonic-hall-torques", "--order",
                       "harmonic-hall-torques=2", "--bar", "[100]:in-plane", "-f", "json"});
  CHECK(order.exit_code == 0);
  CHECK(order.out.find("second order in m, c-type") != std::string::npos);
  CHECK(order.out.find("third order in m") == std::string::npos);
  auto bad = run_cli({"sample", "m-3m", "--cut", "(001)", "--response", "harmonic-hall-torques", "--order",
                     "harmonic-hall-torques=4"});
  CHECK(bad.exit_code == 2);
  CHECK(bad.err.find("an order from 1 to 3") != std::string::npos);
  auto none = run_cli({"sample", "m-3m", "--cut", "(001)", "--response", "anomalous-hall", "--order",
                      "anomalous-hall=2"});
  CHECK(none.exit_code == 2);
  CHECK(none.err.find("has no expansion") != std::string::npos);
}
