// Hall-bar signals: the angle dependences, lock-in readings, Hall test and
// layout rank checked against published forms and derivations of the trade.
#include "geometry/signal_expression.hpp"
#include "scenario/scenario_run.hpp"
#include "support/cli_run.hpp"
#include "support/film_scenario.hpp"

#include <catch2/catch.hpp>

#include <algorithm>
#include <cmath>
#include <fstream>
#include <set>

using namespace ts;
using ts::test::film;
using ts::test::run_cli;

namespace {

// The signal of part `part` (0-based, in catalogue order) of the only response.
const PartSignal& signal_of(const ScenarioResult& r, std::size_t part) {
  REQUIRE(r.bars.size() == 1);
  REQUIRE(part < r.bars[0].signals.size());
  return r.bars[0].signals[part].signal;
}

std::set<std::string> functions(const std::vector<FourierTerm>& terms) {
  std::set<std::string> s;
  for (const auto& t : terms) s.insert(angle_function_text(t));
  return s;
}

// A (111) film of m-3m with a strain along [11-2] (in the mirror plane (1-10)): one
// mirror left, its normal along x, and a rotating bar reading second-order conductivity.
Scenario one_mirror_film() {
  Scenario sc = film("m-3m", "(111)", {"second-order-conductivity"}, "rotating", "none");
  LoweringStep st;
  st.kind = LoweringKind::strain;
  st.along = "[11-2]";
  sc.steps.push_back(st);
  return sc;
}

} // namespace

TEST_CASE("planar Hall effect of an isotropic conductor follows sin 2(phi_B - phi)", "[bar][physics]") {
  // Goldberg & Davis, "New galvanomagnetic effect", Phys. Rev. 94, 1121 (1954) (from memory): in plane,
  // T = 1/2 (rho_par - rho_perp) sin 2(phi_B - phi), L = rho_perp + (rho_par - rho_perp) cos^2(phi_B - phi).
  // A c-plane film of a hexagonal crystal is isotropic in its plane for rank-4 tensors.
  ScenarioResult r = run_scenario(film("6/mmm", "(001)", {"magnetoconductivity-quadratic"}, "rotating", "in-plane"));
  const PartSignal& s = signal_of(r, 1); // the symmetric (magnetoresistance, planar Hall) part
  CHECK(functions(s.longitudinal.terms) == std::set<std::string>{"1", "cos(2*phi - 2*phiB)"});
  CHECK(functions(s.transverse.terms) == std::set<std::string>{"sin(2*phi - 2*phiB)"});
  // The amplitude of the transverse term is minus that of the longitudinal cos term: T = -(1/2) dL/dphi... up to
  // the Hall test, with no Hall part (a symmetric tensor is dissipative).
  CHECK(s.hall_split);
  CHECK(s.transverse.hall_terms.empty());
  CHECK(s.current_order == 1);
  CHECK(s.field_order == 2);
}

TEST_CASE("cubic magnetoresistance has the three Seitz terms", "[bar][physics]") {
  // Seitz, "Note on the theory of resistance of a cubic semiconductor in a magnetic field", Phys. Rev. 79, 372
  // (1950) (from memory): rho/rho0 = beta B^2 + gamma (B.u)^2 + delta sum_i u_i^2 B_i^2 at second order. For u and b
  // in the (001) plane this is 1, cos 2(phi - phi_B) and cos 2(phi + phi_B) (derived here from the Seitz form).
  ScenarioResult r = run_scenario(film("m-3m", "", {"magnetoconductivity-quadratic"}, "rotating", "in-plane"));
  const PartSignal& s = signal_of(r, 1);
  CHECK(r.parts[1].counts.back() == 3);
  CHECK(functions(s.longitudinal.terms) == std::set<std::string>{"1", "cos(2*phi - 2*phiB)", "cos(2*phi + 2*phiB)"});
}

TEST_CASE("3m interface at zero field: sin 3phi and cos 3phi, no Berry-curvature dipole", "[bar][physics]") {
  // Sodemann & Fu, "Quantum nonlinear Hall effect induced by Berry curvature dipole in time-reversal invariant
  // materials", PRL 115, 216806 (2015): C3v gives D = 0. With x the mirror normal, L2 = -c sin 3phi and
  // T2 = -c cos 3phi with c = chi_yyy (derived here; chi_xxy = -chi_yyy in 3m).
  ScenarioResult r = run_scenario(film("m-3m", "(111)", {"second-order-conductivity"}, "rotating", "none"));
  const PartSignal& chi = signal_of(r, 0);
  REQUIRE(chi.longitudinal.terms.size() == 1);
  CHECK(angle_function_text(chi.longitudinal.terms[0]) == "sin(3*phi)");
  REQUIRE(chi.transverse.terms.size() == 1);
  CHECK(angle_function_text(chi.transverse.terms[0]) == "cos(3*phi)");
  CHECK(chi.longitudinal.terms[0].coefficient == chi.transverse.terms[0].coefficient);
  CHECK(chi.transverse.hall_terms.empty());
  const PartSignal& dipole = signal_of(r, 1);
  CHECK(r.parts[1].counts.back() == 1); // D_xy - D_yx is allowed ...
  CHECK_FALSE(dipole.reads());          // ... but no planar probe reads it
  CHECK(r.parts[1].planar.back() == PlanarReading::not_readable);
  CHECK(chi.longitudinal.zero_azimuths == std::vector<int>{0, 60, 120, 180, 240, 300});
  CHECK(chi.longitudinal.largest_azimuths == std::vector<double>{30, 90, 150, 210, 270, 330});
}

TEST_CASE("one mirror adds a first harmonic and a Berry-dipole Hall term cos phi", "[bar][physics]") {
  // Sodemann & Fu, PRL 115, 216806 (2015): the largest symmetry that allows the dipole is one mirror line, with D
  // perpendicular to it. A strain along [11-2] (in the mirror plane (1-10)) leaves m with the mirror normal x.
  ScenarioResult r = run_scenario(one_mirror_film());
  const PartSignal& chi = signal_of(r, 0);
  CHECK(functions(chi.longitudinal.terms) == std::set<std::string>{"sin(phi)", "sin(3*phi)"});
  const PartSignal& dipole = signal_of(r, 1);
  CHECK(functions(dipole.transverse.terms) == std::set<std::string>{"cos(phi)"});
  CHECK(dipole.longitudinal.terms.empty());
  CHECK(functions(dipole.transverse.hall_terms) == std::set<std::string>{"cos(phi)"}); // all of it is Hall
}

TEST_CASE("grey 4mm interface: no zero-field second-harmonic signal at any angle", "[bar][physics]") {
  // Derived here from the C4 rule k1 + k2 = 0 (mod 4) for odd harmonics: 4mm, 6mm and mm2 with 2 along n give
  // L2 = T2 = 0 for every phi; the tensor itself is allowed through its out-of-plane components.
  ScenarioResult r = run_scenario(film("m-3m", "(001)", {"second-order-conductivity"}, "rotating", "none"));
  CHECK(r.parts[0].counts.back() > 0);
  CHECK_FALSE(signal_of(r, 0).reads());
  CHECK(r.parts[0].planar.back() == PlanarReading::not_readable);
}

TEST_CASE("bilinear magnetoresistance of a polar interface goes as sin(phi - phi_B)", "[bar][physics]") {
  // Polar C_inf_v: E = alpha j[(n x B).j] + beta j^2 (n x B), so L = (alpha + beta) B j^2 sin(phi - phi_B)
  // (He et al., Nat. Phys. 14, 495 (2018), from memory; derived here). A 6mm interface is isotropic for it.
  ScenarioResult r = run_scenario(film("6/mmm", "(001)", {"magnetochiral-anisotropy"}, "rotating", "in-plane"));
  const PartSignal& s = signal_of(r, 0);
  CHECK(functions(s.longitudinal.terms) == std::set<std::string>{"sin(phi - phiB)"});
  CHECK(functions(s.transverse.terms) == std::set<std::string>{"cos(phi - phiB)"});
  CHECK(s.field_order == 1);
  // 4mm adds a' sin(3 phi + phi_B) (derived here).
  ScenarioResult q = run_scenario(film("m-3m", "(001)", {"magnetochiral-anisotropy"}, "rotating", "in-plane"));
  CHECK(functions(signal_of(q, 0).longitudinal.terms) ==
        std::set<std::string>{"sin(phi - phiB)", "sin(3*phi + phiB)"});
}

TEST_CASE("4mm third order: L3 = A0 + A4 cos 4phi, T3 = -A4 sin 4phi, no Hall part", "[bar][physics]") {
  // Derived here: a fully symmetric rank-4 tensor in C4v, read in plane.
  ScenarioResult r = run_scenario(film("m-3m", "(001)", {"third-order-conductivity"}, "rotating", "none"));
  const PartSignal& s = signal_of(r, 0);
  CHECK(functions(s.longitudinal.terms) == std::set<std::string>{"1", "cos(4*phi)"});
  CHECK(functions(s.transverse.terms) == std::set<std::string>{"sin(4*phi)"});
  CHECK(s.transverse.hall_terms.empty());
  CHECK_FALSE(signal_of(r, 1).reads()); // the Hall part Q has no in-plane reading in 4mm
}

TEST_CASE("lock-in readings of V = R1 I + R2 I^2 + R3 I^3 for a sine and a cosine drive", "[bar][lock-in]") {
  // Common practice (lock-in detection of harmonics): I = I0 sin wt, I0 = sqrt2 I_rms gives V_DC = R2 I_rms^2,
  // 2w: X = 0, Y = -R2 I_rms^2/sqrt2; 3w: X = -R3 I_rms^3/2, Y = 0, and 1w gains (3/2) R3 I_rms^3.
  const Surd r2 = Surd::sqrt_of(Rational(2));
  auto two = lock_in_factors(2, Waveform::sine);
  REQUIRE(two.size() == 2);
  CHECK(two[0].harmonic == 0);
  CHECK(two[0].x == Surd(Rational(1)));
  CHECK(two[1].harmonic == 2);
  CHECK(two[1].x.is_zero());
  CHECK(two[1].y == -(r2 * Surd(Rational(1, 2))));
  auto three = lock_in_factors(3, Waveform::sine);
  REQUIRE(three.size() == 2);
  CHECK(three[0].harmonic == 1);
  CHECK(three[0].x == Surd(Rational(3, 2)));
  CHECK(three[1].x == Surd(Rational(-1, 2)));
  CHECK(three[1].y.is_zero());
  // With I = I0 cos wt the 2w term is +(R2 I0^2/2) cos 2wt: in phase with the cos reference.
  auto cosine = lock_in_factors(2, Waveform::cosine);
  CHECK(cosine[1].x == r2 * Surd(Rational(1, 2)));
  CHECK(cosine[1].y.is_zero());
}

TEST_CASE("the GiNaC expression of a signal evaluates to its exact Fourier series", "[bar][expression]") {
  ScenarioResult r = run_scenario(film("m-3m", "(111)", {"second-order-conductivity"}, "rotating", "none"));
  const PartSignal& s = signal_of(r, 0);
  const AllowedForm& form = r.parts[0].forms.back();
  ExpressionSymbols sy;
  GiNaC::ex e = series_ex(s.longitudinal.terms, form, sy);
  GiNaC::ex at = e.subs(GiNaC::lst{sy.angle(Angle::phi) == GiNaC::numeric(7, 10),
                                   sy.parameter(form.parameter_name(0)) == 1,
                                   sy.parameter(form.parameter_name(1)) == 0,
                                   sy.parameter(form.parameter_name(2)) == 0});
  double value = GiNaC::ex_to<GiNaC::numeric>(at.evalf()).to_double();
  double expected = 0;
  for (const auto& t : s.longitudinal.terms)
    for (const auto& lt : t.coefficient)
      if (lt.parameter == 0) expected += lt.coefficient.to_double() * angle_function_double(t, {0.7, 0, 0, 0});
  CHECK(value == Approx(expected).margin(1e-12));
  CHECK(ex_latex(e).find("\\sin") != std::string::npos);
}

TEST_CASE("layouts: the number of bars follows the rank argument", "[bar][layout]") {
  // Common practice (linear transport): a bar reads rho_uu and rho_vu; 4mm and 3m are isotropic in plane (one
  // parameter, one bar); mm2 with 2 along n has rho_xx and rho_yy, both read by one bar off the axes; a single mirror
  // adds rho_xy (three parameters, two bars).
  auto bars = [](const std::string& group, const std::string& cut, std::vector<LoweringStep> steps = {}) {
    Scenario sc;
    sc.group = group;
    sc.cut = cut;
    sc.steps = std::move(steps);
    sc.responses = {"resistivity"};
    LayoutSpec l;
    l.response = "resistivity";
    l.harmonic = 1;
    sc.layouts.push_back(l);
    ScenarioResult r = run_scenario(sc);
    REQUIRE(r.layouts.size() == 1);
    REQUIRE(r.layouts[0].designs.size() >= 2);
    const LayoutDesign& d = r.layouts[0].designs[1]; // the symmetric part
    CHECK(d.rank_all == d.parameters - static_cast<int>(d.unreadable.size())); // every in-plane parameter
    return d.chosen.size();
  };
  LoweringStep strain{LoweringKind::strain, "[100]", "", "", "", "test"};
  LoweringStep shear{LoweringKind::shear, "[100]", "[010]", "", "", "test"};
  CHECK(bars("m-3m", "(001)") == 1);                    // 4mm
  CHECK(bars("m-3m", "(111)") == 1);                    // 3m
  CHECK(bars("m-3m", "(001)", {strain}) == 1);          // mm2
  CHECK(bars("m-3m", "(001)", {shear}) == 1);            // mm2 with mirrors along the diagonals: rho_xx, rho_xy
  CHECK(bars("m-3m", "(001)", {strain, shear}) == 2);    // 2 along n: rho_xx, rho_yy, rho_xy
}

TEST_CASE("a rosette that cannot separate two parameters is reported", "[bar][layout]") {
  // One mirror (normal x): L2 = a1 sin phi + a3 sin 3phi (Sodemann & Fu 2015; derived here). A single bar at 90°
  // reads a1 - a3 and nothing else: rank 1 of 2.
  Scenario sc;
  sc.group = "m-3m";
  sc.cut = "(111)";
  sc.steps = {LoweringStep{LoweringKind::strain, "[11-2]", "", "", "", "t"}};
  sc.responses = {"second-order-conductivity"};
  LayoutSpec l;
  l.response = "second-order-conductivity";
  l.harmonic = 2;
  l.rosette = {90};
  sc.layouts.push_back(l);
  l.rosette.clear(); // the low-index directions of the plane
  sc.layouts.push_back(l);
  ScenarioResult r = run_scenario(sc);
  const LayoutDesign& one = r.layouts[0].designs[0];
  const LayoutDesign& all = r.layouts[1].designs[0];
  CHECK(all.rank_all == 2);
  CHECK(one.rank_all == 1);
  CHECK(std::find(one.unreadable.begin(), one.unreadable.end(), "chi_xxy") != one.unreadable.end());
}

TEST_CASE("the Fourier terms that tell the parts apart are in the result and the JSON", "[bar][separation]") {
  // The film of the one-mirror test: the longitudinal probe reads one part only, so it
  // separates nothing; on the transverse probe cos 3φ comes from the symmetric part alone
  // and tells it apart from the Berry dipole (Sodemann & Fu, PRL 115, 216806 (2015)).
  ScenarioResult r = run_scenario(one_mirror_film());
  REQUIRE(r.bars.size() == 1);
  const BarResult& b = r.bars[0];
  REQUIRE(b.separations.size() == 1);
  const BarSeparation& sep = b.separations[0];
  CHECK(sep.current_order == 2);
  CHECK(sep.probe == Probe::transverse);
  REQUIRE(sep.rows.size() == 2);
  const std::size_t symmetric = b.signals[0].part, dipole = b.signals[1].part;
  CHECK(angle_function_text(FourierTerm{sep.rows[0].k, sep.rows[0].sine, {}}) == "cos(phi)");
  CHECK(sep.rows[0].parts == std::vector<std::size_t>{symmetric, dipole});
  CHECK(angle_function_text(FourierTerm{sep.rows[1].k, sep.rows[1].sine, {}}) == "cos(3*phi)");
  CHECK(sep.rows[1].parts == std::vector<std::size_t>{symmetric});

  // A one-mirror group given directly: the same split, and the JSON carries it.
  auto j = run_cli({"sample", "m", "--response", "second-order-conductivity", "--bar", "rotating", "-f", "json"});
  REQUIRE(j.exit_code == 0);
  const std::size_t at = j.out.find("\"separations\"");
  REQUIRE(at != std::string::npos);
  const std::size_t three = j.out.find("\"function\" : \"sin(3*phi)\"", at);
  REQUIRE(three != std::string::npos);
  const std::size_t parts = j.out.find("\"parts\"", three);
  CHECK(j.out.find("fully symmetric", parts) < j.out.find(']', parts));
  CHECK(j.out.find("Hall part", parts) > j.out.find(']', parts));
}

TEST_CASE("CLI: bars and layouts from options and from a scenario file, in every format", "[bar][cli]") {
  auto r = run_cli({"sample", "m-3m", "--cut", "(111)", "--response", "second-order-conductivity", "--bar",
                    "rotating:none", "--layout", "second-order-conductivity:2"});
  REQUIRE(r.exit_code == 0);
  CHECK(r.out.find("longitudinal S_∥ = chi_xxy*sin(3*phi)") != std::string::npos);
  CHECK(r.out.find("2ω X = 0, Y = -sqrt(2)/2 R_2 I_rms^2") != std::string::npos);
  CHECK(r.out.find("lock-in reference sin(nωt)") != std::string::npos);
  CHECK(r.out.find("bar layout") != std::string::npos);
  for (const char* f : {"markdown", "latex", "json"}) {
    auto g = run_cli({"sample", "m-3m", "--cut", "(111)", "--response", "second-order-conductivity", "--bar",
                      "[1-10]:none", "-f", f});
    INFO(f);
    CHECK(g.exit_code == 0);
  }
  auto j = run_cli({"sample", "m-3m", "--cut", "(111)", "--response", "second-order-conductivity", "--bar",
                    "rotating:none", "-f", "json"});
  CHECK(j.out.find("\"function\" : \"sin(3*phi)\"") != std::string::npos);
  CHECK(j.out.find("\"R_n_latex\"") != std::string::npos);
  auto ex = run_cli({"run", std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/strained-film.toml"});
  CHECK(ex.exit_code == 0);
  CHECK(ex.out.find("rotating bar in the field along [100]") != std::string::npos);
  CHECK(ex.out.find("as step 2 (field not applied)") != std::string::npos); // the eMChA expansion in B
}

TEST_CASE("CLI: impossible bar geometries are refused with the field named", "[bar][cli][errors]") {
  auto out_of_plane = run_cli({"sample", "m-3m", "--cut", "(001)", "--response", "resistivity", "--bar", "[001]"});
  CHECK(out_of_plane.exit_code == 7);
  CHECK(out_of_plane.err.find("does not lie in the film plane") != std::string::npos);
  CHECK(out_of_plane.out.empty());
  auto angle = run_cli({"sample", "m-3m", "--cut", "(001)", "--response", "resistivity", "--bar", "37"});
  CHECK(angle.exit_code == 7);
  CHECK(angle.err.find("multiple of 15") != std::string::npos);
  auto field = run_cli({"sample", "m-3m", "--cut", "(001)", "--response", "resistivity", "--bar", "rotating:sideways"});
  CHECK(field.exit_code == 7);
  CHECK(field.err.find("along-current") != std::string::npos);
  auto rosette = run_cli({"sample", "m-3m", "--cut", "(001)", "--response", "resistivity", "--layout", "resistivity",
                          "--rosette", "0,10"});
  CHECK(rosette.exit_code == 2);
  test::TempDir dir;
  std::ofstream(dir / "bad.toml") << "responses = [\"resistivity\"]\n[crystal]\ngroup = \"m-3m\"\n[sample]\ncut = "
                                     "\"(001)\"\n[[bar]]\ncurrent = \"[100]\"\nthickness = -1\n";
  auto file = run_cli({"run", (dir / "bad.toml").string()});
  CHECK(file.exit_code == 5);
  CHECK(file.err.find("bad.toml:8") != std::string::npos);
  CHECK(file.err.find("thickness") != std::string::npos);
}

TEST_CASE("observe: a cos phi Hall term at 2w proves a mirror perpendicular to the current at phi = 0", "[bar][inverse]") {
  // Sodemann & Fu, PRL 115, 216806 (2015): the dipole needs at most one mirror line and is perpendicular to it, and
  // T_Hall = D.u. A cos phi term means D along x: the mirror perpendicular to [100] on a (001) interface of a grey
  // cubic host (4mm1'), reached by a polar distortion in that mirror plane, e.g. along [010].
  auto r = run_cli({"observe", "m-3m", "--cut", "(001)", "--response", "second-order-conductivity", "--part", "2",
                    "--signal", "transverse:cos(phi)", "--bar", "rotating:none", "--type", "i"});
  REQUIRE(r.exit_code == 0);
  CHECK(r.out.find("forbidden in 4mm1'") != std::string::npos);
  CHECK(r.out.find("1, m [100], 1', m' [100]") != std::string::npos);
  CHECK(r.out.find("in the plane ⊥ [100]") != std::string::npos);
  // A longitudinal 2w reading at phi = 0 on a 3m interface is forbidden there (L = -c sin 3phi, derived above).
  auto z = run_cli({"observe", "m-3m", "--cut", "(111)", "--response", "second-order-conductivity", "--part", "1",
                    "--signal", "longitudinal@0", "--bar", "rotating:none", "--type", "i"});
  REQUIRE(z.exit_code == 0);
  CHECK(z.out.find("forbidden in 3m1'") != std::string::npos);
  auto bad = run_cli({"observe", "m-3m", "--cut", "(001)", "--response", "second-order-conductivity", "--part", "1",
                      "--signal", "sideways:cos(phi)"});
  CHECK(bad.exit_code == 2);
  CHECK(bad.err.find("longitudinal or transverse") != std::string::npos);
}

TEST_CASE("double counting: a B-expansion after a field step is evaluated without the field", "[bar][lowering]") {
  // Onsager-Kleiner (Kleiner, Phys. Rev. 142, 318 (1966)): sigma_abk B_k is the term linear in B. Evaluating it in a
  // group that already contains the field would count the field twice (a B^2 term read as "linear MR"), so the
  // part keeps the group without the field step (docs/hall-bars.md).
  Scenario sc;
  sc.group = "m-3m";
  sc.cut = "(001)";
  sc.responses = {"magnetoconductivity-linear", "anomalous-hall"};
  sc.steps = {LoweringStep{LoweringKind::magnetic_field, "[100]", "", "", "", "t"}};
  ScenarioResult r = run_scenario(sc);
  const PartForms& linear = r.parts[2]; // symmetric part (linear magnetoresistance), c-type
  CHECK(linear.field_step_skipped.back());
  CHECK(linear.counts.back() == linear.counts[1]);
  CHECK(linear.counts.back() == 0); // no linear MR in a grey host
  const PartForms& hall = r.parts[3]; // the anomalous Hall vector sees the field through the group
  CHECK_FALSE(hall.field_step_skipped.back());
  CHECK(hall.counts.back() == 1);
}

TEST_CASE("bar reports are byte-identical from run to run in every format", "[bar][cli]") {
  // Canonical output (common practice for reproducible reports): the series are printed in a fixed
  // order, never in the hash order of a computer-algebra sum.
  for (const char* f : {"text", "markdown", "latex", "json"}) {
    std::vector<std::string> args{"run", std::string(TENSORSIEVE_SOURCE_DIR) + "/examples/strained-film.toml", "-f", f};
    auto a = run_cli(args), b = run_cli(args);
    INFO(f);
    REQUIRE(a.exit_code == 0);
    CHECK(a.out == b.out);
  }
}
