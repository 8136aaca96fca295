// The Joule-heating background of 2ω bar measurements: a current I heats the film,
// the substrate takes the heat away, and the gradient ∂_z T = G I² along the normal
// gives in-plane voltages through the Nernst and Seebeck tensors (catalogue entry
// joule-heating-nernst, index role `joule`).
//
// References: the anomalous Nernst voltage of a heated magnetic film is E ∝ m × ∇T,
// so with ∇T along the normal it is transverse to an in-plane magnetisation along the
// current and absent for a magnetisation along the normal (Avci, Garello, Gabureac,
// Ghosh, Fuhrer, Alvarado and Gambardella, "Interplay of spin-orbit torque and
// thermoelectric effects in ferromagnet/normal-metal bilayers", Phys. Rev. B 90,
// 224427 (2014), title checked). A film whose symmetry allows an off-diagonal Seebeck
// coefficient S_xz shows a longitudinal voltage under a vertical gradient (Lengfellner,
// Kremb, Schnellbögl, Betz and Prettl, "Giant voltages upon surface heating in normal
// YBa2Cu3O7-δ films suggesting an atomic layer thermopile", Appl. Phys. Lett. 60, 501
// (1992), from memory). In a cubic crystal the axial rank-3 i-type tensor is a multiple
// of the Levi-Civita symbol (Nye, Physical Properties of Crystals, 1957, from memory).
#include "group/group_catalogue.hpp"
#include "response/response_catalogue.hpp"
#include "scenario/scenario_run.hpp"
#include "support/cli_run.hpp"
#include "support/json_value.hpp"

#include <catch2/catch.hpp>

#include <fstream>

using namespace ts;
using namespace ts::test;

namespace {

Scenario heated_film(const std::string& group, const std::string& cut, const std::string& field,
                     std::vector<LoweringStep> steps = {}) {
  Scenario sc;
  sc.group = group;
  sc.cut = cut;
  sc.responses = {"joule-heating-nernst"};
  sc.steps = std::move(steps);
  BarSpec b;
  b.name = "turning bar";
  b.current = "rotating";
  b.field = field;
  sc.bars.push_back(b);
  return sc;
}

// Part 0: anomalous Nernst of m, i-type; 2: Seebeck at zero field; 3: ordinary Nernst of B.
const PartSignal& part_signal(const ScenarioResult& r, std::size_t part) {
  REQUIRE(r.bars.size() == 1);
  REQUIRE(part < r.bars[0].signals.size());
  return r.bars[0].signals[part].signal;
}

std::vector<std::string> functions(const std::vector<FourierTerm>& terms) {
  std::vector<std::string> out;
  for (const auto& t : terms) out.push_back(angle_function_text(t));
  return out;
}

std::string catalogue_with_part(const std::string& indices, int harmonic, const std::string& drive) {
  return "[[response]]\nid = \"test-heat\"\nname = \"a test\"\nrelation = \"E = S dT\"\nresponse = \"E\"\n"
         "drives = [\"j\"]\nharmonic = \"2ω+DC\"\ntime_reversal = \"-\"\nonsager = \"-\"\n"
         "source = \"Nye, Physical Properties of Crystals (1957) [from memory]\"\nstatus = \"from memory\"\n"
         "[[response.part]]\nlabel = \"S\"\nspec = \"S_ab\"\nindices = " + indices + "\nharmonic = " +
         std::to_string(harmonic) + "\ndrive = \"" + drive + "\"\n";
}

} // namespace

TEST_CASE("the anomalous Nernst voltage of the heating gradient is m × z in a (001) film", "[joule][bar][physics]") {
  // Magnetisation along the current: a constant transverse voltage, nothing along the bar.
  ScenarioResult along = run_scenario(heated_film("m-3m", "(001)", "along-current"));
  const PartSignal& a = part_signal(along, 0);
  CHECK(a.current_order == 2);
  CHECK(a.joule_order == 1);
  CHECK(a.direction_order() == 0);
  CHECK(a.longitudinal.terms.empty());
  CHECK(functions(a.transverse.terms) == std::vector<std::string>{"1"});
  // Magnetisation fixed along [100] (sample x): E ∝ m × z = -y, so the bar reads
  // u·E ∝ sin φ along and v·E ∝ cos φ across, with the same coefficient.
  ScenarioResult fixed = run_scenario(heated_film("m-3m", "(001)", "[100]"));
  const PartSignal& f = part_signal(fixed, 0);
  CHECK(functions(f.longitudinal.terms) == std::vector<std::string>{"sin(phi)"});
  CHECK(functions(f.transverse.terms) == std::vector<std::string>{"cos(phi)"});
  // A uniform in-plane field of the heating: the transverse reading is the derivative of
  // the longitudinal one (degree 0 in the current's direction), so no Hall part.
  CHECK(f.hall_split);
  CHECK(f.transverse.hall_terms.empty());
  CHECK(functions(f.transverse.gradient_terms) == std::vector<std::string>{"cos(phi)"});
  // Magnetisation along the normal: m × z = 0.
  ScenarioResult normal = run_scenario(heated_film("m-3m", "(001)", "normal"));
  CHECK_FALSE(part_signal(normal, 0).reads());
  // The lock-in readings are those of any I² response: DC and 2ω.
  REQUIRE(f.harmonics.size() == 2);
  CHECK(f.harmonics[0].harmonic == 0);
  CHECK(f.harmonics[1].harmonic == 2);
}

TEST_CASE("the bulk anomalous Nernst tensor of a cubic magnet is one Levi-Civita coefficient", "[joule][physics]") {
  const Response& r = ResponseCatalogue::builtin().get("joule-heating-nernst");
  const PointGroup cubic = GroupCatalogue::builtin().get("m-3m").group.with_time_reversal();
  const AllowedForm q = response_forms(r, cubic)[0].form;
  REQUIRE(q.independent() == 1);
  const auto value = [&](const std::string& name) {
    for (int code = 0; code < 27; ++code)
      if (q.component_name(code) == name) return q.value(code);
    FAIL("no component " << name);
    return q.value(0);
  };
  const auto xyz = value("Q_xyz");
  REQUIRE(xyz.size() == 1);
  for (const char* plus : {"Q_yzx", "Q_zxy"}) CHECK(value(plus) == xyz);
  for (const char* minus : {"Q_yxz", "Q_xzy", "Q_zyx"}) {
    const auto v = value(minus);
    REQUIRE(v.size() == 1);
    CHECK(v[0].parameter == xyz[0].parameter);
    CHECK(v[0].coefficient == -xyz[0].coefficient);
  }
  CHECK(value("Q_xxx").empty());
  CHECK(value("Q_xxy").empty());
}

TEST_CASE("a vertical gradient reads an off-diagonal Seebeck coefficient only in a tilted film", "[joule][physics]") {
  // 4mm1' at the (001) interface: S_xz = S_yz = 0, nothing in the plane.
  ScenarioResult flat = run_scenario(heated_film("m-3m", "(001)", "none"));
  CHECK_FALSE(part_signal(flat, 2).reads());
  // A shear e_xz leaves a mirror ⊥ y: S_xz is allowed and the bar reads it along cos φ.
  LoweringStep shear;
  shear.kind = LoweringKind::shear;
  shear.along = "[100]";
  shear.second = "[001]";
  ScenarioResult tilted = run_scenario(heated_film("m-3m", "(001)", "none", {shear}));
  const PartSignal& s = part_signal(tilted, 2);
  CHECK(functions(s.longitudinal.terms) == std::vector<std::string>{"cos(phi)"});
  CHECK(functions(s.transverse.terms) == std::vector<std::string>{"sin(phi)"});
}

TEST_CASE("the report gives R_2 through G and JSON the joule order", "[joule][cli]") {
  CliResult t = run_cli({"sample", "m-3m", "--cut", "(001)", "--response", "joule-heating-nernst", "--bar",
                         "rotating:[100]"});
  REQUIRE(t.exit_code == 0);
  CHECK(t.out.find("R_2(⊥) = w G × S_⊥") != std::string::npos);
  CHECK(t.out.find("R_2(∥) = L G × S_∥") != std::string::npos);
  CHECK(t.out.find("Hall test, S_⊥ = S_∥'/1 + H") != std::string::npos);
  CliResult j = run_cli({"sample", "m-3m", "--cut", "(001)", "--response", "joule-heating-nernst", "--bar",
                         "rotating:[100]", "-f", "json"});
  REQUIRE(j.exit_code == 0);
  const JsonValue v = parse_json(j.out);
  const JsonValue& first = v.at("bars").items.at(0).at("signals").items.at(0);
  CHECK(first.at("joule_order").text == "1");
  CHECK(first.at("current_order").text == "2");
}

TEST_CASE("the loader counts a joule index as two powers of a current drive", "[joule][catalogue]") {
  TempDir dir;
  const std::string path = (dir / "catalogue.toml").string();
  std::ofstream(path) << catalogue_with_part("[\"E\", \"joule\"]", 2, "current");
  CHECK(ResponseCatalogue::load(path)->get("test-heat").parts.at(0).indices.at(1) == "joule");

  std::ofstream(path, std::ios::trunc) << catalogue_with_part("[\"E\", \"joule\"]", 1, "current");
  try {
    ResponseCatalogue::load(path);
    FAIL("harmonic 1 with a joule index was accepted");
  } catch (const Error& e) {
    CHECK(std::string(e.what()).find("a joule index counts two") != std::string::npos);
  }
  // A field-driven part (j = sigma·E) has no heating role.
  std::ofstream(path, std::ios::trunc) << catalogue_with_part("[\"j\", \"joule\"]", 2, "field");
  CHECK_THROWS_AS(ResponseCatalogue::load(path), Error);
}
