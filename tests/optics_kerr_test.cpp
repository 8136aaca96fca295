// Kerr and Faraday geometries and the quadratic magneto-optic terms, checked
// against textbook statements: a non-magnetic (grey) crystal shows no Kerr
// rotation, a ferromagnet magnetised along the normal shows polar Kerr only,
// an in-plane magnetisation longitudinal and transverse Kerr (Zvezdin and
// Kotov, Modern Magnetooptics and Magnetooptical Materials (IOP, 1997), ch. 1,
// from memory), and a collinear antiferromagnet whose group admits no net
// moment shows no Kerr effect but keeps the quadratic (Voigt-type) term.
#include "scenario/scenario_run.hpp"
#include "support/cli_run.hpp"

#include <catch2/catch.hpp>

#include <map>

using namespace ts;
using ts::test::run_cli;

namespace {

Scenario film(const std::string& group, const std::vector<std::string>& steps, const std::string& magnetisation) {
  Scenario sc;
  sc.group = group;
  sc.cut = "(001)";
  sc.responses = {"magneto-optic-kerr", "magnetic-linear-birefringence"};
  for (const auto& s : steps) sc.steps.push_back(parse_lowering_option(s, "test"));
  sc.kerr.push_back({"test", magnetisation, "test"});
  return sc;
}

std::map<std::string, bool> allowed(const KerrResult& k) {
  std::map<std::string, bool> out;
  for (const auto& r : k.kerr) out[r.geometry] = r.allowed();
  return out;
}

const VoigtReading& voigt(const KerrResult& k, const std::string& indices) {
  for (const auto& v : k.voigt)
    if (v.indices == indices) return v;
  FAIL("no quadratic component " << indices);
  return k.voigt.front();
}

} // namespace

TEST_CASE("grey crystal: no Kerr rotation in any geometry (Zvezdin and Kotov 1997)", "[optics][kerr]") {
  ScenarioResult r = run_scenario(film("m-3m", {}, "in-plane"));
  REQUIRE(r.kerr.size() == 1);
  for (const auto& [geometry, on] : allowed(r.kerr[0])) {
    INFO(geometry);
    CHECK_FALSE(on);
  }
  // The quadratic term is i-type: allowed in a grey cubic crystal. An in-plane
  // magnetisation at φ_B makes the (001) face birefringent at normal incidence,
  // Δeps_xx - Δeps_yy ∝ cos 2φ_B and Δeps_xy ∝ sin 2φ_B (cubic symmetry, derived here).
  const VoigtReading& a = voigt(r.kerr[0], "xx-yy");
  REQUIRE(a.terms.size() == 1);
  CHECK(angle_function_text(a.terms[0]) == "cos(2*phiB)");
  const VoigtReading& xy = voigt(r.kerr[0], "xy");
  REQUIRE(xy.terms.size() == 1);
  CHECK(angle_function_text(xy.terms[0]) == "sin(2*phiB)");
}

TEST_CASE("ferromagnet with M along the normal: polar Kerr only; in plane: longitudinal and transverse (Zvezdin and Kotov 1997)",
          "[optics][kerr]") {
  ScenarioResult z = run_scenario(film("m-3m", {"moment:[001]"}, "normal"));
  auto az = allowed(z.kerr[0]);
  CHECK(az["polar"]);
  CHECK_FALSE(az["longitudinal"]);
  CHECK_FALSE(az["transverse"]);

  ScenarioResult x = run_scenario(film("m-3m", {"moment:[100]"}, "[100]"));
  auto ax = allowed(x.kerr[0]);
  CHECK_FALSE(ax["polar"]);
  CHECK(ax["longitudinal"]);
  CHECK(ax["transverse"]);
  // g ∥ x: the longitudinal signal follows cos ψ of the plane of incidence, the transverse one -sin ψ.
  for (const auto& k : x.kerr[0].kerr) {
    if (k.geometry == "longitudinal") {
      REQUIRE(k.terms.size() == 1);
      CHECK(angle_function_text(k.terms[0]) == "cos(phi)");
    }
    if (k.geometry == "transverse") {
      REQUIRE(k.terms.size() == 1);
      CHECK(angle_function_text(k.terms[0]) == "sin(phi)");
    }
  }
}

// The spin-reorientation question: a collinear antiferromagnet in -3'm' (the
// Cr2O3 type, Dzyaloshinskii, Sov. Phys. JETP 10, 628 (1960), from memory)
// admits no net moment and so no gyration vector; -3m' admits a moment along
// the threefold axis (a weak ferromagnet) and with it polar Kerr.
TEST_CASE("antiferromagnet without a net moment versus a weak ferromagnet", "[optics][kerr]") {
  Scenario afm;
  afm.group = "-3'm'";
  afm.assume_nonmagnetic = false;
  afm.z = "[001]";
  afm.responses = {"magneto-optic-kerr", "magnetic-linear-birefringence"};
  afm.kerr.push_back({"AFM", "[001]", "test"});
  ScenarioResult a = run_scenario(afm);
  for (const auto& [geometry, on] : allowed(a.kerr[0])) CHECK_FALSE(on);
  CHECK_FALSE(voigt(a.kerr[0], "zz").terms.empty());

  Scenario wfm = afm;
  wfm.group = "-3m'";
  ScenarioResult w = run_scenario(wfm);
  auto aw = allowed(w.kerr[0]);
  CHECK(aw["polar"]);
  CHECK_FALSE(aw["longitudinal"]);
}

TEST_CASE("magneto-optics from the command line", "[optics][kerr][cli]") {
  auto r = run_cli({"sample", "m-3m", "--cut", "(001)", "--lower", "moment:[001]", "--kerr", "normal"});
  REQUIRE(r.exit_code == 0);
  CHECK(r.out.find("Magneto-optics") != std::string::npos);
  auto j = run_cli({"sample", "m-3m", "--cut", "(001)", "--kerr", "in-plane", "--format", "json"});
  REQUIRE(j.exit_code == 0);
  CHECK(j.out.find("\"magneto_optics\"") != std::string::npos);
  auto l = run_cli({"sample", "m-3m", "--cut", "(001)", "--kerr", "in-plane", "--format", "latex"});
  CHECK(l.exit_code == 0);
  CHECK(l.out.find("\\Delta\\varepsilon") != std::string::npos);
  auto bad = run_cli({"sample", "m-3m", "--cut", "(001)", "--kerr", "sideways"});
  CHECK(bad.exit_code != 0);
  CHECK(bad.err.find("sideways") != std::string::npos);
}
